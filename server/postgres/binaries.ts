import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';

const DEBIAN_ROOT = '/usr/lib/postgresql';

export class PostgresMissingError extends Error {}

/** The newest Debian PostgreSQL bin folder, or null when none is installed. */
export function findPostgresBin(root = DEBIAN_ROOT): string | null {
  if (!existsSync(root)) return null;
  const versions = readdirSync(root)
    .filter((name) => /^\d+(\.\d+)?$/.test(name))
    .filter((name) => existsSync(path.join(root, name, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(a) - Number(b));
  const newest = versions.at(-1);
  return newest ? path.join(root, newest, 'bin') : null;
}

export function isRoot(): boolean {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

/**
 * Finds PostgreSQL's binaries, installing Debian's package when running as root.
 * Otherwise fails with the exact command to run.
 */
export function ensurePostgresBin(log: (line: string) => void = console.log): string {
  const found = findPostgresBin();
  if (found) return found;
  if (!isRoot()) {
    throw new PostgresMissingError(
      'PostgreSQL is not installed. Install it with:\n  sudo apt-get update && sudo apt-get install -y postgresql\n' +
        'or set DATABASE_URL to a database you already run.',
    );
  }
  log('PostgreSQL not found: installing Debian package "postgresql" with apt-get (about a minute)...');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update'], { stdio: 'inherit', env });
  execFileSync('apt-get', ['install', '-y', '--no-install-recommends', 'postgresql'], { stdio: 'inherit', env });
  const installed = findPostgresBin();
  if (!installed) throw new PostgresMissingError('apt-get finished but no PostgreSQL binaries were found under /usr/lib/postgresql.');
  return installed;
}
