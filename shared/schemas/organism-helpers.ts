/**
 * Helpers that fill a profile parameter from things a biologist measures: the settling velocity of a
 * cell from its size and density (Stokes' law with form resistance, shared/model/settling.ts), and the
 * maximum growth rate from temperature (Eppley 1972, shared/model/growth.ts). Inputs are checked here,
 * at the boundary, with messages naming the field and its unit.
 */
import { z } from 'zod';
import { eppleyMaxDoublingsPerDay, eppleyMaxGrowthPerDay } from '../model/growth.ts';
import { cellSettlingVelocity } from '../model/settling.ts';

const num = (field: string, unit: string, min: number, max: number) =>
  z
    .number({ error: `${field} must be a number of ${unit}` })
    .min(min, `${field} must be at least ${min} ${unit}`)
    .max(max, `${field} must be at most ${max} ${unit}`);

export const stokesHelperInputSchema = z.object({
  /** Equivalent spherical diameter, µm. */
  diameterUm: num('cell diameter', 'µm', 0.5, 2000),
  /** Cell density, kg/m³ (phytoplankton typically 1030–1200, cysts up to about 1200). */
  cellDensity: num('cell density', 'kg/m³', 900, 3000),
  temperatureC: num('temperature', '°C', -2, 40),
  salinity: num('salinity', 'on the practical scale', 0, 42),
  /** Form resistance φr ≥ 1 (1 = sphere; Reynolds 2006). */
  formResistance: num('form resistance', '(ratio)', 1, 20).default(1),
});
export type StokesHelperInput = z.input<typeof stokesHelperInputSchema>;

export type HelperResult<T> = { ok: true; value: T } | { ok: false; issues: { path: string; message: string }[] };

const issuesOf = (error: z.ZodError) => error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));

export interface StokesHelperValue {
  settlingVelocityMPerDay: number;
  /** Particle Reynolds number; Stokes' law holds for ≲ 0.5. */
  reynolds: number;
  stokesValid: boolean;
}

/** Stokes settling velocity of a cell in seawater at the given temperature and salinity, m/day. */
export function settlingFromCell(input: unknown): HelperResult<StokesHelperValue> {
  const parsed = stokesHelperInputSchema.safeParse(input);
  if (!parsed.success) return { ok: false, issues: issuesOf(parsed.error) };
  const v = parsed.data;
  const ws = cellSettlingVelocity({ diameterUm: v.diameterUm, cellDensity: v.cellDensity, salinity: v.salinity, tempC: v.temperatureC, formResistance: v.formResistance });
  return { ok: true, value: { settlingVelocityMPerDay: ws.mPerDay, reynolds: ws.reynolds, stokesValid: ws.reynolds <= 0.5 } };
}

export const eppleyHelperInputSchema = z.object({ temperatureC: num('temperature', '°C', -2, 40) });

export interface EppleyHelperValue {
  /** Specific (natural-log) rate, per day: what the profile's maximum growth rate holds. */
  maxRatePerDay: number;
  doublingsPerDay: number;
}

/** Eppley (1972) maximum growth rate at a temperature. */
export function growthFromTemperature(input: unknown): HelperResult<EppleyHelperValue> {
  const parsed = eppleyHelperInputSchema.safeParse(input);
  if (!parsed.success) return { ok: false, issues: issuesOf(parsed.error) };
  const t = parsed.data.temperatureC;
  return { ok: true, value: { maxRatePerDay: eppleyMaxGrowthPerDay(t), doublingsPerDay: eppleyMaxDoublingsPerDay(t) } };
}
