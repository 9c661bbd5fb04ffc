import { sql } from 'kysely';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startQueue } from '../../server/forecasts/queue.ts';
import { schedulerTick } from '../../server/forecasts/scheduler.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import type { TideSource } from '../../server/forecasts/tide-source.ts';
import { startForecastWorker } from '../../server/forecasts/worker.ts';
import { quietLogger } from '../helpers/quiet-logger.ts';
import { insertForecastSite, insertOrganisation, waitFor } from '../helpers/forecast-fixture.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

const FAST_QUEUE = { expireInSeconds: 30, retryLimit: 4, retryDelaySeconds: 1, maintenanceIntervalSeconds: 1, pollingIntervalSeconds: 0.5 };

describe('scheduled forecasts on the shared queue', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  let stopWorker: () => Promise<void>;
  let sites: Awaited<ReturnType<typeof insertForecastSite>>[];
  let failuresLeft = 1;

  beforeAll(async () => {
    database = await createTestDatabase();
    const org = await insertOrganisation(database.db);
    sites = [
      await insertForecastSite(database.db, org, { name: 'Oslo fjord lines', timeZone: 'Europe/Oslo' }),
      await insertForecastSite(database.db, org, { name: 'Salish rafts', timeZone: 'America/Vancouver' }),
    ];
    boss = await startQueue(database.url, FAST_QUEUE);
    const real = siteTideSource({ db: database.db });
    // The first job to read tides fails as if its machine hiccuped, so the queue must retry it.
    const flaky: TideSource = {
      refresh: real.refresh,
      async active(siteId) {
        if (failuresLeft-- > 0) throw new Error('connection reset while reading tides');
        return real.active(siteId);
      },
    };
    stopWorker = await startForecastWorker({ db: database.db, boss, tides: flaky, logger: quietLogger() });
  }, 60_000);

  afterAll(async () => {
    await stopWorker();
    await boss.stop({ graceful: false, wait: true });
    await database.drop();
  });

  it('makes exactly one forecast per site and profile across a simulated day, with two schedulers and a retried job', async () => {
    // A simulated UTC day. Local 04:00 is 03:00 UTC in Oslo (CET, UTC+1) and 12:00 UTC in
    // Vancouver (PST, UTC−8) in December: civil time rules of the IANA time zone database.
    const dayStart = Date.parse('2026-12-02T00:00:00Z');
    let queued = 0;
    for (let t = dayStart; t < dayStart + 24 * 3_600_000; t += 10 * 60_000) {
      queued += await schedulerTick({ db: database.db, boss }, t); // scheduler on machine A
      queued += await schedulerTick({ db: database.db, boss }, t + 7_000); // scheduler on machine B
    }
    expect(queued).toBe(2);

    const forecasts = await waitFor('both forecasts', async () => {
      const rows = await database.db.selectFrom('forecasts').select(['site_id', 'forecast_start', 'profile_version_id']).execute();
      return rows.length >= 2 ? rows : undefined;
    });
    // Give a duplicate (if any) time to appear before counting.
    await new Promise((r) => setTimeout(r, 1500));
    const all = await database.db.selectFrom('forecasts').select(['site_id', 'forecast_start']).execute();
    expect(all).toHaveLength(2);
    const startOf = (siteId: string) => forecasts.find((f) => f.site_id === siteId)?.forecast_start.toISOString();
    expect(startOf(sites[0]!.siteId)).toBe('2026-12-02T03:00:00.000Z');
    expect(startOf(sites[1]!.siteId)).toBe('2026-12-02T12:00:00.000Z');

    const runs = await database.db.selectFrom('forecast_runs').select(['status', 'attempts']).execute();
    expect(runs).toHaveLength(2);
    expect(runs.every((r) => r.status === 'done')).toBe(true);
    expect(failuresLeft).toBeLessThan(0);
    const retried = await sql<{ n: number }>`select count(*)::int as n from pgboss.job where retry_count > 0 and state = 'completed'`.execute(database.db);
    expect(retried.rows[0]!.n).toBe(1);
  }, 120_000);

  it('records what went into the forecast, and the profile version becomes immutable', async () => {
    const row = await database.db.selectFrom('forecasts').select(['inputs', 'engine_version', 'horizon_days']).where('site_id', '=', sites[0]!.siteId).executeTakeFirstOrThrow();
    const inputs = row.inputs as { site: { name: string }; profile: { version: number }; tides: { version: number; source: string } };
    expect(inputs.site.name).toBe('Oslo fjord lines');
    expect(inputs.profile.version).toBe(1);
    expect(inputs.tides).toMatchObject({ version: 1, source: 'manual' });
    expect(row.horizon_days).toBe(3);
    const version = await database.db.selectFrom('organism_profile_versions').select('first_used_at').where('id', '=', sites[0]!.versionId).executeTakeFirstOrThrow();
    expect(version.first_used_at).not.toBeNull();
  });
});
