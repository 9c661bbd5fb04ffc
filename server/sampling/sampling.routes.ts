import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import {
  forecastSettingsSchema,
  fromAdviceInputSchema,
  sampleInputSchema,
  sampleListQuerySchema,
  sampleUpdateSchema,
  takenInputSchema,
  type Overview,
  type SampleListQuery,
} from '../../shared/schemas/sampling.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import { requireActiveSubscription } from '../billing/subscription-gate.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { orgReadCache } from '../http/org-read-cache.ts';
import { validate } from '../http/validate.ts';
import { overview } from './overview.service.ts';
import { samplesCalendar, samplesCsv } from './sample-exports.ts';
import * as repo from './sampling.repository.ts';
import * as service from './sampling.service.ts';

/** Deps of the sampling-plan area. */
export interface SamplingDeps {
  db: Db;
  /** Gate on routes that read forecast content (advice); default: an active or trialing subscription. */
  forecastGate?: RequestHandler;
}

const siteParams = z.object({ orgId: z.uuid(), siteId: z.uuid() });
const sampleParams = z.object({ orgId: z.uuid(), sampleId: z.uuid() });

/**
 * Routes under /api/orgs/:orgId: the sampling plan (everyone reads and marks samples taken; owners and
 * managers plan, change and delete), its calendar and CSV exports, the site's forecast settings and
 * the overview of every site.
 */
export function samplingRoutes(deps: SamplingDeps): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const managers = requireMember(db, ['owner', 'manager']);
  const gate = deps.forecastGate ?? requireActiveSubscription(db);
  const orgOf = (req: { membership?: { organisationId: string } }) => req.membership!.organisationId;

  const overviews = orgReadCache<Overview>();
  router.get('/overview', readers, async (req, res) => {
    const organisationId = orgOf(req);
    res.json(await overviews(organisationId, 'overview', () => overview(db, organisationId)));
  });

  router.get('/samples', readers, validate({ query: sampleListQuerySchema }), async (req, res) => {
    const rows = await repo.listSamples(db, orgOf(req), req.query as SampleListQuery);
    res.json({ samples: rows.map((r) => r.dto) });
  });
  router.get('/samples.ics', readers, validate({ query: sampleListQuerySchema }), async (req, res) => {
    const rows = await repo.listSamples(db, orgOf(req), req.query as SampleListQuery);
    const org = await db.selectFrom('organisations').select('name').where('id', '=', orgOf(req)).executeTakeFirstOrThrow();
    res.set({ 'Content-Type': 'text/calendar; charset=utf-8', 'Content-Disposition': 'attachment; filename="sampling-plan.ics"', 'Cache-Control': 'no-store' });
    res.send(samplesCalendar(rows, `Sampling plan: ${org.name}`));
  });
  router.get('/samples.csv', readers, validate({ query: sampleListQuerySchema }), async (req, res) => {
    const rows = await repo.listSamples(db, orgOf(req), req.query as SampleListQuery);
    res.set({ 'Content-Type': 'text/csv; charset=utf-8; header=present', 'Content-Disposition': 'attachment; filename="sampling-plan.csv"', 'Cache-Control': 'no-store' });
    res.send(samplesCsv(rows.map((r) => r.dto)));
  });
  router.get('/samples/:sampleId', readers, validate({ params: sampleParams }), async (req, res) => {
    const sample = await repo.findSample(db, orgOf(req), String(req.params.sampleId));
    if (!sample) throw new AppError('not_found', 'No such planned sample in this organisation.');
    res.json(sample);
  });
  router.post('/sites/:siteId/samples', managers, validate({ params: siteParams, body: sampleInputSchema }), async (req, res) => {
    res.status(201).json(await service.createSample(db, req.user!, orgOf(req), String(req.params.siteId), req.body));
  });
  router.post('/sites/:siteId/samples/from-advice', managers, gate, validate({ params: siteParams, body: fromAdviceInputSchema }), async (req, res) => {
    res.status(201).json(await service.addFromAdvice(db, req.user!, orgOf(req), String(req.params.siteId), req.body));
  });
  router.patch('/samples/:sampleId', managers, validate({ params: sampleParams, body: sampleUpdateSchema }), async (req, res) => {
    res.json(await service.updateSample(db, req.user!, orgOf(req), String(req.params.sampleId), req.body));
  });
  router.delete('/samples/:sampleId', managers, validate({ params: sampleParams }), async (req, res) => {
    await service.deleteSample(db, req.user!, orgOf(req), String(req.params.sampleId));
    res.status(204).end();
  });
  router.post('/samples/:sampleId/taken', readers, validate({ params: sampleParams, body: takenInputSchema }), async (req, res) => {
    res.json(await service.markTaken(db, req.user!, orgOf(req), String(req.params.sampleId), req.body));
  });

  router.get('/sites/:siteId/forecast-settings', readers, validate({ params: siteParams }), async (req, res) => {
    res.json(await service.getForecastSettings(db, orgOf(req), String(req.params.siteId)));
  });
  router.put('/sites/:siteId/forecast-settings', managers, validate({ params: siteParams, body: forecastSettingsSchema }), async (req, res) => {
    res.json(await service.putForecastSettings(db, req.user!, orgOf(req), String(req.params.siteId), req.body));
  });
  return router;
}
