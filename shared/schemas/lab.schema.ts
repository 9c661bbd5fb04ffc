/**
 * The zod contracts of the lab API (/api/orgs/:orgId/lab/...): lab results, their uploads, the
 * taxon → organism profile mapping, the comparison with forecasts and calibrations. Units: cells/L,
 * depths in m below the surface, times ISO-8601 UTC.
 */
import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';
import { organismParamsSchema } from './organism.schema.ts';
import { uploadProblemSchema } from './tides.schema.ts';

export { uploadProblemSchema };
export type { UploadProblem } from './tides.schema.ts';

export const samplingMethodSchema = z.enum(['hose', 'bottle'], { error: 'method must be hose or bottle' });
export type SamplingMethod = z.infer<typeof samplingMethodSchema>;

const depth = z.number({ error: 'must be a depth in m below the surface' }).min(0, 'must be ≥ 0 m (depths are positive down from the surface)').max(12000, 'must be at most 12000 m');
const cells = z.number({ error: 'must be a number of cells per litre' }).min(0, 'must be ≥ 0 cells/L').max(1e12, 'must be at most 1e12 cells/L');

/** One result entered by hand. A bottle has one depth (depthBottomM omitted or equal); a hose a range. */
export const labResultInputSchema = z
  .object({
    siteId: uuidSchema,
    sampleId: z.string().trim().min(1, 'the sample id is required').max(100, 'the sample id must be at most 100 characters'),
    sampledAt: z.iso.datetime({ offset: true, error: 'must be an ISO-8601 time with its zone offset, e.g. 2026-12-01T10:20:00+01:00' }),
    depthTopM: depth,
    depthBottomM: depth.optional(),
    method: samplingMethodSchema,
    taxon: z.string().trim().min(1, 'the taxon is required').max(200),
    cellsPerL: cells,
    detectionLimit: z.number({ error: 'must be a number of cells per litre' }).positive('must be above 0 cells/L').max(1e12),
    analyst: z.string().trim().max(120).nullish(),
    lab: z.string().trim().max(120).nullish(),
  })
  .superRefine((r, ctx) => {
    const bottom = r.depthBottomM ?? r.depthTopM;
    if (bottom < r.depthTopM) ctx.addIssue({ code: 'custom', path: ['depthBottomM'], message: 'the bottom of the range must be at or below its top' });
    if (r.method === 'bottle' && bottom !== r.depthTopM) ctx.addIssue({ code: 'custom', path: ['depthBottomM'], message: 'a bottle samples one depth; leave the bottom empty or choose hose' });
    if (r.method === 'hose' && !(bottom > r.depthTopM)) ctx.addIssue({ code: 'custom', path: ['depthBottomM'], message: 'a hose sample covers a depth range; give the bottom of the range below its top' });
  });
export type LabResultInput = z.infer<typeof labResultInputSchema>;

export const labResultSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  siteName: z.string(),
  sampleId: z.string(),
  sampledAt: isoDateTimeSchema,
  depthTopM: z.number(),
  depthBottomM: z.number(),
  method: samplingMethodSchema,
  taxon: z.string(),
  cellsPerL: z.number(),
  detectionLimit: z.number(),
  belowDetection: z.boolean(),
  analyst: z.string().nullable(),
  lab: z.string().nullable(),
  uploadId: uuidSchema,
  fileName: z.string().nullable(),
  createdAt: isoDateTimeSchema,
  createdBy: z.string().nullable(),
});
export type LabResult = z.infer<typeof labResultSchema>;
export const labResultListSchema = z.object({ results: z.array(labResultSchema) });

export const labResultsQuerySchema = z.object({
  siteId: uuidSchema.optional(),
  taxon: z.string().trim().min(1).max(200).optional(),
});

/** The fields of a lab result that a file's columns are mapped to. */
export const LAB_FIELDS = ['sampleId', 'site', 'sampledAt', 'zone', 'depthM', 'depthTopM', 'depthBottomM', 'method', 'taxon', 'cellsPerL', 'detectionLimit', 'analyst', 'lab'] as const;
export type LabField = (typeof LAB_FIELDS)[number];

export const LAB_FIELD_LABELS: Record<LabField, string> = {
  sampleId: 'Sample id',
  site: 'Site (name or id)',
  sampledAt: 'Time sampled (with zone)',
  zone: 'Time zone (if not in the time)',
  depthM: 'Depth or range (m, e.g. 5 or 0-10)',
  depthTopM: 'Top of range (m)',
  depthBottomM: 'Bottom of range (m)',
  method: 'Method (hose or bottle)',
  taxon: 'Taxon',
  cellsPerL: 'Cells per litre',
  detectionLimit: 'Detection limit (cells/L)',
  analyst: 'Analyst',
  lab: 'Laboratory',
};

/** Field → the file's column name (as written in its header). Unmapped fields are left out. */
export const columnMappingSchema = z.partialRecord(z.enum(LAB_FIELDS), z.string().trim().min(1).max(200));
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

export const uploadPreviewSchema = z.object({
  fileName: z.string(),
  columns: z.array(z.string()),
  /** The mapping found from the column names. */
  suggestedMapping: columnMappingSchema,
  /** The mapping the preview used (the one sent, else the suggested one). */
  mapping: columnMappingSchema,
  rowCount: z.number().int(),
  /** The first rows, each with its values by field and its problems. */
  rows: z.array(z.object({ row: z.number().int(), values: z.record(z.string(), z.string()), problems: z.array(uploadProblemSchema) })),
  /** Problems of the whole file or of columns (missing, unknown). */
  fileProblems: z.array(uploadProblemSchema),
  /** Rows with at least one problem, in the whole file. */
  rowsWithProblems: z.number().int(),
});
export type UploadPreview = z.infer<typeof uploadPreviewSchema>;

export const uploadResultSchema = z.object({ uploadId: uuidSchema, fileName: z.string(), imported: z.number().int() });
export type UploadResult = z.infer<typeof uploadResultSchema>;

export const taxonMappingListSchema = z.object({
  taxa: z.array(z.object({ taxon: z.string(), profileId: uuidSchema.nullable(), resultCount: z.number().int() })),
});
export type TaxonMappingList = z.infer<typeof taxonMappingListSchema>;
export const taxonMappingInputSchema = z.object({
  mappings: z.array(z.object({ taxon: z.string().trim().min(1, 'the taxon is required').max(200), profileId: uuidSchema.nullable() })).max(500),
});

export const skillSchema = z.object({ n: z.number().int(), bias: z.number().nullable(), rmse: z.number().nullable(), correlation: z.number().nullable() });
export type SkillDto = z.infer<typeof skillSchema>;

export const comparisonQuerySchema = z.object({ profileId: uuidSchema, siteId: uuidSchema.optional() });

export const comparisonPairSchema = z.object({
  resultId: uuidSchema,
  sampleId: z.string(),
  siteId: uuidSchema,
  siteName: z.string(),
  sampledAt: isoDateTimeSchema,
  method: samplingMethodSchema,
  depthTopM: z.number(),
  depthBottomM: z.number(),
  taxon: z.string(),
  observed: z.number(),
  detectionLimit: z.number(),
  belowDetection: z.boolean(),
  /** Null when no forecast of the site and profile covers the sample time. */
  forecast: z.number().nullable(),
  forecastId: uuidSchema.nullable(),
  profileVersionId: uuidSchema.nullable(),
  version: z.number().int().nullable(),
  /** The forecast was made after the sample was taken (no earlier one covered it). */
  forecastMadeAfterSample: z.boolean(),
});
export type ComparisonPair = z.infer<typeof comparisonPairSchema>;

export const comparisonSchema = z.object({
  profile: z.object({ id: uuidSchema, name: z.string(), taxon: z.string() }),
  taxa: z.array(z.string()),
  pairs: z.array(comparisonPairSchema),
  byVersion: z.array(z.object({ profileVersionId: uuidSchema, version: z.number().int(), skill: skillSchema })),
  overall: skillSchema,
  /** How values below the detection limit were handled. */
  censoring: z.string(),
});
export type Comparison = z.infer<typeof comparisonSchema>;

export const calibrationStatusSchema = z.enum(['queued', 'running', 'done', 'failed', 'accepted', 'discarded']);
export type CalibrationStatus = z.infer<typeof calibrationStatusSchema>;

export const calibrationInputSchema = z
  .object({
    profileVersionId: uuidSchema,
    siteId: uuidSchema,
    fitGrowth: z.boolean().default(false),
    /** Results sampled from (inclusive) and to (inclusive); default: all of the site's results of the taxa. */
    from: isoDateTimeSchema.optional(),
    to: isoDateTimeSchema.optional(),
  })
  .refine((c) => !c.from || !c.to || Date.parse(c.from) < Date.parse(c.to), { error: 'from must be before to', path: ['to'] });
export type CalibrationInput = z.infer<typeof calibrationInputSchema>;

export const calibrationResultSchema = z.object({
  samples: z.number().int(),
  periodStart: isoDateTimeSchema,
  periodEnd: isoDateTimeSchema,
  evaluations: z.number().int(),
  bounds: z.object({ settlingVelocityMPerDay: z.tuple([z.number(), z.number()]), mortalityPerDay: z.tuple([z.number(), z.number()]).nullable() }),
  fitted: z.object({ settlingVelocityMPerDay: z.number(), mortalityPerDay: z.number().nullable() }),
  /** Parameters that ended at a bound: the best fit may lie outside what was searched. */
  atBound: z.array(z.string()),
  before: skillSchema,
  after: skillSchema,
  proposedParams: organismParamsSchema,
});
export type CalibrationResult = z.infer<typeof calibrationResultSchema>;

export const calibrationSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  siteName: z.string(),
  profileId: uuidSchema,
  profileName: z.string(),
  profileVersionId: uuidSchema,
  version: z.number().int(),
  fitGrowth: z.boolean(),
  status: calibrationStatusSchema,
  progress: z.number(),
  error: z.string().nullable(),
  result: calibrationResultSchema.nullable(),
  acceptedVersionId: uuidSchema.nullable(),
  createdAt: isoDateTimeSchema,
  finishedAt: isoDateTimeSchema.nullable(),
});
export type Calibration = z.infer<typeof calibrationSchema>;
export const calibrationListSchema = z.object({ calibrations: z.array(calibrationSchema) });

/** The answer to accepting a calibration: the calibration and the profile version it made. */
export const calibrationDecisionSchema = z.object({ calibration: calibrationSchema, versionId: uuidSchema, version: z.number().int() });
