/**
 * `npm run bench:batch`: queues 1,000 site forecasts (7 days, 50 layers, 30 s steps) and lets
 * worker processes (one per core, `npm run worker`) take them from the shared queue; prints
 * forecasts per second and the total time. Runs on its own throwaway PostgreSQL on loopback.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import { createDb, ensureDatabase } from '../server/db/connect.ts';
import { migrateToLatest } from '../server/db/migrate.ts';
import { prepareSiteRuns } from '../server/forecasts/prepare-runs.ts';
import { startQueue } from '../server/forecasts/queue.ts';
import { siteTideSource } from '../server/forecasts/site-tide-source.ts';
import { startCluster } from '../server/postgres/cluster.ts';
import { organismParamsSchema } from '../shared/schemas/organism.schema.ts';

const FORECASTS = Number(process.env.BENCH_FORECASTS ?? 1000);
const WORKERS = Number(process.env.BENCH_WORKERS ?? os.cpus().length);
const PROFILES_PER_SITE = 4;
const root = path.resolve(import.meta.dirname, '..');

const dir = mkdtempSync(path.join(os.tmpdir(), 'planktide-bench-'));
chmodSync(dir, 0o755);
const cluster = startCluster({ dataDir: path.join(dir, 'data'), port: 54000 + Math.floor(Math.random() * 900), throwaway: true });
const workers: ChildProcess[] = [];
try {
  await ensureDatabase(cluster.adminUrl, 'bench');
  const url = cluster.urlFor('bench');
  const db = createDb(url, 4);
  await migrateToLatest(db);
  const boss = await startQueue(url, { expireInSeconds: 600, retryLimit: 2, retryDelaySeconds: 5, maintenanceIntervalSeconds: 30, pollingIntervalSeconds: 0.5 });

  const org = (await db.insertInto('organisations').values({ name: 'Benchmark farms' }).returning('id').executeTakeFirstOrThrow()).id;
  const profiles = [];
  for (let p = 0; p < PROFILES_PER_SITE; p++) {
    const profile = await db.insertInto('organism_profiles').values({ organisation_id: org, name: `Organism ${p}`, taxon: 'benchmark' }).returning('id').executeTakeFirstOrThrow();
    await db
      .insertInto('organism_profile_versions')
      .values({ profile_id: profile.id, organisation_id: org, version: 1, params: JSON.stringify(organismParamsSchema.parse({ settlingVelocityMPerDay: 0.5 + 3 * p, initialCellsPerL: 1000, triggerCellsPerL: 2000 })) })
      .execute();
    profiles.push(profile.id);
  }
  const siteCount = Math.ceil(FORECASTS / PROFILES_PER_SITE);
  const siteIds: string[] = [];
  for (let s = 0; s < siteCount; s++) {
    const site = await db
      .insertInto('sites')
      .values({ organisation_id: org, name: `Bench site ${s}`, latitude_deg: 50 + (s % 20) * 0.5, longitude_deg: -5 + (s % 7), time_zone: 'Europe/London', water_depth_m: 10 + (s % 30), bed_roughness_m: 0.02, gear_top_m: 1, gear_bottom_m: 8, forecast_horizon_days: 7 })
      .returning('id')
      .executeTakeFirstOrThrow();
    const set = await db
      .insertInto('constituent_sets')
      .values({ organisation_id: org, site_id: site.id, version: 1, source: 'manual', kind: 'current', current_constituents: JSON.stringify([{ name: 'M2', major: 0.2 + (s % 5) * 0.05, phaseDeg: s % 360 }, { name: 'S2', major: 0.08, phaseDeg: 40 }]), current_axis_deg: null })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.updateTable('sites').set({ active_constituent_set_id: set.id }).where('id', '=', site.id).execute();
    await db.insertInto('site_organisms').values(profiles.map((profile_id) => ({ site_id: site.id, profile_id }))).execute();
    siteIds.push(site.id);
  }

  for (let w = 0; w < WORKERS; w++) {
    workers.push(spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], { cwd: root, env: { ...process.env, DATABASE_URL: url, LOG_LEVEL: 'silent' }, stdio: 'ignore' }));
  }
  await new Promise((r) => setTimeout(r, 3000)); // let the workers start

  const started = Date.now();
  const tides = siteTideSource({ db });
  const start = Date.parse('2026-12-02T04:00:00Z');
  let queued = 0;
  for (const siteId of siteIds) {
    const versions = await prepareSiteRuns({ db, boss, tides }, { organisationId: org, siteId, forecastStartMs: start, trigger: 'schedule' });
    queued += versions.length;
  }
  const queuedAt = Date.now();
  console.log(`queued ${queued} forecasts in ${((queuedAt - started) / 1000).toFixed(1)} s; ${WORKERS} worker process(es)`);
  let done = 0;
  while (done < queued) {
    await new Promise((r) => setTimeout(r, 2000));
    done = Number((await sql<{ n: number }>`select count(*)::int as n from forecasts`.execute(db)).rows[0]!.n);
    const failed = Number((await sql<{ n: number }>`select count(*)::int as n from forecast_runs where status = 'failed'`.execute(db)).rows[0]!.n);
    process.stdout.write(`\r${done}/${queued} stored, ${failed} failed, ${((Date.now() - started) / 1000).toFixed(0)} s   `);
    if (failed > 0 && done + failed >= queued) break;
  }
  const total = (Date.now() - started) / 1000;
  const size = (await sql<{ b: number }>`select sum(length(grid))::bigint as b from forecasts`.execute(db)).rows[0]!.b;
  console.log(`\n${done} forecasts stored in ${total.toFixed(1)} s: ${(done / total).toFixed(2)} forecasts per second (target: 1,000 within 180 s)`);
  console.log(`stored grids: ${(Number(size) / 1e6).toFixed(0)} MB, ${(Number(size) / done / 1e3).toFixed(0)} kB per forecast`);
  await boss.stop({ graceful: false, wait: true });
  await db.destroy();
} finally {
  for (const w of workers) w.kill('SIGTERM');
  await new Promise((r) => setTimeout(r, 1000));
  cluster.stop();
  rmSync(dir, { recursive: true, force: true });
}
