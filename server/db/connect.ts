import { Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import type { Database } from './schema.ts';

// pg returns int8 and numeric as strings by default: decode them as numbers.
const INT8_OID = 20;
const NUMERIC_OID = 1700;
pg.types.setTypeParser(INT8_OID, (value) => Number(value));
pg.types.setTypeParser(NUMERIC_OID, (value) => Number(value));

export type Db = Kysely<Database>;

export function createDb(connectionString: string, poolSize = 10): Db {
  const pool = new pg.Pool({
    connectionString,
    max: poolSize,
    connectionTimeoutMillis: 3000,
    idleTimeoutMillis: 10_000,
  });
  // An idle client losing its server (database restarted) must not crash the process.
  pool.on('error', () => {});
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

/** Creates the database on the cluster when it does not exist yet. */
export async function ensureDatabase(adminUrl: string, name: string): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Invalid database name "${name}"`);
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const found = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (found.rowCount === 0) await client.query(`create database ${name}`);
  } finally {
    await client.end();
  }
}
