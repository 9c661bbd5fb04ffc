import { gunzipSync } from 'node:zlib';
import { Router, type RequestHandler } from 'express';
import type PgBoss from 'pg-boss';
import { z } from 'zod';
import { decodeGrid } from '../../shared/forecast/grid-codec.ts';
import { runNowSchema, watchSchema, type Forecast } from '../../shared/schemas/forecast.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { orgReadCache } from '../http/org-read-cache.ts';
import { validate } from '../http/validate.ts';
import { findSite } from '../sites/sites.repository.ts';
import { forecastCsvLines } from './forecast-csv.ts';
import * as repo from './forecasts.repository.ts';
import { createGridCache } from './grid-cache.ts';
import { prepareSiteRuns } from './prepare-runs.ts';
import type { TideSource } from './tide-source.ts';

export interface ForecastsDeps {
  db: Db;
  /** The queue and tides for "run now"; without them run-now answers 503. */
  boss?: PgBoss;
  tides?: TideSource;
  /** Gate on forecast content (subscription); default lets everyone through. */
  forecastGate?: RequestHandler;
}

const siteParams = z.object({ orgId: z.uuid(), siteId: z.uuid() });
const forecastParams = z.object({ orgId: z.uuid(), forecastId: z.uuid() });
const latestQuery = z.object({ profileId: z.uuid({ error: 'profileId must be the id of an organism profile' }) });
const RUN_NOW_STEP_MS = 10 * 60_000;

/** /api/orgs/:orgId/...: watched organisms, forecasts, runs. */
export function forecastRoutes(deps: ForecastsDeps): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const managers = requireMember(db, ['owner', 'manager']);
  const gate: RequestHandler = deps.forecastGate ?? ((_req, _res, next) => next());
  const grids = createGridCache();
  const latestReads = orgReadCache<Forecast>();

  const siteOr404 = async (orgId: string, siteId: string) => {
    const site = await findSite(db, orgId, siteId);
    if (!site) throw new AppError('not_found', 'No such site in this organisation.');
    return site;
  };

  router.get('/sites/:siteId/watch', readers, validate({ params: siteParams }), async (req, res) => {
    await siteOr404(req.membership!.organisationId, String(req.params.siteId));
    const rows = await db.selectFrom('site_organisms').select('profile_id').where('site_id', '=', String(req.params.siteId)).execute();
    res.json({ profileIds: rows.map((r) => r.profile_id) });
  });
  router.put('/sites/:siteId/watch', managers, validate({ params: siteParams, body: watchSchema }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const siteId = String(req.params.siteId);
    await siteOr404(orgId, siteId);
    const ids: string[] = req.body.profileIds;
    await db.transaction().execute(async (trx) => {
      const owned = ids.length ? await trx.selectFrom('organism_profiles').select('id').where('organisation_id', '=', orgId).where('id', 'in', ids).execute() : [];
      if (owned.length !== new Set(ids).size) throw new AppError('validation_failed', 'profileIds: every id must be an organism profile of this organisation.');
      await trx.deleteFrom('site_organisms').where('site_id', '=', siteId).execute();
      if (ids.length) await trx.insertInto('site_organisms').values([...new Set(ids)].map((profile_id) => ({ site_id: siteId, profile_id }))).execute();
      await recordAudit(trx, { organisationId: orgId, actorUserId: req.user!.id, action: 'site.watch_changed', subject: siteId, details: { profileIds: ids } });
    });
    res.json({ profileIds: ids });
  });

  router.get('/sites/:siteId/forecasts/latest', readers, gate, validate({ params: siteParams, query: latestQuery }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const { profileId } = req.query as z.infer<typeof latestQuery>;
    const siteId = String(req.params.siteId);
    const latest = await latestReads(orgId, `latest/${siteId}/${profileId}`, async () => {
      const row = await repo.latestForecast(db, orgId, siteId, profileId);
      if (!row) throw new AppError('not_found', 'No forecast yet for this site and organism. Managers can start one with "Run now".');
      return repo.toForecastDto(row, orgId);
    });
    res.json(latest);
  });
  router.get('/forecasts/:forecastId', readers, gate, validate({ params: forecastParams }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const row = await repo.findForecast(db, orgId, String(req.params.forecastId));
    if (!row) throw new AppError('not_found', 'No such forecast in this organisation.');
    res.json(repo.toForecastDto(row, orgId));
  });
  router.get('/forecasts/:forecastId/grid', readers, gate, validate({ params: forecastParams }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const forecastId = String(req.params.forecastId);
    // A forecast's grid never changes: its id is its validator, and a browser that has it gets 304.
    res.set({ ETag: `"grid-${forecastId}"`, 'Cache-Control': 'private, max-age=86400, immutable' });
    if (req.fresh && (grids.has(orgId, forecastId) || (await repo.forecastExists(db, orgId, forecastId)))) {
      res.status(304).end();
      return;
    }
    const grid = await grids.get(orgId, forecastId, () => repo.forecastGrid(db, orgId, forecastId));
    if (!grid) throw new AppError('not_found', 'No such forecast in this organisation.');
    // Stored gzip-compressed: sent as is, and the browser unpacks it.
    res.set({ 'Content-Type': 'application/octet-stream', 'Content-Encoding': 'gzip' });
    res.send(grid);
  });
  router.get('/forecasts/:forecastId/download.csv', readers, gate, validate({ params: forecastParams }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const row = await repo.findForecast(db, orgId, String(req.params.forecastId));
    const stored = row && (await repo.forecastGrid(db, orgId, row.id));
    if (!row || !stored) throw new AppError('not_found', 'No such forecast in this organisation.');
    const grid = decodeGrid(gunzipSync(stored));
    const zone = (row.inputs as { site: { timeZone: string } }).site.timeZone;
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="forecast-${row.id}.csv"` });
    for (const chunk of forecastCsvLines(grid, zone)) res.write(chunk);
    res.end();
  });
  router.get('/forecasts/:forecastId/download.json', readers, gate, validate({ params: forecastParams }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const row = await repo.findForecast(db, orgId, String(req.params.forecastId));
    const stored = row && (await repo.forecastGrid(db, orgId, row.id));
    if (!row || !stored) throw new AppError('not_found', 'No such forecast in this organisation.');
    const grid = decodeGrid(gunzipSync(stored));
    const { concentration, speed, diffusivity, depthM, depthMeanAlong, bedStressPa, ...shape } = grid;
    res.set('Content-Disposition', `attachment; filename="forecast-${row.id}.json"`);
    res.json({
      ...repo.toForecastDto(row, orgId),
      grid: {
        ...shape,
        depthMBelowSurface: Array.from(depthM),
        depthMeanAlongMPerS: Array.from(depthMeanAlong),
        bedStressPa: Array.from(bedStressPa),
        concentrationCellsPerL: Array.from(concentration),
        currentSpeedMPerS: Array.from(speed),
        eddyDiffusivityM2PerS: Array.from(diffusivity),
      },
    });
  });

  router.get('/sites/:siteId/runs', managers, validate({ params: siteParams }), async (req, res) => {
    await siteOr404(req.membership!.organisationId, String(req.params.siteId));
    res.json({ runs: await repo.listRuns(db, req.membership!.organisationId, String(req.params.siteId)) });
  });
  router.post('/sites/:siteId/runs', managers, gate, validate({ params: siteParams, body: runNowSchema }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const siteId = String(req.params.siteId);
    await siteOr404(orgId, siteId);
    if (!deps.boss || !deps.tides) throw new AppError('service_unavailable', 'Forecast workers are not running here. Try again later.');
    const start = Math.floor(Date.now() / RUN_NOW_STEP_MS) * RUN_NOW_STEP_MS;
    const ids = await prepareSiteRuns(
      { db, boss: deps.boss, tides: deps.tides },
      { organisationId: orgId, siteId, forecastStartMs: start, trigger: 'manual', requestedBy: req.user!.id, profileVersionIds: req.body.profileVersionIds, horizonDays: req.body.horizonDays },
    );
    if (ids.length === 0) throw new AppError('validation_failed', 'The site watches no organism yet. Choose the organisms to forecast first.');
    const runs = (await repo.listRuns(db, orgId, siteId)).filter((r) => ids.includes(r.id));
    res.status(202).json({ runs });
  });
  return router;
}
