import { DateTime } from 'luxon';
import type { DayAdvice } from '../../shared/forecast/advice.ts';
import type { Db } from '../db/connect.ts';
import type { Mailer } from '../mail/mailer.ts';
import { mailSettingsOf } from '../mail/mail-settings.repository.ts';

export interface NotifyDeps {
  db: Db;
  mailer?: Mailer;
  appBaseUrl: string;
}

/**
 * After a forecast is stored: when the gear band's mean crosses the organism's trigger level, an alert
 * is recorded and mailed at once to the members who want alerts (once per forecast and person).
 */
export function notifyOnStored(deps: NotifyDeps): (forecastId: string) => Promise<void> {
  return async (forecastId) => {
    const f = await deps.db
      .selectFrom('forecasts as f')
      .innerJoin('sites as s', 's.id', 'f.site_id')
      .select(['f.id', 'f.organisation_id', 'f.site_id', 'f.inputs', 'f.advice', 's.name', 's.time_zone', 's.gear_top_m', 's.gear_bottom_m'])
      .where('f.id', '=', forecastId)
      .executeTakeFirstOrThrow();
    const inputs = f.inputs as { profile: { name: string; triggerCellsPerL: number } };
    const exposed = (f.advice as DayAdvice[]).flatMap((d) => d.exposure.periods);
    if (exposed.length === 0) return;
    const first = exposed[0]!;
    const hours = exposed.reduce((h, p) => h + (p.endMs - p.startMs) / 3_600_000, 0);
    const when = DateTime.fromMillis(first.startMs, { zone: f.time_zone }).toFormat("ccc d LLL HH:mm ZZZZ");
    const message = `${inputs.profile.name} is forecast above its trigger of ${inputs.profile.triggerCellsPerL} cells/L at the gear band (${f.gear_top_m}–${f.gear_bottom_m} m below surface) for ${hours.toFixed(1)} h, first from ${when}. This is a model estimate: follow official testing and local rules.`;
    const alert = await deps.db
      .insertInto('alerts')
      .values({ organisation_id: f.organisation_id, site_id: f.site_id, forecast_id: f.id, kind: 'gear_trigger', message, starts_at: new Date(first.startMs) })
      .returning('id')
      .executeTakeFirstOrThrow();
    if (!deps.mailer) return;
    const members = await deps.db.selectFrom('memberships as m').innerJoin('users as u', 'u.id', 'm.user_id').select(['u.id', 'u.email']).where('m.organisation_id', '=', f.organisation_id).execute();
    for (const member of members) {
      const settings = await mailSettingsOf(deps.db, member.id);
      if (!settings.alertsEnabled) continue;
      await deps.db.transaction().execute(async (trx) => {
        const claimed = await trx
          .insertInto('mail_log')
          .values({ user_id: member.id, kind: 'alert', dedupe_key: `alert:${alert.id}:${member.id}` })
          .onConflict((oc) => oc.column('dedupe_key').doNothing())
          .returning('id')
          .executeTakeFirst();
        if (!claimed) return;
        await deps.mailer!.send({
          to: member.email,
          subject: `Planktide alert: ${f.name}`,
          text: `${message}\n\nOpen Planktide: ${deps.appBaseUrl}/\nUnsubscribe: ${deps.appBaseUrl}/api/mail/unsubscribe/${settings.unsubscribeToken}`,
        });
      });
    }
  };
}
