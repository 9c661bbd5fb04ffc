import cron from 'node-cron';
import type PgBoss from 'pg-boss';
import { queueSettingsFrom } from '../../jobs/queue-settings.ts';
import type { Config } from '../config.ts';
import type { Db } from '../db/connect.ts';
import type { Logger } from '../logger.ts';
import { sendDueDigests } from '../mail/digest.ts';
import type { Mailer } from '../mail/mailer.ts';
import type { TideFeedClient } from '../tides/tide-feed.client.ts';
import { notifyOnStored } from './notify.ts';
import { prepareSiteRuns, type PrepareDeps } from './prepare-runs.ts';
import { startQueue } from './queue.ts';
import { schedulerTick } from './scheduler.ts';
import { siteTideSource } from './site-tide-source.ts';
import type { TideSource } from './tide-source.ts';
import { startForecastWorker } from './worker.ts';

export interface ForecastServices {
  boss: PgBoss;
  tides: TideSource;
  stop(): Promise<void>;
}

/**
 * What `npm start` runs besides HTTP: the shared queue, PLANKTIDE_WORKERS in-process workers, and
 * (PLANKTIDE_SCHEDULER=on) a node-cron task that each minute queues the sites whose local forecast
 * time has come and sends the digests that are due.
 */
export async function startForecastServices(deps: { config: Config; db: Db; databaseUrl: string; feed: TideFeedClient; mailer: Mailer; logger: Logger }): Promise<ForecastServices> {
  const { config, db, logger } = deps;
  const boss = await startQueue(deps.databaseUrl, queueSettingsFrom(config), (error) => logger.error({ err: error }, 'queue error'));
  const tides = siteTideSource({ db, feed: deps.feed });
  const stops: (() => Promise<void>)[] = [];
  for (let i = 0; i < config.PLANKTIDE_WORKERS; i++) {
    stops.push(
      await startForecastWorker({
        db,
        boss,
        tides,
        logger: logger.child({ service: 'worker' }),
        resolution: { layers: config.FORECAST_LAYERS, timeStepS: config.FORECAST_TIME_STEP_S },
        onStored: notifyOnStored({ db, mailer: deps.mailer, appBaseUrl: config.APP_BASE_URL }),
      }),
    );
  }
  let task: ReturnType<typeof cron.schedule> | undefined;
  if (config.PLANKTIDE_SCHEDULER === 'on') {
    task = cron.schedule(
      '* * * * *',
      async () => {
        const now = Date.now();
        const queued = await schedulerTick({ db, boss }, now).catch((error: unknown) => (logger.error({ err: error }, 'scheduler tick failed'), 0));
        if (queued) logger.info({ queued }, 'scheduled site forecasts queued');
        await sendDueDigests({ db, mailer: deps.mailer, appBaseUrl: config.APP_BASE_URL }, now).catch((error: unknown) => logger.error({ err: error }, 'digest mail failed'));
      },
      { name: 'planktide-scheduler', noOverlap: true },
    );
  }
  return {
    boss,
    tides,
    async stop() {
      await task?.stop();
      for (const stop of stops) await stop();
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
}

/** Queues a forecast now for every site (used after seeding the demo, so it has forecasts at once). */
export async function queueFirstForecasts(deps: PrepareDeps): Promise<number> {
  const sites = await deps.db.selectFrom('sites').select(['id', 'organisation_id']).where('archived_at', 'is', null).execute();
  const start = Math.floor(Date.now() / 3_600_000) * 3_600_000;
  let queued = 0;
  for (const site of sites) {
    queued += (await prepareSiteRuns(deps, { organisationId: site.organisation_id, siteId: site.id, forecastStartMs: start, trigger: 'manual' })).length;
  }
  return queued;
}
