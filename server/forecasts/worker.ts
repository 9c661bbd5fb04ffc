import type PgBoss from 'pg-boss';
import type { Logger } from '../logger.ts';
import { prepareSiteRuns, type PrepareDeps } from './prepare-runs.ts';
import { FORECAST_QUEUE, SITE_QUEUE, type ForecastJobData, type SiteJobData } from './queue.ts';
import { runForecastJob, type ForecastJobDeps } from './run-forecast.ts';

const RUNS_PER_FETCH = 4;

export type WorkerDeps = PrepareDeps &
  Omit<ForecastJobDeps, 'tides'> & {
    boss: PgBoss;
    logger: Logger;
  };

/**
 * Takes site jobs and forecast runs from the shared queue. Any number of workers, in any number of
 * processes on any machines reaching the same database, share the work. A job that throws is retried
 * by pg-boss with backoff; a worker that dies leaves its job to expire and be retried.
 */
export async function startForecastWorker(deps: WorkerDeps): Promise<() => Promise<void>> {
  await deps.boss.work<SiteJobData>(SITE_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
    if (!job) return;
    const runs = await prepareSiteRuns(deps, job.data);
    deps.logger.info({ siteId: job.data.siteId, runs: runs.length }, 'site forecast runs queued');
  });
  // pg-boss waits out its polling interval after each fetch, so a worker takes a few runs at a time
  // and works through them one after the other (one core each); a failed run fails only its own job.
  await deps.boss.work<ForecastJobData>(FORECAST_QUEUE, { batchSize: RUNS_PER_FETCH, pollingIntervalSeconds: 0.5 }, async (jobs) => {
    for (const job of jobs) {
      try {
        const outcome = await runForecastJob(deps, job.data.runId);
        await deps.boss.complete(FORECAST_QUEUE, job.id);
        deps.logger.info({ runId: job.data.runId, outcome }, 'forecast run finished');
      } catch (error) {
        await deps.boss.fail(FORECAST_QUEUE, job.id, { message: error instanceof Error ? error.message : String(error) });
      }
    }
  });
  return async () => {
    await deps.boss.offWork(SITE_QUEUE);
    await deps.boss.offWork(FORECAST_QUEUE);
  };
}
