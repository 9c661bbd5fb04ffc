/**
 * The zod contract of a model case (snake_case keys, as in case files).
 * Every key is documented in docs/model-case.md. Error messages carry the
 * path of the offending field (see formatCaseIssues).
 */
import { z } from 'zod';
import { isConstituentName } from './constituents.ts';
import { DEFAULT_VON_KARMAN, DEFAULT_WATER_DENSITY, K_EPSILON_DEFAULTS } from './physical-constants.ts';

const finite = z.number();
const positive = z.number().positive();
const nonNegative = z.number().nonnegative();
const isoInstant = z.iso.datetime({ offset: true });

const harmonicComponent = z
  .strictObject({
    amplitude: finite,
    period_s: positive.optional(),
    constituent: z.string().refine(isConstituentName, { message: 'unknown constituent' }).optional(),
    phase_deg: finite.default(0),
  })
  .refine((c) => (c.period_s === undefined) !== (c.constituent === undefined), {
    message: 'give exactly one of period_s and constituent',
    path: ['period_s'],
  });

const surfaceSlopeForcing = z.strictObject({
  type: z.literal('surface_slope'),
  mean: finite.default(0),
  components: z.array(harmonicComponent).max(64).default([]),
});

const currentConstituent = z.strictObject({
  name: z.string().refine(isConstituentName, { message: 'unknown constituent' }),
  amplitude_m_s: nonNegative.max(20),
  phase_deg: finite.default(0),
  minor_amplitude_m_s: finite.max(20).default(0),
  inclination_deg: finite.default(0),
});

const depthMeanCurrentForcing = z.strictObject({
  type: z.literal('depth_mean_current'),
  start: isoInstant,
  mean_u_m_s: finite.min(-20).max(20).default(0),
  mean_v_m_s: finite.min(-20).max(20).default(0),
  constituents: z.array(currentConstituent).max(64).default([]),
});

const windPoint = z.strictObject({
  time_s: finite,
  x_pa: finite.min(-50).max(50),
  y_pa: finite.min(-50).max(50),
});

const kEpsilonClosure = z.strictObject({
  type: z.literal('k-epsilon'),
  surface_roughness_m: positive.max(100).default(0.2),
  background_viscosity_m2_s: nonNegative.max(1).default(1e-6),
  c_mu: positive.default(K_EPSILON_DEFAULTS.cMu),
  c1: positive.default(K_EPSILON_DEFAULTS.c1),
  c2: positive.default(K_EPSILON_DEFAULTS.c2),
  sigma_k: positive.default(K_EPSILON_DEFAULTS.sigmaK),
  sigma_epsilon: positive.default(K_EPSILON_DEFAULTS.sigmaEpsilon),
});

const parabolicClosure = z.strictObject({
  type: z.literal('parabolic'),
  background_viscosity_m2_s: nonNegative.max(1).default(1e-6),
});

const constantClosure = z.strictObject({
  type: z.literal('constant'),
  viscosity_m2_s: nonNegative.max(100),
});

const profilePoint = z.strictObject({ depth_m: nonNegative, value: nonNegative.max(1e30) });

const swimming = z.strictObject({
  speed_m_s: nonNegative.max(0.1),
  schedule: z.discriminatedUnion('type', [
    z.strictObject({ type: z.literal('sun') }),
    z.strictObject({
      type: z.literal('clock'),
      up_hour: finite.min(0).max(24),
      down_hour: finite.min(0).max(24),
    }),
  ]),
  min_depth_m: nonNegative.default(0),
  max_depth_m: nonNegative.optional(),
});

const growth = z
  .strictObject({
    max_rate_per_day: z.union([nonNegative.max(50), z.literal('eppley')]),
    temperature_c: finite.min(-3).max(40).optional(),
    light: z
      .strictObject({
        attenuation_per_m: positive.max(100),
        saturation_umol_m2_s: positive.max(1e5),
        surface_scale: nonNegative.max(1).default(1),
      })
      .optional(),
  })
  .refine((g) => g.max_rate_per_day !== 'eppley' || g.temperature_c !== undefined, {
    message: 'temperature_c is required when max_rate_per_day is "eppley"',
    path: ['temperature_c'],
  });

const bedExchange = z.strictObject({
  critical_stress_pa: positive.max(1000),
  erosion_rate: nonNegative.max(1e30),
  initial_bed: nonNegative.max(1e30).default(0),
});

const organism = z.strictObject({
  name: z
    .string()
    .min(1)
    .max(64)
    .regex(/^[A-Za-z0-9 _.\-()]+$/, { message: 'use letters, digits, space, _ . - ( ) only' }),
  settling_velocity_m_s: finite.min(-0.1).max(0.1),
  initial_concentration: z.union([nonNegative.max(1e30), z.array(profilePoint).min(1).max(1000)]),
  schmidt_number: positive.max(100).default(1),
  background_diffusivity_m2_s: nonNegative.max(1).default(1e-6),
  swimming: swimming.optional(),
  growth: growth.optional(),
  mortality_per_day: nonNegative.max(50).default(0),
  bed_exchange: bedExchange.optional(),
});

export const caseSchema = z
  .strictObject({
    depth_m: positive.max(11000),
    layers: z.number().int().min(3).max(1000),
    time_step_s: positive.max(86400),
    duration_s: positive.max(400 * 86400),
    output_interval_s: positive,
    start: isoInstant.optional(),
    latitude_deg: finite.min(-90).max(90),
    longitude_deg: finite.min(-180).max(360).default(0),
    bed_roughness_m: positive.max(10),
    bed_refinement: z.number().min(1).max(100).default(1),
    von_karman: finite.min(0.3).max(0.5).default(DEFAULT_VON_KARMAN),
    water_density_kg_m3: finite.min(900).max(1100).default(DEFAULT_WATER_DENSITY),
    closure: z.discriminatedUnion('type', [kEpsilonClosure, parabolicClosure, constantClosure]),
    forcing: z.discriminatedUnion('type', [surfaceSlopeForcing, depthMeanCurrentForcing]),
    wind_stress: z.array(windPoint).max(100000).default([]),
    organisms: z.array(organism).max(32).default([]),
  })
  .superRefine((c, ctx) => {
    const steps = c.duration_s / c.time_step_s;
    if (steps > 5e7) {
      ctx.addIssue({ code: 'custom', path: ['time_step_s'], message: 'time_step_s gives more than 5e7 steps' });
    }
    const outputs = Math.floor(c.duration_s / c.output_interval_s) + 2;
    if (outputs * c.layers * (3 + c.organisms.length) > 2e8) {
      ctx.addIssue({
        code: 'custom',
        path: ['output_interval_s'],
        message: 'output_interval_s gives too many stored values (more than 2e8)',
      });
    }
    const names = new Set<string>();
    c.organisms.forEach((o, i) => {
      if (names.has(o.name)) {
        ctx.addIssue({ code: 'custom', path: ['organisms', i, 'name'], message: 'organism names must be unique' });
      }
      names.add(o.name);
      const needsClock = o.swimming !== undefined || o.growth?.light !== undefined;
      if (needsClock && c.start === undefined && c.forcing.type !== 'depth_mean_current') {
        ctx.addIssue({
          code: 'custom',
          path: ['start'],
          message: `start is required for the light or swimming of organism "${o.name}"`,
        });
      }
      const maxDepth = o.swimming?.max_depth_m;
      if (maxDepth !== undefined && o.swimming !== undefined && maxDepth < o.swimming.min_depth_m) {
        ctx.addIssue({
          code: 'custom',
          path: ['organisms', i, 'swimming', 'max_depth_m'],
          message: 'max_depth_m must not be less than min_depth_m',
        });
      }
    });
    for (let i = 1; i < c.wind_stress.length; i++) {
      if (c.wind_stress[i]!.time_s <= c.wind_stress[i - 1]!.time_s) {
        ctx.addIssue({
          code: 'custom',
          path: ['wind_stress', i, 'time_s'],
          message: 'wind_stress times must increase',
        });
      }
    }
  });

/** A case as written in a case file (defaults optional). */
export type CaseInput = z.input<typeof caseSchema>;
/** A validated case with every default filled in. */
export type ModelCase = z.output<typeof caseSchema>;
export type OrganismCase = ModelCase['organisms'][number];

export interface CaseIssue {
  /** Dotted path of the offending field, e.g. "forcing.constituents.0.name". */
  path: string;
  message: string;
}

export function formatCaseIssues(error: z.ZodError): CaseIssue[] {
  const out: CaseIssue[] = [];
  for (const issue of error.issues) {
    const base = issue.path.map((p) => String(p));
    if (issue.code === 'unrecognized_keys') {
      // One issue per unknown key, so the message names it.
      for (const key of issue.keys) {
        const path = [...base, key].join('.');
        out.push({ path, message: `${path}: unknown key` });
      }
      continue;
    }
    const path = base.join('.');
    out.push({ path, message: `${path || '(case)'}: ${issue.message}` });
  }
  return out;
}

export type ParseCaseResult = { ok: true; value: ModelCase } | { ok: false; issues: CaseIssue[] };

export function parseCase(input: unknown): ParseCaseResult {
  const parsed = caseSchema.safeParse(input);
  if (parsed.success) return { ok: true, value: parsed.data };
  return { ok: false, issues: formatCaseIssues(parsed.error) };
}
