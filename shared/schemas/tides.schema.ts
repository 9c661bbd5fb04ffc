/**
 * The zod contracts of the site tides API (/api/orgs/:orgId/sites/:siteId/tides), used by the
 * server and the client. Units: current amplitudes in m/s, levels in m, angles in degrees,
 * phases are Greenwich phase lags, times ISO-8601 UTC.
 */
import { z } from 'zod';
import { constituentIndex, resolveConstituentNames } from '../tides/constituents.ts';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';

export const CONSTITUENT_SOURCES = ['feed', 'upload', 'analysis', 'manual'] as const;
export const constituentSourceSchema = z.enum(CONSTITUENT_SOURCES);
export type ConstituentSource = z.infer<typeof constituentSourceSchema>;

export const setKindSchema = z.enum(['current', 'level', 'both']);
export type SetKind = z.infer<typeof setKindSchema>;

const constituentName = z
  .string()
  .trim()
  .refine((n) => constituentIndex(n) >= 0, { error: (issue) => `unknown constituent ${JSON.stringify(issue.input)} (not in the standard list)` });

const degrees = z.number({ error: 'must be a number of degrees' }).min(-360, 'must be between -360 and 360').max(360, 'must be between -360 and 360');

/** A constituent of the depth-mean current: a tidal ellipse (shared/tides/predict.ts CurrentConstituent). */
export const currentConstituentSchema = z
  .object({
    name: constituentName,
    /** Semi-major axis, m/s. */
    major: z.number({ error: 'must be a speed in m/s' }).min(0, 'must be ≥ 0').max(10, 'must be at most 10 m/s'),
    phaseDeg: degrees,
    /** Signed semi-minor axis, m/s; positive turns anticlockwise. */
    minor: z.number().min(-10).max(10).optional(),
    /** Direction of the major axis, degrees anticlockwise from east. */
    inclinationDeg: degrees.optional(),
  })
  .refine((c) => c.minor === undefined || Math.abs(c.minor) <= c.major, { error: 'the minor axis must not be longer than the major axis', path: ['minor'] });
export type CurrentConstituentDto = z.infer<typeof currentConstituentSchema>;

/** A constituent of the water level (shared/tides/predict.ts LevelConstituent). */
export const levelConstituentSchema = z.object({
  name: constituentName,
  /** Amplitude, m. */
  amplitude: z.number({ error: 'must be a height in m' }).min(0, 'must be ≥ 0').max(20, 'must be at most 20 m'),
  phaseDeg: degrees,
});
export type LevelConstituentDto = z.infer<typeof levelConstituentSchema>;

function uniqueNames(list: { name: string }[], ctx: z.core.$RefinementCtx<unknown>) {
  const resolved = resolveConstituentNames(list.map((c) => c.name));
  if (!resolved.ok && resolved.code === 'duplicate-constituent') ctx.addIssue({ code: 'custom', message: resolved.message });
}

export const currentPartSchema = z.object({
  /** Main axis of the site current, degrees anticlockwise from east; positive along it is the flood. Null: along-axis only. */
  axisDeg: degrees.nullable(),
  constituents: z.array(currentConstituentSchema).min(1, 'give at least one constituent').superRefine(uniqueNames),
});
export type CurrentPart = z.infer<typeof currentPartSchema>;

export const levelPartSchema = z.object({
  /** Mean level above the chart datum, m. */
  datumM: z.number().min(-100).max(100),
  constituents: z.array(levelConstituentSchema).min(1, 'give at least one constituent').superRefine(uniqueNames),
});
export type LevelPart = z.infer<typeof levelPartSchema>;

/** Statistics of the record a set was fitted to (source "analysis"). */
export const setFitSchema = z.object({
  recordKind: z.enum(['current', 'level']),
  fileName: z.string().nullable(),
  samples: z.number(),
  validSamples: z.number(),
  spanHours: z.number(),
  sampleIntervalMinutes: z.number(),
  missingFraction: z.number(),
  varianceExplained: z.number(),
  /** Root-mean-square residual: m/s for a current (east and north combined), m for a level. */
  residualRms: z.number(),
  uncertainties: z.array(z.object({ name: z.string(), amplitudeSe: z.number(), phaseSeDeg: z.number() })),
  dropped: z.array(z.object({ name: z.string(), reason: z.string() })),
});
export type SetFit = z.infer<typeof setFitSchema>;

export const constituentSetSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  version: z.number().int(),
  source: constituentSourceSchema,
  kind: setKindSchema,
  stationId: z.string().nullable(),
  stationName: z.string().nullable(),
  label: z.string().nullable(),
  notes: z.string().nullable(),
  current: currentPartSchema.nullable(),
  level: levelPartSchema.nullable(),
  fit: setFitSchema.nullable(),
  basedOnSetId: uuidSchema.nullable(),
  createdAt: isoDateTimeSchema,
  createdBy: z.object({ id: uuidSchema, displayName: z.string(), email: z.string() }).nullable(),
  active: z.boolean(),
});
export type ConstituentSet = z.infer<typeof constituentSetSchema>;

export const constituentSetListSchema = z.object({ activeSetId: uuidSchema.nullable(), sets: z.array(constituentSetSchema) });
export const activeSetSchema = z.object({ set: constituentSetSchema.nullable() });

/** A manual set: constituents typed in or pasted. At least one part. */
export const manualSetInputSchema = z
  .object({
    label: z.string().trim().max(200).nullable().default(null),
    current: currentPartSchema.nullable().default(null),
    level: levelPartSchema.nullable().default(null),
    activate: z.boolean().default(true),
  })
  .refine((v) => v.current !== null || v.level !== null, { error: 'give current or level constituents (or both)' });
export type ManualSetInput = z.infer<typeof manualSetInputSchema>;

// ---- Tide feed ----

export const feedStationSchema = z.object({
  id: z.string(),
  name: z.string(),
  latitudeDeg: z.number(),
  longitudeDeg: z.number(),
  distanceKm: z.number().nullable(),
  hasCurrent: z.boolean(),
  hasLevel: z.boolean(),
});
export type FeedStation = z.infer<typeof feedStationSchema>;

export const feedStationListSchema = z.object({
  chosenStationId: z.string().nullable(),
  stations: z.array(feedStationSchema),
});

export const feedFetchInputSchema = z.object({
  /** A station of the feed; omitted: the site's chosen station, else the nearest to the site. */
  stationId: z.string().trim().min(1).max(100).optional(),
  /** true: make the new set active; false: keep the active set; omitted: activate when no set or a feed set is active. */
  activate: z.boolean().optional(),
});
export type FeedFetchInput = z.infer<typeof feedFetchInputSchema>;

export const feedFetchResultSchema = z.object({
  outcome: z.enum(['created', 'unchanged']),
  attempts: z.number().int(),
  activated: z.boolean(),
  set: constituentSetSchema,
});
export type FeedFetchResult = z.infer<typeof feedFetchResultSchema>;

export const feedRefreshSchema = z.object({
  id: z.number(),
  stationId: z.string().nullable(),
  attempt: z.number().int(),
  attemptedAt: isoDateTimeSchema,
  ok: z.boolean(),
  errorCode: z.string().nullable(),
  errorMessage: z.string().nullable(),
  setId: uuidSchema.nullable(),
});
export const feedRefreshListSchema = z.object({ refreshes: z.array(feedRefreshSchema) });

// ---- Uploads ----

/** One problem of an uploaded CSV: where (row as numbered in the file, header = row 1; column) and what. */
export const uploadProblemSchema = z.object({
  path: z.string(),
  row: z.number().int().nullable(),
  column: z.string().nullable(),
  message: z.string(),
});
export type UploadProblem = z.infer<typeof uploadProblemSchema>;

/** Form fields that go with a constituent table upload (multipart, the CSV in field "file"). */
export const constituentTableFieldsSchema = z.object({
  kind: z.enum(['current', 'level']).optional(),
  datumM: z.coerce.number({ error: 'datumM must be a number of metres' }).min(-100).max(100).optional(),
  axisDeg: z.coerce.number({ error: 'axisDeg must be a number of degrees' }).min(-360).max(360).optional(),
  label: z.string().trim().max(200).optional(),
  activate: z.enum(['true', 'false']).default('true'),
});

/** Form fields that go with a record upload (multipart, the CSV in field "file"). */
export const recordFieldsSchema = z.object({
  /** Comma-separated constituent names to try; default the eleven main ones. */
  constituents: z.string().trim().max(500).optional(),
  rayleigh: z.coerce.number().min(0.1).max(5).optional(),
  label: z.string().trim().max(200).optional(),
  activate: z.enum(['true', 'false']).default('true'),
});

export const fittedRowSchema = z.object({
  name: z.string(),
  speedDegPerH: z.number(),
  /** Level amplitude (m) or semi-major axis (m/s). */
  amplitude: z.number(),
  amplitudeSe: z.number(),
  phaseDeg: z.number(),
  phaseSeDeg: z.number(),
  minor: z.number().nullable(),
  inclinationDeg: z.number().nullable(),
});

export const analysisResultSchema = z.object({
  kind: z.enum(['current', 'level']),
  fileName: z.string().nullable(),
  fit: setFitSchema,
  constituents: z.array(fittedRowSchema),
  current: currentPartSchema.nullable(),
  level: levelPartSchema.nullable(),
  /** Observed against predicted (along the main axis for a current, m/s; the level for a level, m), thinned for display. */
  series: z.object({
    quantity: z.string(),
    unit: z.string(),
    times: z.array(isoDateTimeSchema),
    observed: z.array(z.number().nullable()),
    predicted: z.array(z.number()),
    residual: z.array(z.number().nullable()),
  }),
});
export type AnalysisResult = z.infer<typeof analysisResultSchema>;

export const setFromRecordResultSchema = z.object({ set: constituentSetSchema, analysis: analysisResultSchema });

// ---- Preview ----

export const previewQuerySchema = z.object({
  start: isoDateTimeSchema.optional(),
  days: z.coerce.number().int().min(1).max(14).default(7),
  stepMinutes: z.coerce.number().int().min(1).max(60).default(10),
});

export const previewSchema = z.object({
  setId: uuidSchema,
  version: z.number().int(),
  start: isoDateTimeSchema,
  end: isoDateTimeSchema,
  stepMinutes: z.number(),
  times: z.array(isoDateTimeSchema),
  current: z
    .object({
      axisDeg: z.number().nullable(),
      /** Depth-mean current along the main axis, m/s, positive = flood. */
      along: z.array(z.number()),
      /** Depth-mean speed, m/s. */
      speed: z.array(z.number()),
      slacks: z.array(z.object({ time: isoDateTimeSchema, speed: z.number(), turnsTo: z.enum(['flood', 'ebb']) })),
    })
    .nullable(),
  level: z
    .object({
      datumM: z.number(),
      /** Level above the chart datum, m. */
      values: z.array(z.number()),
      highLow: z.array(z.object({ time: isoDateTimeSchema, levelM: z.number(), kind: z.enum(['high', 'low']) })),
    })
    .nullable(),
  formFactor: z.object({ value: z.number(), type: z.string(), of: z.enum(['current', 'level']) }).nullable(),
});
export type Preview = z.infer<typeof previewSchema>;
export const previewAnswerSchema = z.object({ preview: previewSchema.nullable() });
