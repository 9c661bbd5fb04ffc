import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { createTideFeedClient } from '../../server/tides/tide-feed.client.ts';
import { startTideFeedStandIn, type TideFeedStandIn } from '../../server/tides/tide-feed-standin.ts';
import { insertForecastSite, insertOrganisation } from '../helpers/forecast-fixture.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('a forecast while the tide feed is down', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  let feed: TideFeedStandIn;

  beforeAll(async () => {
    database = await createTestDatabase();
    boss = await startQueue(database.url, { expireInSeconds: 30, retryLimit: 1, retryDelaySeconds: 1, maintenanceIntervalSeconds: 5, pollingIntervalSeconds: 1 });
    feed = await startTideFeedStandIn({ port: 0, apiKey: 'test-feed-key' });
  });
  afterAll(async () => {
    await feed.close();
    await boss.stop({ graceful: false, wait: true });
    await database.drop();
  });

  it('uses the last good constituent set, records the failed refresh, and says so on the forecast', async () => {
    const org = await insertOrganisation(database.db);
    const site = await insertForecastSite(database.db, org, { name: 'Feed-fed lease', timeZone: 'Europe/Oslo', source: 'feed' });
    feed.setFault('error');
    const tides = siteTideSource({ db: database.db, feed: createTideFeedClient({ baseUrl: feed.url, apiKey: 'test-feed-key', timeoutMs: 2000 }), feedRetry: { attempts: 2, backoffMs: 10 } });

    const [runId] = await prepareSiteRuns({ db: database.db, boss, tides }, { organisationId: org, siteId: site.siteId, forecastStartMs: Date.parse('2026-12-03T03:00:00Z'), trigger: 'schedule' });
    expect(await runForecastJob({ db: database.db, tides }, runId!)).toBe('done');

    const forecast = await database.db.selectFrom('forecasts').select(['inputs', 'constituent_set_id']).where('run_id', '=', runId!).executeTakeFirstOrThrow();
    expect(forecast.constituent_set_id).toBe(site.setId);
    const note = (forecast.inputs as { tides: { note: string | null; version: number } }).tides;
    expect(note.version).toBe(1);
    expect(note.note).toMatch(/tide feed could not be reached/);
    expect(note.note).toMatch(/last good set \(version 1/);

    const attempts = await database.db.selectFrom('tide_feed_refreshes').select(['ok']).where('site_id', '=', site.siteId).execute();
    expect(attempts.map((a) => a.ok)).toEqual([false, false]);
  }, 60_000);
});
