import Papa from 'papaparse';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { requireActiveSubscription } from '../../server/billing/subscription-gate.ts';
import { startQueue } from '../../server/forecasts/queue.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { startForecastWorker } from '../../server/forecasts/worker.ts';
import { decodeGrid } from '../../shared/forecast/grid-codec.ts';
import { forecastRunListSchema, forecastSchema } from '../../shared/schemas/forecast.schema.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { SINKING_DIATOM, SITE_CURRENT, waitFor } from '../helpers/forecast-fixture.ts';
import { quietLogger } from '../helpers/quiet-logger.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';
import type { Browser } from '../helpers/browser.ts';

describe('forecast API', () => {
  let world: TeamWorld;
  let boss: PgBoss;
  let stopWorker: () => Promise<void>;
  let manager: Browser;
  let profileId: string;
  let forecastId: string;

  beforeAll(async () => {
    world = await startTeamWorld();
    boss = await startQueue(world.database.url, { expireInSeconds: 60, retryLimit: 2, retryDelaySeconds: 1, maintenanceIntervalSeconds: 5, pollingIntervalSeconds: 0.5 });
    const tides = siteTideSource({ db: world.database.db });
    stopWorker = await startForecastWorker({ db: world.database.db, boss, tides, logger: quietLogger() });
    await world.restartApp({ forecasts: { boss, tides, forecastGate: requireActiveSubscription(world.database.db, { graceDays: 7 }) } });
    manager = await world.as('managerA');
    const db = world.database.db;
    const set = await db
      .insertInto('constituent_sets')
      .values({ organisation_id: world.orgA, site_id: world.siteA, version: 1, source: 'manual', kind: 'current', current_constituents: JSON.stringify(SITE_CURRENT.constituents), current_axis_deg: SITE_CURRENT.axisDeg })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.updateTable('sites').set({ active_constituent_set_id: set.id }).where('id', '=', world.siteA).execute();
  }, 60_000);

  afterAll(async () => {
    await stopWorker();
    await boss.stop({ graceful: false, wait: true });
    await world.close();
  });

  it('lets a biologist add a profile and a manager set the organisms a site watches', async () => {
    const biologist = await world.as('biologistA');
    const created = await biologist.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/profiles`, { name: 'Sinking diatom', taxon: 'Chaetoceros sp.', params: SINKING_DIATOM });
    expect(created.status).toBe(201);
    profileId = (created.json as { id: string }).id;
    const watched = await manager.api(world.baseUrl, 'PUT', `/orgs/${world.orgA}/sites/${world.siteA}/watch`, { profileIds: [profileId] });
    expect(watched.json).toEqual({ profileIds: [profileId] });
  });

  it('refuses a profile with an impossible settling velocity, naming the field', async () => {
    const biologist = await world.as('biologistA');
    const answer = await biologist.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/profiles`, { name: 'Rock', taxon: 'x', params: { ...SINKING_DIATOM, settlingVelocityMPerDay: 5000 } });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain('params.settlingVelocityMPerDay: settling velocity must be at most 200 m/day');
  });

  it('locks forecasts until the organisation subscribes, telling non-owners to ask their owner', async () => {
    const answer = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites/${world.siteA}/runs`, {});
    expect(answer.status).toBe(402);
    expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/owner/i);
    await world.database.db
      .insertInto('billing_accounts')
      .values({ organisation_id: world.orgA, customer_id: 'cus_test', subscription_id: 'sub_test', status: 'active', plan_id: 'longline', quantity: 1 })
      .execute();
  });

  it('runs now for a manager, shows the run progress and stores the forecast', async () => {
    const answer = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites/${world.siteA}/runs`, { horizonDays: 3 });
    expect(answer.status).toBe(202);
    const [run] = forecastRunListSchema.parse(answer.json).runs;
    expect(run?.trigger).toBe('manual');
    const done = await waitFor('the run to finish', async () => {
      const runs = forecastRunListSchema.parse((await manager.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites/${world.siteA}/runs`)).json).runs;
      const mine = runs.find((r) => r.id === run!.id);
      return mine?.status === 'done' ? mine : undefined;
    });
    expect(done.progress).toBe(1);
    forecastId = done.forecastId!;
  }, 60_000);

  it('gives the latest forecast with its inputs, windows and advice to crew', async () => {
    const crew = await world.as('crewA');
    const answer = await crew.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites/${world.siteA}/forecasts/latest?profileId=${profileId}`);
    const forecast = forecastSchema.parse(answer.json);
    expect(forecast.id).toBe(forecastId);
    expect(forecast.inputs.profile).toMatchObject({ name: 'Sinking diatom', version: 1 });
    expect(forecast.inputs.site.timeZone).toBe('Europe/London');
    expect(forecast.windows.some((w) => w.kind === 'slack')).toBe(true);
    expect(forecast.advice.length).toBeGreaterThanOrEqual(3);
  });

  it('sends the grid as compact binary that decodes to the forecast horizon', async () => {
    const response = await manager.request(`${world.baseUrl}/api/orgs/${world.orgA}/forecasts/${forecastId}/grid`);
    expect(response.headers.get('content-type')).toBe('application/octet-stream');
    const grid = decodeGrid(await response.arrayBuffer());
    expect(grid.nz).toBe(50);
    expect((grid.nt - 1) * grid.stepMs).toBe(3 * 86_400_000);
    expect(grid.depthM[0]).toBeCloseTo(15 / 50 / 2, 9);
    expect(Math.min(...grid.concentration)).toBeGreaterThanOrEqual(0);
  });

  it('lets a browser revalidate the grid (ETag, 304 without a body), and never for another organisation', async () => {
    const url = `${world.baseUrl}/api/orgs/${world.orgA}/forecasts/${forecastId}/grid`;
    const first = await manager.request(url);
    const etag = first.headers.get('etag');
    expect(etag).toBeTruthy();
    expect(first.headers.get('cache-control')).toContain('private');
    // RFC 9110 §13.1.2: a matching If-None-Match answers 304 Not Modified. (As a browser revalidating its
    // copy sends it; fetch() would otherwise add "Cache-Control: no-cache", which asks for the full answer.)
    const revalidate = (tag: string) => ({ headers: { 'if-none-match': tag, 'cache-control': 'max-age=0' } });
    const again = await manager.request(url, revalidate(etag!));
    expect(again.status).toBe(304);
    expect((await again.arrayBuffer()).byteLength).toBe(0);
    expect((await manager.request(url, revalidate('"something-else"'))).status).toBe(200);
    // Organisation B's owner, naming A's forecast under B with A's validator, learns nothing.
    const ownerB = await world.as('ownerB');
    const foreign = await ownerB.request(`${world.baseUrl}/api/orgs/${world.orgB}/forecasts/${forecastId}/grid`, revalidate(etag!));
    expect([402, 404]).toContain(foreign.status);
  });

  it('shows a newer forecast and a changed subscription at once when they change through the app', async () => {
    const crew = await world.as('crewA');
    const latest = `/orgs/${world.orgA}/sites/${world.siteA}/forecasts/latest?profileId=${profileId}`;
    expect(forecastSchema.parse((await crew.api(world.baseUrl, 'GET', latest)).json).id).toBe(forecastId);
    // A manager's request that changes the organisation drops its kept reads: the next read is current.
    const watch = await manager.api(world.baseUrl, 'PUT', `/orgs/${world.orgA}/sites/${world.siteA}/watch`, { profileIds: [] });
    expect(watch.status).toBe(200);
    await world.database.db.updateTable('forecasts').set({ created_at: new Date('2020-01-01T00:00:00Z') }).where('id', '=', forecastId).execute();
    const read = forecastSchema.parse((await crew.api(world.baseUrl, 'GET', latest)).json);
    expect(read.createdAt).toBe('2020-01-01T00:00:00.000Z');
    expect((await manager.api(world.baseUrl, 'PUT', `/orgs/${world.orgA}/sites/${world.siteA}/watch`, { profileIds: [profileId] })).status).toBe(200);
  });

  it('downloads a long-format CSV (RFC 4180) with UTC and site-local times, parsed by papaparse', async () => {
    const response = await manager.request(`${world.baseUrl}/api/orgs/${world.orgA}/forecasts/${forecastId}/download.csv`);
    const parsed = Papa.parse<Record<string, string>>(await response.text(), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(['time_utc', 'time_local', 'depth_m_below_surface', 'concentration_cells_per_l', 'current_speed_m_s', 'eddy_diffusivity_m2_s']);
    expect(parsed.data).toHaveLength(289 * 50);
    const first = parsed.data[0]!;
    expect(new Date(first.time_local!).getTime()).toBe(new Date(first.time_utc!).getTime());
    const grid = decodeGrid(await (await manager.request(`${world.baseUrl}/api/orgs/${world.orgA}/forecasts/${forecastId}/grid`)).arrayBuffer());
    const row = 100 * 50 + 7; // output 100, layer 7
    // The CSV writes six significant digits.
    const written = Number(parsed.data[row]!.concentration_cells_per_l);
    expect(Math.abs(written - grid.concentration[row]!)).toBeLessThanOrEqual(1e-5 * Math.max(1, grid.concentration[row]!));
    expect(Number(parsed.data[row]!.depth_m_below_surface)).toBeCloseTo(grid.depthM[7]!, 3);
  });
});
