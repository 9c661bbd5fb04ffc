import { Router, type Request, type RequestHandler } from 'express';
import { z } from 'zod';
import {
  calibrationInputSchema,
  columnMappingSchema,
  comparisonQuerySchema,
  labResultInputSchema,
  labResultsQuerySchema,
  taxonMappingInputSchema,
  type CalibrationInput,
  type ColumnMapping,
} from '../../shared/schemas/lab.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import { requireActiveSubscription } from '../billing/subscription-gate.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { csvText, csvUpload } from '../http/csv-upload.ts';
import { validate } from '../http/validate.ts';
import { acceptCalibration, discardCalibration, queueCalibration, runCalibration, toCalibrationDto, type CalibrationDeps } from './calibration.service.ts';
import { darwinCoreLines } from './darwin-core.ts';
import * as repo from './lab.repository.ts';
import * as service from './lab.service.ts';

/** Deps of the biologist's workbench area. */
export interface LabDeps {
  db: Db;
  /** Gate on what shows forecast output (comparison, calibration); default: the organisation's subscription. */
  forecastGate?: RequestHandler;
  /** 'in-process' (default): a queued calibration starts at once in this process; 'manual': the caller runs it (tests). */
  calibrationRunner?: 'in-process' | 'manual';
  /** Model resolution, bounds and search settings of calibrations. */
  calibration?: Omit<CalibrationDeps, 'db'>;
  /** Largest CSV accepted, bytes. Default 4 MB. */
  maxUploadBytes?: number;
}

const orgParams = z.object({ orgId: z.uuid() });
const calibrationParams = z.object({ orgId: z.uuid(), calibrationId: z.uuid() });

/** The form field "mapping": JSON of field → column name; absent means the suggested mapping. */
function mappingField(body: unknown): ColumnMapping | null {
  const raw = body && typeof body === 'object' && 'mapping' in body ? (body as { mapping: unknown }).mapping : undefined;
  if (raw === undefined || raw === '') return null;
  let json: unknown;
  try {
    json = JSON.parse(String(raw));
  } catch {
    throw new AppError('validation_failed', 'The form field "mapping" is not JSON; send an object of field → column name, e.g. {"cellsPerL":"Cells/L"}.');
  }
  const parsed = columnMappingSchema.safeParse(json);
  if (!parsed.success) {
    const details = parsed.error.issues.map((i) => ({ path: `mapping.${i.path.join('.')}`, row: null, column: null, message: i.message }));
    throw new AppError('validation_failed', `The column mapping has problems: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}.`, details);
  }
  return parsed.data;
}

/** /api/orgs/:orgId/lab/...: everyone in the organisation reads; owners, managers and biologists change. */
export function labRoutes(deps: LabDeps): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const scientists = requireMember(db, ['owner', 'manager', 'biologist']);
  const gate = deps.forecastGate ?? requireActiveSubscription(db);
  const upload = csvUpload({ maxBytes: deps.maxUploadBytes ?? 4_000_000, fields: 10, fieldSize: 20_000, tooLarge: 'Split it into smaller files.' });
  const calibrationDeps: CalibrationDeps = {
    db,
    ...deps.calibration,
    onError: deps.calibration?.onError ?? ((error, id) => console.error(`Calibration ${id} failed to run:`, error)),
  };
  const orgOf = (req: Request) => req.membership!.organisationId;

  router.post('/lab/uploads/preview', scientists, validate({ params: orgParams }), upload, async (req, res) => {
    const { text, fileName } = csvText(req, 'the lab\'s CSV file');
    res.json(await service.previewUpload(db, orgOf(req), fileName, text, mappingField(req.body)));
  });

  router.post('/lab/uploads', scientists, validate({ params: orgParams }), upload, async (req, res) => {
    const { text, fileName } = csvText(req, 'the lab\'s CSV file');
    res.status(201).json(await service.importUpload(db, req.user!, orgOf(req), fileName, text, mappingField(req.body)));
  });

  router.post('/lab/results', scientists, validate({ params: orgParams, body: labResultInputSchema }), async (req, res) => {
    res.status(201).json(await service.addResult(db, req.user!, orgOf(req), req.body));
  });

  router.get('/lab/results', readers, validate({ params: orgParams, query: labResultsQuerySchema }), async (req, res) => {
    const query = req.query as z.infer<typeof labResultsQuerySchema>;
    const rows = await repo.listResults(db, orgOf(req), { siteId: query.siteId, taxa: query.taxon ? [query.taxon] : undefined });
    res.json({ results: rows.map(repo.toResultDto) });
  });

  router.get('/lab/results/export.csv', readers, validate({ params: orgParams, query: labResultsQuerySchema }), async (req, res) => {
    const query = req.query as z.infer<typeof labResultsQuerySchema>;
    const rows = await repo.listResults(db, orgOf(req), { siteId: query.siteId, taxa: query.taxon ? [query.taxon] : undefined });
    res.set({ 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': 'attachment; filename="lab-results-darwin-core.csv"' });
    for (const line of darwinCoreLines(rows)) res.write(line);
    res.end();
  });

  router.get('/lab/taxa', readers, validate({ params: orgParams }), async (req, res) => {
    res.json({ taxa: await repo.listTaxa(db, orgOf(req)) });
  });

  router.put('/lab/taxa', scientists, validate({ params: orgParams, body: taxonMappingInputSchema }), async (req, res) => {
    res.json(await service.setTaxonMappings(db, req.user!, orgOf(req), req.body.mappings));
  });

  router.get('/lab/comparison', readers, gate, validate({ params: orgParams, query: comparisonQuerySchema }), async (req, res) => {
    const query = req.query as z.infer<typeof comparisonQuerySchema>;
    res.json(await service.compare(db, orgOf(req), query.profileId, query.siteId));
  });

  router.post('/lab/calibrations', scientists, gate, validate({ params: orgParams, body: calibrationInputSchema }), async (req, res) => {
    const calibration = await queueCalibration(db, req.user!, orgOf(req), req.body as CalibrationInput);
    if ((deps.calibrationRunner ?? 'in-process') === 'in-process') {
      setImmediate(() => void runCalibration(calibrationDeps, calibration.id).catch((error: unknown) => calibrationDeps.onError?.(error, calibration.id)));
    }
    res.status(202).json(calibration);
  });

  router.get('/lab/calibrations', readers, validate({ params: orgParams }), async (req, res) => {
    res.json({ calibrations: (await repo.listCalibrations(db, orgOf(req))).map(toCalibrationDto) });
  });

  router.get('/lab/calibrations/:calibrationId', readers, validate({ params: calibrationParams }), async (req, res) => {
    const row = await repo.findCalibration(db, orgOf(req), String(req.params.calibrationId));
    if (!row) throw new AppError('not_found', 'No such calibration in this organisation.');
    res.json(toCalibrationDto(row));
  });

  router.post('/lab/calibrations/:calibrationId/accept', scientists, validate({ params: calibrationParams }), async (req, res) => {
    res.json(await acceptCalibration(db, req.user!, orgOf(req), String(req.params.calibrationId)));
  });

  router.post('/lab/calibrations/:calibrationId/discard', scientists, validate({ params: calibrationParams }), async (req, res) => {
    res.json(await discardCalibration(db, req.user!, orgOf(req), String(req.params.calibrationId)));
  });

  return router;
}
