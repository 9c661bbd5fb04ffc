import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { prepareSiteRuns } from '../../server/forecasts/prepare-runs.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { backupDatabase, restoreDatabase } from '../../server/postgres/backup.ts';
import { insertForecastSite, insertOrganisation } from '../helpers/forecast-fixture.ts';
import { fingerprint } from '../helpers/db-fingerprint.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('db:backup and db:restore', () => {
  let source: TestDatabase;
  let target: TestDatabase;
  let dir: string;

  beforeAll(async () => {
    source = await createTestDatabase();
    target = await createTestDatabase({ migrate: false });
    dir = mkdtempSync(path.join(os.tmpdir(), 'planktide-backup-'));
    const db = source.db;
    const org = await insertOrganisation(db);
    const site = await insertForecastSite(db, org, { name: 'Backup bay', timeZone: 'Europe/London' });
    const boss = await startQueue(source.url, { expireInSeconds: 60, retryLimit: 1, retryDelaySeconds: 1, maintenanceIntervalSeconds: 30, pollingIntervalSeconds: 1 });
    const tides = siteTideSource({ db });
    const [runId] = await prepareSiteRuns({ db, boss, tides }, { organisationId: org, siteId: site.siteId, forecastStartMs: Date.parse('2026-12-04T04:00:00Z'), trigger: 'manual' });
    await runForecastJob({ db, tides }, runId!);
    await boss.stop({ graceful: false, wait: true });
    await db.insertInto('alerts').values({ organisation_id: org, site_id: site.siteId, kind: 'gear_trigger', message: 'kept across a restore' }).execute();
  }, 60_000);

  afterAll(async () => {
    await source.drop();
    await target.drop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('restores into an empty database every forecast, profile, constituent set, site and alert, byte for byte', async () => {
    const file = path.join(dir, 'planktide.dump');
    backupDatabase(source.url, file);
    restoreDatabase(target.url, file);
    const before = await fingerprint(source.db);
    const after = await fingerprint(target.db);
    expect(after).toEqual(before);
    expect(before['public.forecasts']!.rows).toBe(1);
    expect(before['public.organism_profile_versions']!.rows).toBe(1);
    const grid = await target.db.selectFrom('forecasts').select('grid').executeTakeFirstOrThrow();
    expect(grid.grid.length).toBeGreaterThan(1000);
  }, 60_000);

  it('leaves the target unchanged when the dump is not a dump', async () => {
    const bad = path.join(dir, 'not-a-dump.dump');
    (await import('node:fs')).writeFileSync(bad, 'this is not a database dump');
    const before = await fingerprint(target.db);
    expect(() => restoreDatabase(target.url, bad)).toThrow(/pg_restore failed/);
    expect(await fingerprint(target.db)).toEqual(before);
  });
});
