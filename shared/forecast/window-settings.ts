/**
 * Per-site settings of the forecast windows (docs/windows.md). Every value is a definition of this
 * product, not a published constant; a site may change any of them. Parse with `parseWindowSettings`
 * (or the schema) at the boundary; the window finder trusts what it is given.
 */
import { z } from 'zod';

export const windowSettingsSchema = z.strictObject({
  /** Slack: depth-mean current speed below this, m/s. */
  slackSpeedMPerS: z
    .number({ error: 'slack speed must be a number of m/s' })
    .positive('slack speed must be above 0 m/s')
    .max(5, 'slack speed must be at most 5 m/s')
    .default(0.1),
  /** Slump: mean concentration over the bottom `slumpNearBedM` at least this many times the depth mean. */
  slumpRatio: z
    .number({ error: 'slump ratio must be a number' })
    .gt(1, 'slump ratio must be above 1')
    .max(1000, 'slump ratio must be at most 1000')
    .default(2),
  /** Thickness of the near-bed band the slump ratio looks at, m above the bed. */
  slumpNearBedM: z
    .number({ error: 'near-bed band must be a number of metres' })
    .positive('near-bed band must be above 0 m')
    .max(100, 'near-bed band must be at most 100 m')
    .default(1),
  /** Mixed: coefficient of variation of concentration over depth below this. */
  mixedCv: z
    .number({ error: 'mixed-column limit must be a number' })
    .positive('mixed-column limit must be above 0')
    .max(10, 'mixed-column limit must be at most 10')
    .default(0.25),
  /** Subsurface peak: largest concentration away from surface and bed at least this many times the depth mean. */
  subsurfacePeakRatio: z
    .number({ error: 'subsurface peak ratio must be a number' })
    .gt(1, 'subsurface peak ratio must be above 1')
    .max(1000, 'subsurface peak ratio must be at most 1000')
    .default(2),
  /** "Away from surface and bed": layer centres deeper than this below the surface and higher than this above the bed, m. */
  subsurfaceMarginM: z
    .number({ error: 'subsurface margin must be a number of metres' })
    .min(0, 'subsurface margin must be at least 0 m')
    .max(100, 'subsurface margin must be at most 100 m')
    .default(1),
  /** Windows shorter than this are dropped, minutes. */
  minWindowMinutes: z
    .number({ error: 'minimum window length must be a number of minutes' })
    .min(0, 'minimum window length must be at least 0 min')
    .max(720, 'minimum window length must be at most 720 min')
    .default(20),
});

/** Settings with every default filled in (what `findWindows` takes). */
export type WindowSettings = z.output<typeof windowSettingsSchema>;
/** Settings as a site stores or sends them (any key may be left out). */
export type WindowSettingsInput = z.input<typeof windowSettingsSchema>;

/** The defaults (definition, docs/windows.md). */
export const DEFAULT_WINDOW_SETTINGS: WindowSettings = Object.freeze(windowSettingsSchema.parse({}));

export interface WindowSettingsIssue {
  /** Dotted path of the field, e.g. "slumpRatio". */
  path: string;
  message: string;
}

export type ParseWindowSettingsResult = { ok: true; value: WindowSettings } | { ok: false; issues: WindowSettingsIssue[] };

/** Validates a site's settings and fills in the defaults; invalid input gives one issue per field. */
export function parseWindowSettings(input: unknown): ParseWindowSettingsResult {
  const parsed = windowSettingsSchema.safeParse(input ?? {});
  if (parsed.success) return { ok: true, value: parsed.data };
  return {
    ok: false,
    issues: parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message })),
  };
}
