/**
 * The zod contracts of the sampling-plan API (/api/orgs/:orgId/...samples, forecast-settings,
 * overview), used by the server and the client. Times are ISO-8601 UTC; depths are metres below
 * the surface.
 */
import { z } from 'zod';
import { windowSettingsSchema } from '../forecast/window-settings.ts';
import { windowSchema } from './forecast.schema.ts';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';

export const SAMPLE_METHODS = ['hose', 'bottle'] as const;
export const sampleMethodSchema = z.enum(SAMPLE_METHODS, { error: 'method must be "hose" (over a depth range) or "bottle" (at a depth)' });
export type SampleMethod = z.infer<typeof sampleMethodSchema>;

/** Which advice item a planned sample came from (null: planned by hand). */
export const ADVICE_KINDS = ['representative', 'near_bed', 'subsurface_peak', 'gear_band'] as const;
export const adviceKindSchema = z.enum(ADVICE_KINDS);
export type AdviceKind = z.infer<typeof adviceKindSchema>;

const depth = (label: string) =>
  z.number({ error: `${label} must be a number of metres below the surface` }).min(0, `${label} must be at least 0 m below the surface`).max(500, `${label} must be at most 500 m`);

const sampleFields = z.object({
  plannedAt: isoDateTimeSchema.describe('when, ISO-8601 with offset'),
  method: sampleMethodSchema,
  /** Bottle depth. */
  depthM: depth('depth').nullable().default(null),
  /** Hose range. */
  topM: depth('hose top').nullable().default(null),
  bottomM: depth('hose bottom').nullable().default(null),
  reason: z.string().trim().max(2000, 'reason must be at most 2000 characters').default(''),
});

type SampleShape = { method?: SampleMethod; depthM?: number | null; topM?: number | null; bottomM?: number | null };

/** A bottle has a depth and no range; a hose has a range (top above bottom) and no single depth. */
export function checkSampleShape(sample: SampleShape, ctx: z.core.$RefinementCtx<unknown>): void {
  if (sample.method === 'bottle') {
    if (sample.depthM == null) ctx.addIssue({ code: 'custom', path: ['depthM'], message: 'a bottle sample needs its depth (m below the surface)' });
    if (sample.topM != null || sample.bottomM != null) ctx.addIssue({ code: 'custom', path: ['topM'], message: 'a bottle sample has one depth, not a range' });
  }
  if (sample.method === 'hose') {
    if (sample.topM == null) ctx.addIssue({ code: 'custom', path: ['topM'], message: 'a hose sample needs the top of its range (m below the surface)' });
    if (sample.bottomM == null) ctx.addIssue({ code: 'custom', path: ['bottomM'], message: 'a hose sample needs the bottom of its range (m below the surface)' });
    if (sample.topM != null && sample.bottomM != null && !(sample.bottomM > sample.topM)) {
      ctx.addIssue({ code: 'custom', path: ['bottomM'], message: 'hose bottom must be deeper than hose top' });
    }
    if (sample.depthM != null) ctx.addIssue({ code: 'custom', path: ['depthM'], message: 'a hose sample has a range, not one depth' });
  }
}

export const sampleInputSchema = sampleFields.superRefine(checkSampleShape);
export type SampleInput = z.infer<typeof sampleInputSchema>;
export type SampleInputDraft = z.input<typeof sampleInputSchema>;

/** A partial edit; the merged sample is checked again by the server. */
export const sampleUpdateSchema = z
  .object({
    plannedAt: isoDateTimeSchema,
    method: sampleMethodSchema,
    depthM: depth('depth').nullable(),
    topM: depth('hose top').nullable(),
    bottomM: depth('hose bottom').nullable(),
    reason: z.string().trim().max(2000, 'reason must be at most 2000 characters'),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'send at least one field to change' });
export type SampleUpdate = z.infer<typeof sampleUpdateSchema>;
export const checkMergedSample = (sample: z.input<typeof sampleFields>) => sampleInputSchema.safeParse(sample);

export const takenInputSchema = z.object({
  /** When it was taken; default now. */
  takenAt: isoDateTimeSchema.optional(),
  notes: z.string().trim().max(2000, 'notes must be at most 2000 characters').default(''),
});
export type TakenInput = z.infer<typeof takenInputSchema>;

export const fromAdviceInputSchema = z.object({
  forecastId: uuidSchema,
  /** Site-local dates (yyyy-MM-dd) to take advice from; default every day of the forecast. */
  dates: z.array(z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'dates must be yyyy-MM-dd')).max(14).optional(),
});
export type FromAdviceInput = z.infer<typeof fromAdviceInputSchema>;

const person = z.object({ id: uuidSchema, displayName: z.string() });

export const plannedSampleSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  siteName: z.string(),
  timeZone: z.string(),
  plannedAt: isoDateTimeSchema,
  method: sampleMethodSchema,
  depthM: z.number().nullable(),
  topM: z.number().nullable(),
  bottomM: z.number().nullable(),
  reason: z.string(),
  forecastId: uuidSchema.nullable(),
  adviceKind: adviceKindSchema.nullable(),
  createdBy: person.nullable(),
  createdAt: isoDateTimeSchema,
  updatedAt: isoDateTimeSchema,
  takenAt: isoDateTimeSchema.nullable(),
  takenBy: person.nullable(),
  notes: z.string().nullable(),
});
export type PlannedSample = z.infer<typeof plannedSampleSchema>;
export const plannedSampleListSchema = z.object({ samples: z.array(plannedSampleSchema) });

export const sampleListQuerySchema = z.object({
  siteId: uuidSchema.optional(),
  from: isoDateTimeSchema.optional(),
  to: isoDateTimeSchema.optional(),
  status: z.enum(['planned', 'taken', 'all']).default('all'),
});
export type SampleListQuery = z.infer<typeof sampleListQuerySchema>;

export const forecastSettingsSchema = z.object({
  /** Site-local time of the daily forecast, HH:MM. */
  forecastLocalTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'forecast time must be HH:MM (24-hour clock)'),
  forecastHorizonDays: z
    .number({ error: 'horizon must be a whole number of days' })
    .int('horizon must be a whole number of days')
    .min(3, 'horizon must be at least 3 days')
    .max(7, 'horizon must be at most 7 days'),
  windowSettings: windowSettingsSchema,
});
export type ForecastSettings = z.infer<typeof forecastSettingsSchema>;
export type ForecastSettingsInput = z.input<typeof forecastSettingsSchema>;

/** The morning view: per site, the latest forecast of each watched organism around today and tomorrow. */
export const overviewForecastSchema = z.object({
  profileId: uuidSchema,
  profileName: z.string(),
  forecastId: uuidSchema,
  forecastStart: isoDateTimeSchema,
  createdAt: isoDateTimeSchema,
  horizonDays: z.number(),
  /** Windows touching today and tomorrow (site-local days). */
  windows: z.array(windowSchema),
  nextSlack: windowSchema.nullable(),
  nextSlump: windowSchema.nullable(),
});
export type OverviewForecast = z.infer<typeof overviewForecastSchema>;

export const overviewSiteSchema = z.object({
  id: uuidSchema,
  name: z.string(),
  timeZone: z.string(),
  /** Start of today and end of tomorrow, site-local, as UTC ISO. */
  todayStart: isoDateTimeSchema,
  tomorrowEnd: isoDateTimeSchema,
  forecasts: z.array(overviewForecastSchema),
  openAlerts: z.array(z.object({ id: uuidSchema, kind: z.string(), message: z.string(), createdAt: isoDateTimeSchema })),
  plannedToday: z.number().int(),
});
export type OverviewSite = z.infer<typeof overviewSiteSchema>;

export const overviewSchema = z.object({
  /** False when the subscription does not unlock forecasts: sites and alerts only. */
  forecastsUnlocked: z.boolean(),
  now: isoDateTimeSchema,
  sites: z.array(overviewSiteSchema),
});
export type Overview = z.infer<typeof overviewSchema>;
