import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { insertForecastSite, insertOrganisation, waitFor } from '../helpers/forecast-fixture.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

const ROOT = path.resolve(import.meta.dirname, '../..');
const QUEUE_ENV = { QUEUE_JOB_TIMEOUT_S: '6', QUEUE_MAINTENANCE_S: '1', QUEUE_RETRY_DELAY_S: '1' };

function startWorker(databaseUrl: string, extra: Record<string, string> = {}): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: databaseUrl, LOG_LEVEL: 'silent', ...QUEUE_ENV, ...extra },
    stdio: 'ignore',
  });
}

describe('a worker killed in the middle of a forecast', () => {
  let database: TestDatabase;
  let boss: PgBoss;
  const workers: ChildProcess[] = [];

  beforeAll(async () => {
    database = await createTestDatabase();
    boss = await startQueue(database.url, { expireInSeconds: 6, retryLimit: 4, retryDelaySeconds: 1, maintenanceIntervalSeconds: 1, pollingIntervalSeconds: 0.5 });
  });
  afterAll(async () => {
    for (const w of workers) if (w.exitCode === null) w.kill('SIGKILL');
    await boss.stop({ graceful: false, wait: true });
    await database.drop();
  });

  it('is retried by another worker and completes once, with no half-written forecast', async () => {
    const org = await insertOrganisation(database.db);
    const site = await insertForecastSite(database.db, org, { name: 'Crash test lease', timeZone: 'UTC', horizonDays: 7 });
    const [runId] = await prepareSiteRuns({ db: database.db, boss, tides: siteTideSource({ db: database.db }) }, { organisationId: org, siteId: site.siteId, forecastStartMs: Date.parse('2026-12-05T04:00:00Z'), trigger: 'manual' });

    // A fine grid makes the run last seconds, so it can be killed part way.
    const first = startWorker(database.url, { FORECAST_LAYERS: '400', FORECAST_TIME_STEP_S: '5' });
    workers.push(first);
    await waitFor('the run to be part done', async () => {
      const run = await database.db.selectFrom('forecast_runs').select(['status', 'progress']).where('id', '=', runId!).executeTakeFirstOrThrow();
      return run.status === 'running' && run.progress > 0 ? run : undefined;
    });
    first.kill('SIGKILL');
    await new Promise((resolve) => first.once('exit', resolve));
    expect(await database.db.selectFrom('forecasts').select('id').execute()).toHaveLength(0);

    const second = startWorker(database.url);
    workers.push(second);
    const done = await waitFor(
      'the run to complete on the second worker',
      async () => {
        const run = await database.db.selectFrom('forecast_runs').select(['status', 'attempts']).where('id', '=', runId!).executeTakeFirstOrThrow();
        return run.status === 'done' ? run : undefined;
      },
      90_000,
    );
    expect(done.attempts).toBe(2);
    const forecasts = await database.db.selectFrom('forecasts').select(['run_id', 'grid']).execute();
    expect(forecasts).toHaveLength(1);
    expect(forecasts[0]!.run_id).toBe(runId);
    expect(forecasts[0]!.grid.length).toBeGreaterThan(1000);
  }, 150_000);
});
