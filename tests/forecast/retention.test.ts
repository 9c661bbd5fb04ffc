import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { pruneForecasts } from '../../server/forecasts/retention.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { insertForecastSite, insertOrganisation } from '../helpers/forecast-fixture.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('forecast retention', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  const ids: Record<string, string> = {};
  let org: string;
  let siteId: string;

  beforeAll(async () => {
    database = await createTestDatabase();
    boss = await startQueue(database.url, { expireInSeconds: 60, retryLimit: 1, retryDelaySeconds: 1, maintenanceIntervalSeconds: 30, pollingIntervalSeconds: 1 });
    const db = database.db;
    org = await insertOrganisation(db);
    siteId = (await insertForecastSite(db, org, { name: 'Retention reach', timeZone: 'UTC' })).siteId;
    const tides = siteTideSource({ db });
    for (const [name, start] of [['old', '2026-11-01T04:00:00Z'], ['oldPlanned', '2026-11-02T04:00:00Z'], ['oldSampled', '2026-11-03T04:00:00Z'], ['recent', '2026-11-28T04:00:00Z']] as const) {
      const [runId] = await prepareSiteRuns({ db, boss, tides }, { organisationId: org, siteId, forecastStartMs: Date.parse(start), trigger: 'manual' });
      await runForecastJob({ db, tides }, runId!);
      const f = await db.selectFrom('forecasts').select('id').where('run_id', '=', runId!).executeTakeFirstOrThrow();
      await db.updateTable('forecasts').set({ created_at: new Date(start) }).where('id', '=', f.id).execute();
      ids[name] = f.id;
    }
    await db.insertInto('planned_samples').values({ organisation_id: org, site_id: siteId, planned_at: new Date('2026-11-02T10:00:00Z'), method: 'bottle', depth_m: 5, forecast_id: ids.oldPlanned! }).execute();
    const upload = await db.insertInto('lab_uploads').values({ organisation_id: org, source: 'manual', row_count: 1 }).returning('id').executeTakeFirstOrThrow();
    await db
      .insertInto('lab_results')
      .values({ organisation_id: org, site_id: siteId, upload_id: upload.id, sample_id: 'R-1', sampled_at: new Date('2026-11-04T09:00:00Z'), depth_top_m: 5, depth_bottom_m: 5, method: 'bottle', taxon: 'Chaetoceros sp.', cells_per_l: 1000, detection_limit: 40 })
      .execute();
  }, 60_000);

  afterAll(async () => {
    await boss.stop({ graceful: false, wait: true });
    await database.drop();
  });

  it('deletes forecasts older than 14 days unless a planned sample or a lab result refers to them', async () => {
    const deleted = await pruneForecasts(database.db, Date.parse('2026-12-02T00:00:00Z'));
    expect(deleted).toBe(1);
    const left = (await database.db.selectFrom('forecasts').select('id').execute()).map((r) => r.id).sort();
    expect(left).toEqual([ids.oldPlanned, ids.oldSampled, ids.recent].sort());
  });
});
