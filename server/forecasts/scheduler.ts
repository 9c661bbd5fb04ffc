import { CompiledQuery } from 'kysely';
import { DateTime } from 'luxon';
import type PgBoss from 'pg-boss';
import type { Db } from '../db/connect.ts';
import { SITE_QUEUE, type SiteJobData } from './queue.ts';

/** A slot is still worth running this long after its time (a scheduler that was down catches up). */
const CATCH_UP_MS = 6 * 3_600_000;

/**
 * The most recent instant, at or before `nowMs`, when the site's local clock showed `localTime`
 * (HH:mm) in the site's own time zone. On a spring-forward day a time in the gap moves forward with
 * the clocks (luxon), and on a fall-back day the first of the two instants counts.
 */
export function lastScheduledInstant(timeZone: string, localTime: string, nowMs: number): number {
  const [hour = 4, minute = 0] = localTime.split(':').map(Number);
  const now = DateTime.fromMillis(nowMs, { zone: timeZone });
  let slot = now.set({ hour, minute, second: 0, millisecond: 0 });
  if (slot.toMillis() > nowMs) slot = now.minus({ days: 1 }).set({ hour, minute, second: 0, millisecond: 0 });
  return slot.toMillis();
}

/**
 * One scheduler tick (node-cron calls it every minute): for each site that watches an organism, the
 * latest daily slot in the site's time zone is claimed once (a table row, so several schedulers on
 * several machines queue it once) and a site job is queued in the same transaction.
 * Returns the number of site jobs queued.
 */
export async function schedulerTick(deps: { db: Db; boss: PgBoss }, nowMs: number): Promise<number> {
  const sites = await deps.db
    .selectFrom('sites')
    .select(['id', 'organisation_id', 'time_zone', 'forecast_local_time'])
    .where('archived_at', 'is', null)
    .where(({ exists, selectFrom }) => exists(selectFrom('site_organisms').select('site_id').whereRef('site_organisms.site_id', '=', 'sites.id')))
    .execute();
  let queued = 0;
  for (const site of sites) {
    const slot = lastScheduledInstant(site.time_zone, site.forecast_local_time, nowMs);
    if (nowMs - slot > CATCH_UP_MS) continue;
    const claimed = await deps.db.transaction().execute(async (trx) => {
      const row = await trx
        .insertInto('schedule_slots')
        .values({ site_id: site.id, slot_start: new Date(slot) })
        .onConflict((oc) => oc.doNothing())
        .returning('site_id')
        .executeTakeFirst();
      if (!row) return false;
      const data: SiteJobData = { organisationId: site.organisation_id, siteId: site.id, forecastStartMs: slot, trigger: 'schedule' };
      // pg-boss writes the job through our transaction: claim and job commit together.
      const db = { executeSql: async (text: string, values: unknown[]) => trx.executeQuery(CompiledQuery.raw(text, values)) };
      await deps.boss.send(SITE_QUEUE, data, { db, singletonKey: `${site.id}:${slot}` });
      return true;
    });
    if (claimed) queued++;
  }
  return queued;
}
