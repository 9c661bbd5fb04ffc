import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';

/**
 * An organism profile's parameters, in the units biologists use (m/day, cells/L). Every message names
 * the field, its unit and, where the literature gives one, the typical range with its source; the
 * ranges and sources are collected in docs/organisms.md. The hard limits are wider than the typical
 * ranges: they only keep the engine inside what it can represent.
 */
const num = (field: string, unit: string) => z.number({ error: `${field} must be a number${unit ? ` of ${unit}` : ''}` });

export const organismParamsSchema = z.object({
  /** Positive = sinking. Living phytoplankton 0–30 m/d, most below 1–2 m/d (Smayda 1970). */
  settlingVelocityMPerDay: num('settling velocity', 'm/day')
    .min(-50, 'settling velocity must be at least -50 m/day (negative rises; living cells typically sink 0–30 m/day, Smayda 1970)')
    .max(200, 'settling velocity must be at most 200 m/day (living cells typically sink 0–30 m/day, Smayda 1970; aggregates about 100 m/day, Smetacek 1985)'),
  swimming: z
    .object({
      /** Dinoflagellates typically 0.5–2 m/h (Hand et al. 1965; Erga et al. 2015). */
      speedMPerHour: num('swimming speed', 'm/h')
        .min(0, 'swimming speed must be ≥ 0 m/h (dinoflagellates typically 0.5–2 m/h, Hand et al. 1965; Erga et al. 2015)')
        .max(10, 'swimming speed must be at most 10 m/h (dinoflagellates typically 0.5–2 m/h, up to 4 m/h, Erga et al. 2015)'),
      schedule: z.discriminatedUnion(
        'type',
        [
          z.object({ type: z.literal('sun') }),
          z.object({
            type: z.literal('clock'),
            upHour: num('swim-up hour', 'hours').min(0, 'swim-up hour must be between 0 and 24 h (local clock)').max(24, 'swim-up hour must be between 0 and 24 h (local clock)'),
            downHour: num('swim-down hour', 'hours').min(0, 'swim-down hour must be between 0 and 24 h (local clock)').max(24, 'swim-down hour must be between 0 and 24 h (local clock)'),
          }),
        ],
        { error: 'swimming schedule must be "sun" (up by day) or "clock" (up and down hours)' },
      ),
      minDepthM: num('shallowest swimming depth', 'm').min(0, 'shallowest swimming depth must be ≥ 0 m below the surface').default(0),
      maxDepthM: num('deepest swimming depth', 'm').min(0, 'deepest swimming depth must be ≥ 0 m below the surface').nullable().default(null),
    })
    .refine((s) => s.maxDepthM === null || s.maxDepthM >= s.minDepthM, { error: 'deepest swimming depth must not be shallower than the shallowest (m below the surface)', path: ['maxDepthM'] })
    .nullable()
    .default(null),
  growth: z
    .object({
      /** Maximum specific growth rate per day; null = Eppley (1972) at the temperature. */
      maxRatePerDay: num('maximum growth rate', 'per day')
        .min(0, 'maximum growth rate must be ≥ 0 per day (Eppley 1972: 1.11 per day at 10 °C, 1.53 at 15 °C, 2.09 at 20 °C)')
        .max(10, 'maximum growth rate must be at most 10 per day (Eppley 1972: 1.11 per day at 10 °C, 1.53 at 15 °C, 2.09 at 20 °C)')
        .nullable(),
      temperatureC: num('temperature', '°C').min(-3, 'temperature must be at least -3 °C').max(40, 'temperature must be at most 40 °C'),
      /** Diffuse attenuation of PAR, 1/m: coastal 0.1–0.5 (Kirk 2011). */
      lightAttenuationPerM: num('light attenuation', 'per m')
        .positive('light attenuation must be above 0 per m (coastal and shelf water typically 0.1–0.5 per m, Kirk 2011)')
        .max(20, 'light attenuation must be at most 20 per m (turbid estuaries typically 1–10 per m, Kirk 2011)'),
      /** Light saturation Ik, µmol photons m⁻² s⁻¹. */
      lightSaturationUmol: num('light saturation', 'µmol photons/m²/s')
        .positive('light saturation must be above 0 µmol photons/m²/s (Ik = Pmax/α of the P–I curve, Jassby & Platt 1976)')
        .max(5000, 'light saturation must be at most 5000 µmol photons/m²/s (full sunlight is about 2000)'),
    })
    .nullable()
    .default(null),
  mortalityPerDay: num('mortality', 'per day').min(0, 'mortality must be ≥ 0 per day').max(10, 'mortality must be at most 10 per day').default(0),
  bedExchange: z
    .object({
      criticalStressPa: num('critical bed stress', 'Pa')
        .positive('critical bed stress must be above 0 Pa (muds typically 0.1–0.5 Pa, Winterwerp & van Kesteren 2004)')
        .max(10, 'critical bed stress must be at most 10 Pa (muds typically 0.1–0.5 Pa, Winterwerp & van Kesteren 2004)'),
      /** Resuspension rate constant M, cells/L × m per second at twice the critical stress. */
      erosionRate: num('erosion rate', 'cells/L × m/s').min(0, 'erosion rate must be ≥ 0 cells/L × m/s'),
    })
    .nullable()
    .default(null),
  /** Starting concentration, uniform over depth. */
  initialCellsPerL: num('starting concentration', 'cells/L')
    .min(0, 'starting concentration must be ≥ 0 cells/L (blooms range from 10³ to over 10⁷ cells/L)')
    .max(1e9, 'starting concentration must be at most 10⁹ cells/L (blooms range from 10³ to over 10⁷ cells/L)'),
  /** Trigger level at the gear band, cells/L (user-set; never a legal threshold by itself). */
  triggerCellsPerL: num('trigger level', 'cells/L')
    .positive('trigger level must be above 0 cells/L (monitoring triggers run from 100 cells/L for Dinophysis to 150,000 for Pseudo-nitzschia)')
    .max(1e9, 'trigger level must be at most 10⁹ cells/L'),
  schmidtNumber: num('turbulent Schmidt number', '')
    .positive('turbulent Schmidt number must be above 0 (usually 1.0 in marine models)')
    .max(10, 'turbulent Schmidt number must be at most 10 (usually 1.0 in marine models)')
    .default(1),
});
export type OrganismParams = z.infer<typeof organismParamsSchema>;
export type OrganismParamsInput = z.input<typeof organismParamsSchema>;

const nameSchema = z.string({ error: 'name must be text' }).trim().min(1, 'name is required').max(80, 'name must be at most 80 characters');
const taxonSchema = z.string({ error: 'taxon must be text' }).trim().min(1, 'taxon is required').max(120, 'taxon must be at most 120 characters');
const noteSchema = z.string({ error: 'note must be text' }).max(500, 'note must be at most 500 characters');

export const profileInputSchema = z.object({
  name: nameSchema,
  taxon: taxonSchema,
  params: organismParamsSchema,
  note: noteSchema.default(''),
});
export type ProfileInput = z.input<typeof profileInputSchema>;

/**
 * An edit. Name and taxon belong to the profile; params and note to its latest version, which is
 * changed in place while no forecast has used it, and otherwise followed by a new version.
 */
export const profileUpdateSchema = z
  .strictObject({ name: nameSchema.optional(), taxon: taxonSchema.optional(), params: organismParamsSchema.optional(), note: noteSchema.optional() })
  .refine((v) => Object.keys(v).length > 0, { error: 'send at least one of name, taxon, params, note' });
export type ProfileUpdate = z.input<typeof profileUpdateSchema>;

/** Always a new version (a what-if saved, a calibration accepted). */
export const profileVersionInputSchema = z.strictObject({ params: organismParamsSchema, note: noteSchema.default('') });
export type ProfileVersionInput = z.input<typeof profileVersionInputSchema>;

export const profileVersionSchema = z.object({
  id: uuidSchema,
  profileId: uuidSchema,
  version: z.number().int(),
  params: organismParamsSchema,
  note: z.string(),
  createdAt: isoDateTimeSchema,
  createdBy: z.string().nullable(),
  used: z.boolean(),
});
export type ProfileVersion = z.infer<typeof profileVersionSchema>;

export const profileSchema = z.object({
  id: uuidSchema,
  name: z.string(),
  taxon: z.string(),
  latest: profileVersionSchema,
});
export type Profile = z.infer<typeof profileSchema>;
export const profileListSchema = z.object({ profiles: z.array(profileSchema) });

/** One profile with every version, newest first. */
export const profileDetailSchema = profileSchema.extend({
  archivedAt: isoDateTimeSchema.nullable(),
  versions: z.array(profileVersionSchema),
});
export type ProfileDetail = z.infer<typeof profileDetailSchema>;

/** What an edit did to the versions: changed the latest in place, added one, or left them alone. */
export const versionChangeSchema = z.enum(['updated_in_place', 'new_version', 'none']);
export type VersionChange = z.infer<typeof versionChangeSchema>;
export const profileEditResultSchema = z.object({ profile: profileDetailSchema, versionChange: versionChangeSchema });
export type ProfileEditResult = z.infer<typeof profileEditResultSchema>;
