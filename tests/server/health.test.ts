import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { healthSchema } from '../../shared/schemas/health.schema.ts';
import { createDb, ensureDatabase } from '../../server/db/connect.ts';
import { startCluster, type RunningCluster } from '../../server/postgres/cluster.ts';
import { freePort } from '../helpers/free-port.ts';
import type { RunningServer } from '../helpers/http.ts';
import { startTestApp } from '../helpers/test-app.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

async function health(baseUrl: string) {
  const response = await fetch(`${baseUrl}/api/health`);
  return { status: response.status, body: healthSchema.parse(await response.json()) };
}

describe('GET /api/health with the database up', () => {
  let database: TestDatabase;
  let server: RunningServer;
  beforeAll(async () => {
    database = await createTestDatabase();
    server = await startTestApp(database.db, { port: await freePort() });
  });
  afterAll(async () => {
    await server.close();
    await database.drop();
  });

  it('answers 200 with the database ok and the version', async () => {
    const { status, body } = await health(server.baseUrl);
    expect(status).toBe(200);
    expect(body).toEqual({ status: 'ok', database: 'ok', version: 'test' });
  });
});

describe('GET /api/health while PostgreSQL stops and starts again', () => {
  let dir: string;
  let port: number;
  let cluster: RunningCluster;
  let server: RunningServer;
  let db: ReturnType<typeof createDb>;
  const start = () => startCluster({ dataDir: path.join(dir, 'data'), port, throwaway: true });

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'planktide-health-'));
    chmodSync(dir, 0o755); // the postgres user must reach the data folder when we run as root
    port = await freePort();
    cluster = start();
    await ensureDatabase(cluster.adminUrl, 'planktide');
    db = createDb(cluster.urlFor('planktide'), 2);
    server = await startTestApp(db, { port: await freePort() });
  }, 60_000);
  afterAll(async () => {
    await server.close();
    await db.destroy();
    cluster.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('reports 200 before, 503 "unavailable" while down, and 200 again after restart without restarting the app', async () => {
    expect((await health(server.baseUrl)).status).toBe(200);

    cluster.stop();
    const down = await health(server.baseUrl);
    expect(down.status).toBe(503);
    expect(down.body.database).toBe('unavailable');
    expect(down.body.status).toBe('degraded');

    cluster = start();
    const up = await health(server.baseUrl);
    expect(up.status).toBe(200);
    expect(up.body.database).toBe('ok');
  }, 60_000);
});
