import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { productEnv, removeDataDir, startProduct } from '../helpers/product.ts';

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

/** The worker processes started by the product (children running jobs/worker.ts), with their nice values. */
function workerNiceValues(parentPid: number): number[] {
  const values: number[] = [];
  for (const entry of readdirSync('/proc').filter((name) => /^\d+$/.test(name))) {
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      // proc(5): after "(comm)", field 4 is the parent pid and field 19 the nice value.
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      if (Number(fields[1]) !== parentPid) continue;
      if (!readFileSync(`/proc/${entry}/cmdline`, 'utf8').includes('jobs/worker.ts')) continue;
      values.push(Number(fields[16]));
    } catch {
      // the process ended while we looked
    }
  }
  return values;
}

async function organisationIds(pgPort: string): Promise<{ id: string }[]> {
  const client = new pg.Client({ connectionString: `postgres://postgres@127.0.0.1:${pgPort}/planktide` });
  await client.connect();
  try {
    return (await client.query<{ id: string }>('select id from organisations order by id')).rows;
  } finally {
    await client.end();
  }
}

describe('npm start on a fresh data folder', () => {
  let env: Record<string, string>;
  beforeAll(async () => {
    env = await productEnv();
  });
  afterAll(() => removeDataDir(env));

  it('serves the client and a healthy API within 60 s, leaves nothing running after SIGINT, and keeps the demo data for the next start', async () => {
    const first = await startProduct(env, 60_000);
    expect(first.output()).toContain(`App:        ${first.baseUrl}`);
    const health = await fetch(`${first.baseUrl}/api/health`);
    expect(await health.json()).toMatchObject({ status: 'ok', database: 'ok' });

    const page = await fetch(`${first.baseUrl}/sites/anything`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<div id="root"></div>');

    // Forecast workers run beside the web server at a lower CPU priority (PLANKTIDE_WORKER_NICE, default 10).
    expect(workerNiceValues(first.child.pid!)).toEqual([10]);

    const orgsBefore = await organisationIds(env.PLANKTIDE_PG_PORT!);
    expect(orgsBefore).toHaveLength(1);

    const pidFile = path.join(env.PLANKTIDE_DATA_DIR!, 'postgres', 'postmaster.pid');
    const postgresPid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
    expect(alive(postgresPid)).toBe(true);

    first.child.kill('SIGINT');
    expect(await first.exited).toBe(0);
    expect(alive(postgresPid)).toBe(false);
    expect(existsSync(pidFile)).toBe(false);
    await expect(fetch(`${first.baseUrl}/api/health`)).rejects.toThrow();

    const second = await startProduct(env, 60_000);
    expect(second.output()).not.toContain('Seeded the demo organisation');
    expect(await organisationIds(env.PLANKTIDE_PG_PORT!)).toEqual(orgsBefore);
    expect(await second.stop()).toBe(0);
  }, 180_000);
});
