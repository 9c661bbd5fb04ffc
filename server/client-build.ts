import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const SOURCES = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];

function newestMtime(entry: string): number {
  if (!existsSync(entry)) return 0;
  const stat = statSync(entry);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const child of readdirSync(entry)) newest = Math.max(newest, newestMtime(path.join(entry, child)));
  return newest;
}

export function clientDir(projectRoot: string): string {
  return path.join(projectRoot, 'dist', 'client');
}

/** Whether the built client is missing or older than its sources. */
export function clientNeedsBuild(projectRoot: string): boolean {
  const built = path.join(clientDir(projectRoot), 'index.html');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return SOURCES.some((source) => newestMtime(path.join(projectRoot, source)) > builtAt);
}

/** Builds the client with Vite when needed; returns whether it built. */
export async function ensureClientBuilt(projectRoot: string, log: (line: string) => void): Promise<boolean> {
  if (!clientNeedsBuild(projectRoot)) return false;
  log('Building the client (first start or sources changed)...');
  const { build } = await import('vite');
  // The served client is always a production build (React's development build is twice the size
  // and renders twice), whatever NODE_ENV this process runs with.
  const previous = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({ root: projectRoot, configFile: path.join(projectRoot, 'vite.config.ts'), logLevel: 'warn', mode: 'production' });
  } finally {
    process.env.NODE_ENV = previous;
  }
  return true;
}
