/**
 * `npm run worker`: a forecast worker on its own, taking jobs from the shared PostgreSQL queue.
 * Run as many as there are cores, on as many machines as reach the database (DATABASE_URL; by
 * default the embedded cluster of a local `npm start`).
 */
import { ConfigError, parseConfig } from '../server/config.ts';
import { createDb } from '../server/db/connect.ts';
import { startQueue } from '../server/forecasts/queue.ts';
import { siteTideSource } from '../server/forecasts/site-tide-source.ts';
import { startForecastWorker } from '../server/forecasts/worker.ts';
import { createLogger } from '../server/logger.ts';
import { LOCAL_DATABASE_NAME } from '../server/postgres/local-database.ts';
import { createTideFeedClient } from '../server/tides/tide-feed.client.ts';
import { notifyOnStored } from '../server/forecasts/notify.ts';
import { createMailer } from '../server/mail/mailer.ts';
import { queueSettingsFrom } from './queue-settings.ts';

let config;
try {
  config = parseConfig(process.env);
} catch (error) {
  if (error instanceof ConfigError) {
    console.error(error.message);
    process.exit(1);
  }
  throw error;
}
const logger = createLogger(config.LOG_LEVEL).child({ service: 'worker', pid: process.pid });
const url = config.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${config.PLANKTIDE_PG_PORT}/${LOCAL_DATABASE_NAME}`;
const db = createDb(url, 4);
const boss = await startQueue(url, queueSettingsFrom(config), (error) => logger.error({ err: error }, 'queue error'));
const feed = createTideFeedClient({ baseUrl: config.TIDE_FEED_URL ?? `http://127.0.0.1:${config.TIDE_FEED_STANDIN_PORT}`, apiKey: config.TIDE_FEED_API_KEY });
const stop = await startForecastWorker({
  db,
  boss,
  tides: siteTideSource({ db, feed }),
  logger,
  resolution: { layers: config.FORECAST_LAYERS, timeStepS: config.FORECAST_TIME_STEP_S },
  onStored: notifyOnStored({
    db,
    mailer: createMailer(config.SMTP_URL ?? `smtp://127.0.0.1:${config.SMTP_STANDIN_PORT}`, config.MAIL_FROM, { timeoutMs: config.SMTP_TIMEOUT_MS }),
    appBaseUrl: config.APP_BASE_URL,
    onMailFailed: (to, error) => logger.warn({ err: error, to }, 'alert mail could not be sent now; the scheduler tries again'),
  }),
  onStoredFailed: (forecastId, error) => logger.error({ err: error, forecastId }, 'alerts after a stored forecast failed'),
});
logger.info('worker ready');
console.log(`[planktide] worker ready (pid ${process.pid})`);

const shutdown = async () => {
  await stop();
  await boss.stop({ graceful: true, wait: true, timeout: 10_000 }).catch(() => {});
  await db.destroy();
  process.exit(0);
};
process.on('SIGINT', () => void shutdown());
process.on('SIGTERM', () => void shutdown());
