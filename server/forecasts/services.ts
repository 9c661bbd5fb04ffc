import { spawn, type ChildProcess } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import cron from 'node-cron';
import type PgBoss from 'pg-boss';
import { queueSettingsFrom } from '../../jobs/queue-settings.ts';
import type { Config } from '../config.ts';
import type { Db } from '../db/connect.ts';
import type { Logger } from '../logger.ts';
import { sendDueDigests } from '../mail/digest.ts';
import type { Mailer } from '../mail/mailer.ts';
import type { TideFeedClient } from '../tides/tide-feed.client.ts';
import { prepareSiteRuns, type PrepareDeps } from './prepare-runs.ts';
import { pruneForecasts } from './retention.ts';
import { startQueue } from './queue.ts';
import { retryAlertMails } from './notify.ts';
import { schedulerTick } from './scheduler.ts';
import { siteTideSource } from './site-tide-source.ts';
import type { TideSource } from './tide-source.ts';

const PROJECT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** A forecast worker process (`npm run worker`): model runs never block this process's HTTP answers. */
function spawnWorker(env: Record<string, string>, nice: number, logger: Logger): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], { cwd: PROJECT_ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'inherit', 'inherit'] });
  // Batch work at a lower CPU priority, so that a busy worker does not slow people's requests.
  if (child.pid !== undefined && nice > 0) {
    try {
      os.setPriority(child.pid, nice);
    } catch (error) {
      logger.warn({ err: error }, 'could not lower the forecast worker priority');
    }
  }
  child.once('exit', (code, signal) => {
    if (code !== 0 && signal !== 'SIGTERM') logger.error({ code, signal }, 'forecast worker process exited');
  });
  return child;
}

export interface ForecastServices {
  boss: PgBoss;
  tides: TideSource;
  stop(): Promise<void>;
}

/**
 * What `npm start` runs besides HTTP: the shared queue, PLANKTIDE_WORKERS worker processes (the same
 * as `npm run worker`), and (PLANKTIDE_SCHEDULER=on) a node-cron task that each minute queues the
 * sites whose local forecast time has come and sends the digests that are due.
 */
export async function startForecastServices(deps: {
  config: Config;
  db: Db;
  databaseUrl: string;
  feed: TideFeedClient;
  /** The URLs the worker processes reach the tide feed and mail service at. */
  feedUrl: string;
  smtpUrl: string;
  mailer: Mailer;
  logger: Logger;
}): Promise<ForecastServices> {
  const { config, db, logger } = deps;
  const boss = await startQueue(deps.databaseUrl, queueSettingsFrom(config), (error) => logger.error({ err: error }, 'queue error'));
  const tides = siteTideSource({ db, feed: deps.feed });
  const workers: ChildProcess[] = [];
  for (let i = 0; i < config.PLANKTIDE_WORKERS; i++) {
    workers.push(spawnWorker({ DATABASE_URL: deps.databaseUrl, TIDE_FEED_URL: deps.feedUrl, SMTP_URL: deps.smtpUrl, APP_BASE_URL: config.APP_BASE_URL }, config.PLANKTIDE_WORKER_NICE, logger));
  }
  const onMailFailed = (to: string, error: unknown) => logger.warn({ err: error, to }, 'mail could not be sent now; it is tried again at the next minute');
  let task: ReturnType<typeof cron.schedule> | undefined;
  if (config.PLANKTIDE_SCHEDULER === 'on') {
    task = cron.schedule(
      '* * * * *',
      async () => {
        const now = Date.now();
        const queued = await schedulerTick({ db, boss }, now).catch((error: unknown) => (logger.error({ err: error }, 'scheduler tick failed'), 0));
        if (queued) logger.info({ queued }, 'scheduled site forecasts queued');
        await sendDueDigests({ db, mailer: deps.mailer, appBaseUrl: config.APP_BASE_URL, onMailFailed }, now).catch((error: unknown) => logger.error({ err: error }, 'digest mail failed'));
        await retryAlertMails({ db, mailer: deps.mailer, appBaseUrl: config.APP_BASE_URL, onMailFailed }, now).catch((error: unknown) => logger.error({ err: error }, 'alert mail retry failed'));
        if (new Date(now).getUTCMinutes() === 17) {
          const pruned = await pruneForecasts(db, now).catch((error: unknown) => (logger.error({ err: error }, 'forecast retention failed'), 0));
          if (pruned) logger.info({ pruned }, 'old forecasts deleted');
        }
      },
      { name: 'planktide-scheduler', noOverlap: true },
    );
  }
  return {
    boss,
    tides,
    async stop() {
      await task?.stop();
      await Promise.all(
        workers.map(
          (child) =>
            new Promise<void>((resolve) => {
              if (child.exitCode !== null) return resolve();
              child.once('exit', () => resolve());
              child.kill('SIGTERM');
              setTimeout(() => child.kill('SIGKILL'), 10_000).unref();
            }),
        ),
      );
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
