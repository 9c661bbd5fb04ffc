import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/free-port.ts';

const ROOT = path.resolve(import.meta.dirname, '../..');

interface Started {
  child: ChildProcess;
  output: () => string;
  exited: Promise<number | null>;
}

function startProduct(env: Record<string, string>): Started {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: '', LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { child, output: () => output, exited };
}

async function waitForHealth(baseUrl: string, started: Started, withinMs: number): Promise<Response> {
  const deadline = Date.now() + withinMs;
  while (Date.now() < deadline) {
    if (started.child.exitCode !== null) throw new Error(`The product exited early:\n${started.output()}`);
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      if (response.status === 200) return response;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`No healthy answer within ${withinMs} ms:\n${started.output()}`);
}

/** Whether a process runs; a zombie (exited, not yet reaped by its parent) counts as stopped. */
function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch {
    return false;
  }
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    return stat.slice(stat.lastIndexOf(')') + 2, stat.lastIndexOf(')') + 3) !== 'Z';
  } catch {
    return false;
  }
}

async function demoOrganisations(pgPort: number): Promise<{ id: string }[]> {
  const client = new pg.Client({ connectionString: `postgres://postgres@127.0.0.1:${pgPort}/planktide` });
  await client.connect();
  try {
    return (await client.query<{ id: string }>('select id from organisations order by id')).rows;
  } finally {
    await client.end();
  }
}

describe('npm start on a fresh data folder', () => {
  let dataDir: string;
  let env: Record<string, string>;
  let baseUrl: string;
  let pgPort: number;

  beforeAll(async () => {
    dataDir = mkdtempSync(path.join(os.tmpdir(), 'planktide-start-'));
    chmodSync(dataDir, 0o755);
    const port = await freePort();
    pgPort = await freePort();
    baseUrl = `http://127.0.0.1:${port}`;
    env = {
      PORT: String(port),
      PLANKTIDE_PG_PORT: String(pgPort),
      OIDC_STANDIN_PORT: String(await freePort()),
      SMTP_STANDIN_PORT: String(await freePort()),
      PLANKTIDE_DATA_DIR: dataDir,
    };
  });
  afterAll(() => rmSync(dataDir, { recursive: true, force: true }));

  it('serves the client and a healthy API within 60 s, leaves nothing running after SIGINT, and keeps the demo data for the next start', async () => {
    const first = startProduct(env);
    const health = await waitForHealth(baseUrl, first, 60_000);
    expect(await health.json()).toMatchObject({ status: 'ok', database: 'ok' });
    expect(first.output()).toContain(`App:        ${baseUrl}`);

    const page = await fetch(`${baseUrl}/sites/anything`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<div id="root"></div>');

    const orgsBefore = await demoOrganisations(pgPort);
    expect(orgsBefore).toHaveLength(1);

    const pidFile = path.join(dataDir, 'postgres', 'postmaster.pid');
    const postgresPid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
    expect(alive(postgresPid)).toBe(true);

    first.child.kill('SIGINT');
    expect(await first.exited).toBe(0);
    expect(alive(postgresPid)).toBe(false);
    expect(existsSync(pidFile)).toBe(false);
    await expect(fetch(`${baseUrl}/api/health`)).rejects.toThrow();

    const second = startProduct(env);
    await waitForHealth(baseUrl, second, 60_000);
    expect(second.output()).not.toContain('Seeded the demo organisation');
    expect(await demoOrganisations(pgPort)).toEqual(orgsBefore);
    second.child.kill('SIGTERM');
    expect(await second.exited).toBe(0);
  }, 180_000);
});
