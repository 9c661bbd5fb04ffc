import path from 'node:path';
import type { Config } from '../config.ts';
import { ensureDatabase } from '../db/connect.ts';
import { startCluster } from './cluster.ts';

export const LOCAL_DATABASE_NAME = 'planktide';

export interface DatabaseHandle {
  url: string;
  /** Whether this process started PostgreSQL (and so must stop it). */
  embedded: boolean;
  stop(): void;
}

/** DATABASE_URL when set; otherwise the project's own PostgreSQL, started on loopback. */
export async function openDatabase(config: Config, log: (line: string) => void = () => {}): Promise<DatabaseHandle> {
  if (config.DATABASE_URL) return { url: config.DATABASE_URL, embedded: false, stop() {} };
  const cluster = startCluster({
    dataDir: path.join(config.PLANKTIDE_DATA_DIR, 'postgres'),
    port: config.PLANKTIDE_PG_PORT,
    log,
  });
  try {
    await ensureDatabase(cluster.adminUrl, LOCAL_DATABASE_NAME);
  } catch (error) {
    cluster.stop();
    throw error;
  }
  return { url: cluster.urlFor(LOCAL_DATABASE_NAME), embedded: true, stop: () => cluster.stop() };
}

async function answers(url: string): Promise<boolean> {
  const { default: pg } = await import('pg');
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 });
  try {
    await client.connect();
    await client.end();
    return true;
  } catch {
    return false;
  }
}

/**
 * Runs `work` against DATABASE_URL, or against the project's own PostgreSQL: the one a running
 * `npm start` serves (left running), else started for the work and stopped after it.
 */
export async function withDatabaseUrl<T>(config: Config, work: (url: string) => Promise<T>): Promise<T> {
  const running = `postgres://postgres@127.0.0.1:${config.PLANKTIDE_PG_PORT}/${LOCAL_DATABASE_NAME}`;
  if (!config.DATABASE_URL && (await answers(running))) return work(running);
  const handle = await openDatabase(config, console.log);
  try {
    return await work(handle.url);
  } finally {
    handle.stop();
  }
}
