import { z } from 'zod';
import { isoDateTimeSchema, uuidSchema } from './common.schema.ts';

/**
 * An organism profile's parameters, in the units biologists use (m/day, cells/L). Typical ranges
 * in the messages come from the literature collected in docs/organisms.md.
 */
export const organismParamsSchema = z.object({
  /** Positive = sinking. Living phytoplankton 0–30 m/d, most below 1–2 m/d (Smayda 1970). */
  settlingVelocityMPerDay: z.number({ error: 'settling velocity must be a number of m/day' }).min(-50, 'settling velocity must be at least -50 m/day').max(200, 'settling velocity must be at most 200 m/day'),
  swimming: z
    .object({
      /** Dinoflagellates typically 0.5–2 m/h (Hand et al. 1965; Erga et al. 2015). */
      speedMPerHour: z.number().min(0, 'swimming speed must be ≥ 0').max(10, 'swimming speed must be at most 10 m/h'),
      schedule: z.discriminatedUnion('type', [
        z.object({ type: z.literal('sun') }),
        z.object({ type: z.literal('clock'), upHour: z.number().min(0).max(24), downHour: z.number().min(0).max(24) }),
      ]),
      minDepthM: z.number().min(0).default(0),
      maxDepthM: z.number().min(0).nullable().default(null),
    })
    .nullable()
    .default(null),
  growth: z
    .object({
      /** Maximum specific growth rate per day; null = Eppley (1972) at the temperature. */
      maxRatePerDay: z.number().min(0).max(10).nullable(),
      temperatureC: z.number().min(-3, 'temperature must be at least -3 °C').max(40, 'temperature must be at most 40 °C'),
      /** Diffuse attenuation of PAR, 1/m: coastal 0.1–0.5 (Kirk 2011). */
      lightAttenuationPerM: z.number().positive('light attenuation must be above 0').max(20),
      /** Light saturation Ik, µmol photons m⁻² s⁻¹. */
      lightSaturationUmol: z.number().positive().max(5000),
    })
    .nullable()
    .default(null),
  mortalityPerDay: z.number().min(0, 'mortality must be ≥ 0').max(10, 'mortality must be at most 10 per day').default(0),
  bedExchange: z
    .object({
      criticalStressPa: z.number().positive('critical bed stress must be above 0').max(10),
      /** Resuspension rate constant M, cells/L × m per second at twice the critical stress. */
      erosionRate: z.number().min(0),
    })
    .nullable()
    .default(null),
  /** Starting concentration, uniform over depth. */
  initialCellsPerL: z.number().min(0).max(1e9),
  /** Trigger level at the gear band, cells/L (user-set; never a legal threshold by itself). */
  triggerCellsPerL: z.number().positive('trigger level must be above 0').max(1e9),
  schmidtNumber: z.number().positive().max(10).default(1),
});
export type OrganismParams = z.infer<typeof organismParamsSchema>;
export type OrganismParamsInput = z.input<typeof organismParamsSchema>;

export const profileInputSchema = z.object({
  name: z.string().trim().min(1, 'name is required').max(80),
  taxon: z.string().trim().min(1, 'taxon is required').max(120),
  params: organismParamsSchema,
  note: z.string().max(500).default(''),
});

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
