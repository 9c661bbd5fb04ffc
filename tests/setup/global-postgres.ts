import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startCluster } from '../../server/postgres/cluster.ts';
import { freePort } from '../helpers/free-port.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
  }
}

/** One throwaway PostgreSQL for the whole run; each test file makes its own database in it. */
export default async function setup(project: TestProject) {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'planktide-test-pg-'));
  chmodSync(dir, 0o755); // the postgres user must reach the data folder when we run as root
  const cluster = startCluster({ dataDir: path.join(dir, 'data'), port: await freePort(), throwaway: true });
  project.provide('pgAdminUrl', cluster.adminUrl);
  return () => {
    cluster.stop();
    rmSync(dir, { recursive: true, force: true });
  };
}
