import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { freePort } from './free-port.ts';

const ROOT = path.resolve(import.meta.dirname, '../..');

export interface RunningProduct {
  baseUrl: string;
  env: Record<string, string>;
  child: ChildProcess;
  output(): string;
  exited: Promise<number | null>;
  /** Sends SIGTERM and waits for the exit code. */
  stop(): Promise<number | null>;
}

/** Free ports and a fresh data folder for one product instance (embedded PostgreSQL, stand-ins). */
export async function productEnv(dataDir?: string): Promise<Record<string, string>> {
  const dir = dataDir ?? mkdtempSync(path.join(os.tmpdir(), 'planktide-product-'));
  chmodSync(dir, 0o755); // the postgres user must reach the data folder when we run as root
  const port = await freePort();
  return {
    PORT: String(port),
    PLANKTIDE_PG_PORT: String(await freePort()),
    OIDC_STANDIN_PORT: String(await freePort()),
    SMTP_STANDIN_PORT: String(await freePort()),
    PAYMENTS_STANDIN_PORT: String(await freePort()),
    TIDE_FEED_STANDIN_PORT: String(await freePort()),
    PLANKTIDE_DATA_DIR: dir,
  };
}

/** Starts `server/index.ts` as `npm start` does, and waits until /api/health answers 200. */
export async function startProduct(env: Record<string, string>, withinMs = 90_000): Promise<RunningProduct> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: '', NODE_ENV: 'development', LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  const baseUrl = `http://127.0.0.1:${env.PORT}`;
  const product: RunningProduct = {
    baseUrl,
    env,
    child,
    output: () => output,
    exited,
    async stop() {
      if (child.exitCode === null) child.kill('SIGTERM');
      return exited;
    },
  };
  const deadline = Date.now() + withinMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The product exited early:\n${output}`);
    const ok = await fetch(`${baseUrl}/api/health`).then((r) => r.status === 200, () => false);
    if (ok) return product;
    await new Promise((r) => setTimeout(r, 250));
  }
  await product.stop();
  throw new Error(`No healthy answer within ${withinMs} ms:\n${output}`);
}

export function removeDataDir(env: Record<string, string>): void {
  if (env.PLANKTIDE_DATA_DIR) rmSync(env.PLANKTIDE_DATA_DIR, { recursive: true, force: true });
}
