import { execFileSync, spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensurePostgresBin, isRoot } from './binaries.ts';

export interface ClusterOptions {
  dataDir: string;
  port: number;
  /** Throwaway clusters skip fsync; never use for data a user keeps. */
  throwaway?: boolean;
  log?: (line: string) => void;
}

export interface RunningCluster {
  /** Connection string for the superuser's maintenance database. */
  adminUrl: string;
  urlFor(database: string): string;
  stop(): void;
}

function ownerIds(): { uid: number; gid: number } | null {
  if (!isRoot()) return null;
  const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim());
  const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim());
  return { uid, gid };
}

function run(bin: string, args: string[], asPostgres: boolean): void {
  const [cmd, argv] = asPostgres ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  const result = spawnSync(cmd, argv, { encoding: 'utf8' });
  if (result.status !== 0) {
    throw new Error(`${path.basename(bin)} failed (exit ${result.status}):\n${result.stdout}\n${result.stderr}`);
  }
}

function isRunning(pgCtl: string, dataDir: string, asPostgres: boolean): boolean {
  const [cmd, argv] = asPostgres
    ? ['runuser', ['-u', 'postgres', '--', pgCtl, '-D', dataDir, 'status']]
    : [pgCtl, ['-D', dataDir, 'status']];
  return spawnSync(cmd, argv, { encoding: 'utf8' }).status === 0;
}

/**
 * Creates (on first use) and starts a PostgreSQL cluster listening on 127.0.0.1 only,
 * run as the `postgres` user when this process is root (initdb refuses root).
 */
export function startCluster(options: ClusterOptions): RunningCluster {
  const log = options.log ?? (() => {});
  const bin = ensurePostgresBin(log);
  const owner = ownerIds();
  const asPostgres = owner !== null;
  const dataDir = path.resolve(options.dataDir);
  const pgCtl = path.join(bin, 'pg_ctl');

  mkdirSync(path.dirname(dataDir), { recursive: true });
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    log(`Creating a PostgreSQL cluster in ${path.relative(process.cwd(), dataDir) || dataDir}`);
    mkdirSync(dataDir, { recursive: true, mode: 0o700 });
    if (owner) chownSync(dataDir, owner.uid, owner.gid);
    const initArgs = ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'];
    if (options.throwaway) initArgs.push('--no-sync');
    run(path.join(bin, 'initdb'), initArgs, asPostgres);
  }

  if (isRunning(pgCtl, dataDir, asPostgres)) {
    log('Found this project\'s PostgreSQL still running from an earlier start: stopping it first.');
    run(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', 'stop'], asPostgres);
  }

  const socketDir = mkdtempSync(path.join(os.tmpdir(), 'planktide-pg-'));
  if (owner) chownSync(socketDir, owner.uid, owner.gid);
  const serverOptions = [
    '-c listen_addresses=127.0.0.1',
    `-p ${options.port}`,
    `-k ${socketDir}`,
    ...(options.throwaway ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
  ].join(' ');
  const logFile = path.join(dataDir, 'server.log');
  run(pgCtl, ['-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', serverOptions, 'start'], asPostgres);

  let stopped = false;
  const urlFor = (database: string) => `postgres://postgres@127.0.0.1:${options.port}/${database}`;
  return {
    adminUrl: urlFor('postgres'),
    urlFor,
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        run(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', 'stop'], asPostgres);
      } finally {
        rmSync(socketDir, { recursive: true, force: true });
      }
    },
  };
}
