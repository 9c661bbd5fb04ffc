import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import {
  constituentTableFieldsSchema,
  feedFetchInputSchema,
  manualSetInputSchema,
  previewQuerySchema,
  recordFieldsSchema,
  type FeedFetchInput,
  type ManualSetInput,
} from '../../shared/schemas/tides.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import { AppError } from '../http/app-error.ts';
import { csvText, csvUpload } from '../http/csv-upload.ts';
import { validate } from '../http/validate.ts';
import { parseConstituentTable, parseRecord } from './tide-csv.ts';
import { previewSet } from './tide-preview.ts';
import { analyseRecord } from './tide-record-analysis.ts';
import * as repo from './tides.repository.ts';
import * as service from './tides.service.ts';
import type { FeedRefreshDeps } from './tides.service.ts';

/** Deps of the site tides area: the database, and the tide feed client with its retry policy. */
export interface TidesDeps extends FeedRefreshDeps {
  /** Largest CSV accepted, bytes. Default 8 MB. */
  maxUploadBytes?: number;
}

const siteParams = z.object({ orgId: z.uuid(), siteId: z.uuid() });
const setParams = siteParams.extend({ setId: z.uuid() });

const HOUR_MS = 3_600_000;

/** /api/orgs/:orgId/sites/:siteId/tides: everyone in the organisation reads; owners and managers change. */
export function siteTideRoutes(deps: TidesDeps): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const editors = requireMember(db, ['owner', 'manager']);
  const upload = csvUpload({ maxBytes: deps.maxUploadBytes ?? 8_000_000, fields: 20, fieldSize: 2000, tooLarge: 'Split the record into shorter spans or thin it.' });
  // The site must belong to the caller's organisation (404 otherwise), checked before any upload is read.
  const site: RequestHandler = async (req, _res, next) => {
    const found = await repo.findTideSite(db, req.membership!.organisationId, String(req.params.siteId));
    next(found ? undefined : new AppError('not_found', 'No such site in this organisation.'));
  };
  const ids = (req: { params: Record<string, unknown>; membership?: { organisationId: string } }) => ({
    orgId: req.membership!.organisationId,
    siteId: String(req.params.siteId),
  });

  router.get('/sets', readers, validate({ params: siteParams }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    res.json(await service.listSets(db, orgId, siteId));
  });

  router.post('/sets', editors, validate({ params: siteParams, body: manualSetInputSchema }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    const input = req.body as ManualSetInput;
    const created = await service.createSet(db, req.user!, orgId, siteId, { source: 'manual', current: input.current, level: input.level, label: input.label, activate: input.activate });
    res.status(201).json(created.set);
  });

  router.get('/sets/:setId', readers, validate({ params: setParams }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    res.json(await service.getSet(db, orgId, siteId, String(req.params.setId)));
  });

  router.post('/sets/:setId/activate', editors, validate({ params: setParams }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    res.json(await service.activateSet(db, req.user!, orgId, siteId, String(req.params.setId)));
  });

  router.get('/active', readers, validate({ params: siteParams }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    res.json({ set: await service.getActiveSetOfSite(db, orgId, siteId) });
  });

  router.get('/preview', readers, validate({ params: siteParams, query: previewQuerySchema }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    const query = req.query as unknown as z.infer<typeof previewQuerySchema>;
    const set = await service.getActiveSetOfSite(db, orgId, siteId);
    if (!set) {
      res.json({ preview: null });
      return;
    }
    // Default start: the current hour.
    const startMs = query.start ? Date.parse(query.start) : Math.floor(Date.now() / HOUR_MS) * HOUR_MS;
    res.json({ preview: previewSet(set, startMs, query.days, query.stepMinutes) });
  });

  router.get('/feed/stations', readers, validate({ params: siteParams }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    res.json(await service.findFeedStations(deps, orgId, siteId));
  });

  router.post('/feed/fetch', editors, validate({ params: siteParams, body: feedFetchInputSchema }), site, async (req, res) => {
    const { orgId, siteId } = ids(req);
    const input = req.body as FeedFetchInput;
    const result = await service.refreshSiteTidesFromFeed(deps, orgId, siteId, req.user!, input);
    res.status(result.outcome === 'created' ? 201 : 200).json(result);
  });

  router.get('/feed/refreshes', readers, validate({ params: siteParams }), site, async (req, res) => {
    const { siteId } = ids(req);
    res.json({ refreshes: await repo.listRefreshes(db, siteId) });
  });

  router.post('/uploads/constituents', editors, validate({ params: siteParams }), site, upload, async (req, res) => {
    const { orgId, siteId } = ids(req);
    const { text, fileName } = csvText(req);
    const fields = parseFields(constituentTableFieldsSchema, req.body);
    const table = parseConstituentTable(text, fields);
    const created = await service.createSet(db, req.user!, orgId, siteId, {
      source: 'upload',
      current: table.current,
      level: table.level,
      label: fields.label ?? fileName,
      activate: fields.activate === 'true',
    });
    res.status(201).json(created.set);
  });

  router.post('/analyses', editors, validate({ params: siteParams }), site, upload, async (req, res) => {
    const { text, fileName } = csvText(req);
    const fields = parseFields(recordFieldsSchema, req.body);
    res.json(analyseRecord(parseRecord(text), fields, fileName));
  });

  router.post('/sets/from-record', editors, validate({ params: siteParams }), site, upload, async (req, res) => {
    const { orgId, siteId } = ids(req);
    const { text, fileName } = csvText(req);
    const fields = parseFields(recordFieldsSchema, req.body);
    const analysis = analyseRecord(parseRecord(text), fields, fileName);
    const created = await service.createSet(db, req.user!, orgId, siteId, {
      source: 'analysis',
      current: analysis.current,
      level: analysis.level,
      fit: analysis.fit,
      label: fields.label ?? fileName,
      activate: fields.activate === 'true',
    });
    res.status(201).json({ set: created.set, analysis });
  });

  return router;
}

/** Form fields of an upload, checked like a body. */
function parseFields<T extends z.ZodType>(schema: T, body: unknown): z.infer<T> {
  const parsed = schema.safeParse(body ?? {});
  if (parsed.success) return parsed.data;
  const details = parsed.error.issues.map((i) => ({ path: i.path.join('.'), row: null, column: null, message: i.message }));
  throw new AppError('validation_failed', `The form fields have problems: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}.`, details);
}
