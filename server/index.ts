import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app.ts';
import { PostgresSessionStore } from './auth/session-store.ts';
import { clientDir, ensureClientBuilt } from './client-build.ts';
import { ConfigError, parseConfig, type Config } from './config.ts';
import { createDb, type Db } from './db/connect.ts';
import { migrateToLatest } from './db/migrate.ts';
import { createLogger } from './logger.ts';
import { openDatabase, type DatabaseHandle } from './postgres/local-database.ts';
import { startIdentityStandIn, type RunningIdentityStandIn } from './identity-standin/start.ts';
import { seedStandInAccounts } from './identity-standin/accounts.ts';
import { createMailer, type Mailer } from './mail/mailer.ts';
import { startSmtpStandIn, type SmtpStandIn } from './mail/smtp-standin.ts';
import { DEMO_PASSWORD, DEMO_PEOPLE, seedDemoWhenEmpty } from './seed/demo-organisation.ts';
import { createTideFeedClient } from './tides/tide-feed.client.ts';
import { startTideFeedStandIn, type TideFeedStandIn } from './tides/tide-feed-standin.ts';
import { startBilling, type RunningBilling } from './billing/start-billing.ts';
import { requireActiveSubscription } from './billing/subscription-gate.ts';
import { queueFirstForecasts, startForecastServices, type ForecastServices } from './forecasts/services.ts';
import { VERSION } from './version.ts';

const PROJECT_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const say = (line: string) => console.log(`[planktide] ${line}`);

function readConfig(): Config {
  try {
    return parseConfig(process.env, PROJECT_ROOT);
  } catch (error) {
    if (error instanceof ConfigError) {
      console.error(error.message);
      process.exit(1);
    }
    throw error;
  }
}

interface Services {
  identity?: RunningIdentityStandIn;
  smtp?: SmtpStandIn;
  tideFeed?: TideFeedStandIn;
  forecasts?: ForecastServices;
  billing?: RunningBilling;
}

function banner(config: Config, database: DatabaseHandle, services: Services, issuer: string, smtpUrl: string): string {
  const url = `http://${config.HOST}:${config.PORT}`;
  const lines = [
    '',
    `  Planktide ${VERSION} is running (pid ${process.pid})`,
    `  App:        ${url}`,
    `  Health:     ${url}/api/health`,
    `  PostgreSQL: ${database.embedded ? `project cluster on 127.0.0.1:${config.PLANKTIDE_PG_PORT} (data in ${path.relative(PROJECT_ROOT, config.PLANKTIDE_DATA_DIR)}/postgres)` : 'DATABASE_URL'}`,
    `  Sign-in:    ${services.identity ? `local identity stand-in at ${issuer}` : issuer}`,
    `  Mail:       ${services.smtp ? `local SMTP stand-in at ${smtpUrl}; caught mail at ${url}/dev/mail` : smtpUrl.replace(/\/\/[^@]*@/, '//***@')}`,
    `  Payments:   ${services.billing?.describe ?? 'off'}`,
    `  Tide feed:  ${services.tideFeed ? `local stand-in at ${services.tideFeed.url}` : 'TIDE_FEED_URL'}`,
    `  Forecasts:  scheduler ${config.PLANKTIDE_SCHEDULER}, ${config.PLANKTIDE_WORKERS} worker process(es); more with \`npm run worker\``,
    ...(services.identity
      ? ['  Demo accounts (password "' + DEMO_PASSWORD + '"):', ...DEMO_PEOPLE.map((p) => `    ${p.email.padEnd(28)} ${p.role}`)]
      : []),
    '  Stop with Ctrl-C: everything started here stops with it.',
    '',
  ];
  return lines.join('\n');
}

async function main(): Promise<void> {
  const config = readConfig();
  const logger = createLogger(config.LOG_LEVEL);
  let database: DatabaseHandle | undefined;
  let db: Db | undefined;
  let server: Server | undefined;
  let mailer: Mailer | undefined;
  const services: Services = {};
  let stopping = false;

  const stop = async (reason: string, code = 0) => {
    if (stopping) return;
    stopping = true;
    say(`Stopping (${reason})...`);
    if (server) {
      const closing = new Promise<void>((resolve) => server!.close(() => resolve()));
      server.closeIdleConnections();
      setTimeout(() => server!.closeAllConnections(), 3000).unref();
      await closing;
    }
    await services.forecasts?.stop().catch(() => {});
    mailer?.close();
    await services.tideFeed?.close().catch(() => {});
    await services.billing?.close().catch(() => {});
    await services.identity?.close().catch(() => {});
    await services.smtp?.close().catch(() => {});
    await db?.destroy().catch(() => {});
    try {
      database?.stop();
    } catch (error) {
      console.error(`Could not stop PostgreSQL cleanly: ${String(error)}`);
      code = code || 1;
    }
    say('Stopped.');
    process.exit(code);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));

  try {
    database = await openDatabase(config, say);
    db = createDb(database.url);
    const applied = await migrateToLatest(db);
    if (applied.length) say(`Applied ${applied.length} migration(s).`);
    const seeded = await seedDemoWhenEmpty(db);
    if (seeded) say('Seeded the demo organisation.');
    const serveClient = config.PLANKTIDE_CLIENT === 'built';
    if (serveClient) await ensureClientBuilt(PROJECT_ROOT, say);

    let smtpUrl = config.SMTP_URL;
    if (!smtpUrl) {
      services.smtp = await startSmtpStandIn(config.SMTP_STANDIN_PORT);
      smtpUrl = services.smtp.url;
    }
    mailer = createMailer(smtpUrl, config.MAIL_FROM, { timeoutMs: config.SMTP_TIMEOUT_MS });

    let issuer = config.OIDC_ISSUER_URL;
    if (!issuer) {
      const created = await seedStandInAccounts(db, DEMO_PEOPLE.map((p) => ({ email: p.email, password: DEMO_PASSWORD, displayName: p.displayName })));
      if (created.length) say(`Created ${created.length} demo sign-in account(s) in the identity stand-in.`);
      services.identity = await startIdentityStandIn({
        port: config.OIDC_STANDIN_PORT,
        db,
        cookieKeys: [config.SESSION_SECRET],
        logger: logger.child({ service: 'identity-standin' }),
        devMode: config.NODE_ENV !== 'production',
        clients: [
          {
            clientId: config.OIDC_CLIENT_ID,
            clientSecret: config.OIDC_CLIENT_SECRET,
            redirectUris: [`${config.APP_BASE_URL}/auth/callback`],
            postLogoutRedirectUris: [`${config.APP_BASE_URL}/`],
          },
        ],
      });
      issuer = services.identity.issuer;
    }

    services.billing = await startBilling({
      paymentsUrl: config.PAYMENTS_URL,
      secretKey: config.STRIPE_SECRET_KEY,
      webhookSecret: config.STRIPE_WEBHOOK_SECRET,
      standInPort: config.PAYMENTS_STANDIN_PORT,
      host: config.HOST,
      appBaseUrl: config.APP_BASE_URL,
      graceDays: config.BILLING_GRACE_DAYS,
    });

    let tideFeedUrl = config.TIDE_FEED_URL;
    if (!tideFeedUrl) {
      services.tideFeed = await startTideFeedStandIn({ port: config.TIDE_FEED_STANDIN_PORT, apiKey: config.TIDE_FEED_API_KEY });
      tideFeedUrl = services.tideFeed.url;
    }
    const feed = createTideFeedClient({ baseUrl: tideFeedUrl, apiKey: config.TIDE_FEED_API_KEY, timeoutMs: config.TIDE_FEED_TIMEOUT_MS });
    services.forecasts = await startForecastServices({ config, db, databaseUrl: database.url, feed, feedUrl: tideFeedUrl, smtpUrl, mailer, logger });
    if (seeded) {
      const queued = await queueFirstForecasts({ db, boss: services.forecasts.boss, tides: services.forecasts.tides });
      say(`Queued ${queued} first demo forecast(s); they appear within a minute or two.`);
    }

    const app = createApp({
      db,
      logger,
      version: VERSION,
      appBaseUrl: config.APP_BASE_URL,
      oidc: { issuerUrl: issuer, clientId: config.OIDC_CLIENT_ID, clientSecret: config.OIDC_CLIENT_SECRET, sessionSecret: config.SESSION_SECRET },
      mailer,
      tides: { feed },
      forecasts: {
        boss: services.forecasts.boss,
        tides: services.forecasts.tides,
        forecastGate: requireActiveSubscription(db, { graceDays: config.BILLING_GRACE_DAYS }),
      },
      billing: services.billing.deps,
      sampling: { forecastGate: requireActiveSubscription(db, { graceDays: config.BILLING_GRACE_DAYS }) },
      lab: { forecastGate: requireActiveSubscription(db, { graceDays: config.BILLING_GRACE_DAYS }) },
      devMail: config.NODE_ENV === 'development' ? services.smtp : undefined,
      clientDir: serveClient ? clientDir(PROJECT_ROOT) : undefined,
    });
    server = app.listen(config.PORT, config.HOST);
    await new Promise<void>((resolve, reject) => {
      server!.once('listening', resolve);
      server!.once('error', reject);
    });
    const sessions = new PostgresSessionStore(db);
    setInterval(() => void sessions.prune().catch(() => {}), 3600_000).unref();
    console.log(banner(config, database, services, issuer, smtpUrl));
  } catch (error) {
    console.error(`Planktide could not start: ${error instanceof Error ? error.message : String(error)}`);
    await stop('start-up failed', 1);
  }
}

await main();
