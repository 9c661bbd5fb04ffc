import { z } from 'zod';
import { dayAdviceSchema } from '../forecast/advice.ts';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';

export const windowSchema = z.object({
  kind: z.enum(['slack', 'slump', 'mixed', 'subsurface_peak']),
  startMs: z.number(),
  endMs: z.number(),
  peakMs: z.number(),
  strength: z.number(),
  peakValue: z.number(),
  peakDepthM: z.number().optional(),
  tideStage: z.enum(['before_flood', 'before_ebb']).optional(),
  clipped: z.boolean(),
});
export type ForecastWindowDto = z.infer<typeof windowSchema>;

export const runStatusSchema = z.enum(['queued', 'running', 'done', 'failed']);

export const forecastRunSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  profileVersionId: uuidSchema,
  profileName: z.string(),
  forecastStart: isoDateTimeSchema,
  trigger: z.enum(['schedule', 'manual']),
  status: runStatusSchema,
  progress: z.number(),
  attempts: z.number(),
  error: z.string().nullable(),
  createdAt: isoDateTimeSchema,
  finishedAt: isoDateTimeSchema.nullable(),
  forecastId: uuidSchema.nullable(),
});
export type ForecastRun = z.infer<typeof forecastRunSchema>;
export const forecastRunListSchema = z.object({ runs: z.array(forecastRunSchema) });

/** What went into a forecast, shown beside it. */
export const forecastInputsSchema = z.object({
  site: z.object({ name: z.string(), waterDepthM: z.number(), gearTopM: z.number(), gearBottomM: z.number(), timeZone: z.string(), bedRoughnessM: z.number() }),
  profile: z.object({ name: z.string(), taxon: z.string(), version: z.number(), triggerCellsPerL: z.number() }),
  tides: z.object({ setId: z.string().nullable(), version: z.number().nullable(), source: z.string(), madeAt: isoDateTimeSchema.nullable(), note: z.string().nullable() }),
  engineVersion: z.string(),
  layers: z.number(),
  timeStepS: z.number(),
});

export const forecastSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  profileVersionId: uuidSchema,
  forecastStart: isoDateTimeSchema,
  horizonDays: z.number(),
  createdAt: isoDateTimeSchema,
  inputs: forecastInputsSchema,
  windows: z.array(windowSchema),
  advice: z.array(dayAdviceSchema),
  tideNote: z.string().nullable(),
  gridUrl: z.string(),
});
export type Forecast = z.infer<typeof forecastSchema>;

export const runNowSchema = z.object({
  profileVersionIds: z.array(uuidSchema).min(1).optional(),
  horizonDays: z.number().int().min(3).max(7).optional(),
});

export const alertSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  siteName: z.string(),
  kind: z.string(),
  message: z.string(),
  startsAt: isoDateTimeSchema.nullable(),
  createdAt: isoDateTimeSchema,
  acknowledgedAt: isoDateTimeSchema.nullable(),
  acknowledgedBy: z.string().nullable(),
});
export const alertListSchema = z.object({ alerts: z.array(alertSchema) });

export const mailSettingsSchema = z.object({
  digestEnabled: z.boolean(),
  digestLocalTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be a time HH:MM'),
  timeZone: z.string(),
  alertsEnabled: z.boolean(),
});
export type MailSettings = z.infer<typeof mailSettingsSchema>;

export const watchSchema = z.object({ profileIds: z.array(uuidSchema).max(50) });
