import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { ensurePostgresBin } from './binaries.ts';

function run(tool: string, args: string[]): void {
  const bin = path.join(ensurePostgresBin(), tool);
  const result = spawnSync(bin, args, { encoding: 'utf8' });
  if (result.status !== 0) throw new Error(`${tool} failed (exit ${result.status}): ${result.stderr.trim()}`);
}

/** A full dump of the database in pg_dump's custom format (compressed; restorable table by table). */
export function backupDatabase(databaseUrl: string, file: string): void {
  run('pg_dump', ['--format=custom', '--no-owner', '--file', file, '--dbname', databaseUrl]);
}

/**
 * Restores a dump into the database, replacing what is there, in one transaction: if anything
 * fails, the database is left as it was.
 */
export function restoreDatabase(databaseUrl: string, file: string): void {
  run('pg_restore', ['--clean', '--if-exists', '--no-owner', '--single-transaction', '--exit-on-error', '--dbname', databaseUrl, file]);
}
