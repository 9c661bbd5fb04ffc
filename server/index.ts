import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app.ts';
import { clientDir, ensureClientBuilt } from './client-build.ts';
import { ConfigError, parseConfig, type Config } from './config.ts';
import { createDb, type Db } from './db/connect.ts';
import { migrateToLatest } from './db/migrate.ts';
import { createLogger } from './logger.ts';
import { openDatabase, type DatabaseHandle } from './postgres/local-database.ts';
import { DEMO_PEOPLE, seedDemoWhenEmpty } from './seed/demo-organisation.ts';
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

function banner(config: Config, database: DatabaseHandle): string {
  const url = `http://${config.HOST}:${config.PORT}`;
  const lines = [
    '',
    `  Planktide ${VERSION} is running (pid ${process.pid})`,
    `  App:        ${url}`,
    `  Health:     ${url}/api/health`,
    `  PostgreSQL: ${database.embedded ? `project cluster on 127.0.0.1:${config.PLANKTIDE_PG_PORT} (data in ${path.relative(PROJECT_ROOT, config.PLANKTIDE_DATA_DIR)}/postgres)` : 'DATABASE_URL'}`,
    `  Demo people: ${DEMO_PEOPLE.map((p) => `${p.email} (${p.role})`).join(', ')}`,
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
    if (await seedDemoWhenEmpty(db)) say('Seeded the demo organisation.');
    const serveClient = config.PLANKTIDE_CLIENT === 'built';
    if (serveClient) await ensureClientBuilt(PROJECT_ROOT, say);
    const app = createApp({ db, logger, version: VERSION, clientDir: serveClient ? clientDir(PROJECT_ROOT) : undefined });
    server = app.listen(config.PORT, config.HOST);
    await new Promise<void>((resolve, reject) => {
      server!.once('listening', resolve);
      server!.once('error', reject);
    });
    console.log(banner(config, database));
  } catch (error) {
    console.error(`Planktide could not start: ${error instanceof Error ? error.message : String(error)}`);
    await stop('start-up failed', 1);
  }
}

await main();
