import type { CaseInput } from '../model/case-schema.ts';
import type { OrganismParams } from '../schemas/organism.schema.ts';
import { currentTerms } from '../tides/predict.ts';
import { updateTerms } from '../tides/harmonic-sum.ts';

export const ENGINE_VERSION = 'planktide-column 1.0';

export interface CurrentConstituentInput {
  name: string;
  /** Semi-major axis, m/s. */
  major: number;
  /** Greenwich phase lag, degrees. */
  phaseDeg: number;
  minor?: number;
  /** Direction of the major axis, degrees anticlockwise from east. */
  inclinationDeg?: number;
}

export interface ForecastCaseInput {
  site: { latitudeDeg: number; longitudeDeg: number; waterDepthM: number; bedRoughnessM: number };
  organism: { name: string; params: OrganismParams };
  current: { constituents: CurrentConstituentInput[]; axisDeg: number | null };
  startMs: number;
  horizonDays: number;
  layers?: number;
  timeStepS?: number;
  outputIntervalS?: number;
}

const DAY_S = 86400;
const RAD = Math.PI / 180;

/**
 * The model case for one site and organism over the horizon. The site's Greenwich phase lags become
 * the model's phases at the forecast start: A = f·H and φ = g − (V0 + u) − ω·(start − chunk start),
 * so that A cos(ω t − φ), t from the start, is the tidal prediction f H cos(V0 + u + ω t' − g) (Schureman 1958).
 * The model's x axis is the site's main axis, so inclinations are turned by −axis.
 */
export function buildForecastCase(input: ForecastCaseInput): CaseInput {
  const { site, organism, current } = input;
  const p = organism.params;
  const terms = currentTerms(current.constituents, current.axisDeg === null ? {} : { axisDeg: current.axisDeg });
  if ('ok' in terms) throw new Error(`The site's current constituents are not usable: ${terms.message}`);
  updateTerms(terms.terms, input.startMs);
  const hours = (input.startMs - terms.terms.chunkStartMs) / 3_600_000;
  const axis = terms.oriented ? terms.axisDeg : 0;
  const constituents = current.constituents.map((c, k) => {
    const argAtStart = terms.terms.omega[k]! * hours + terms.terms.arg0[k]!;
    return {
      name: c.name,
      amplitude_m_s: terms.terms.fa[k]!,
      minor_amplitude_m_s: terms.terms.fb[k]!,
      phase_deg: -argAtStart / RAD,
      inclination_deg: terms.oriented ? (c.inclinationDeg ?? 0) - axis : 0,
    };
  });

  const swimming = p.swimming
    ? {
        speed_m_s: p.swimming.speedMPerHour / 3600,
        schedule:
          p.swimming.schedule.type === 'sun'
            ? { type: 'sun' as const }
            : { type: 'clock' as const, up_hour: p.swimming.schedule.upHour, down_hour: p.swimming.schedule.downHour },
        min_depth_m: p.swimming.minDepthM,
        ...(p.swimming.maxDepthM !== null ? { max_depth_m: Math.min(p.swimming.maxDepthM, site.waterDepthM) } : {}),
      }
    : undefined;
  const growth = p.growth
    ? {
        max_rate_per_day: p.growth.maxRatePerDay ?? ('eppley' as const),
        temperature_c: p.growth.temperatureC,
        light: { attenuation_per_m: p.growth.lightAttenuationPerM, saturation_umol_m2_s: p.growth.lightSaturationUmol },
      }
    : undefined;

  return {
    depth_m: site.waterDepthM,
    layers: input.layers ?? 50,
    time_step_s: input.timeStepS ?? 30,
    duration_s: input.horizonDays * DAY_S,
    output_interval_s: input.outputIntervalS ?? 900,
    start: new Date(input.startMs).toISOString(),
    latitude_deg: site.latitudeDeg,
    longitude_deg: site.longitudeDeg,
    bed_roughness_m: site.bedRoughnessM,
    closure: { type: 'k-epsilon' },
    forcing: { type: 'depth_mean_current', start: new Date(input.startMs).toISOString(), constituents },
    organisms: [
      {
        name: organism.name.replace(/[^A-Za-z0-9 _.\-()]/g, '_').slice(0, 64) || 'organism',
        settling_velocity_m_s: p.settlingVelocityMPerDay / DAY_S,
        initial_concentration: p.initialCellsPerL,
        schmidt_number: p.schmidtNumber,
        mortality_per_day: p.mortalityPerDay,
        ...(swimming ? { swimming } : {}),
        ...(growth ? { growth } : {}),
        ...(p.bedExchange ? { bed_exchange: { critical_stress_pa: p.bedExchange.criticalStressPa, erosion_rate: p.bedExchange.erosionRate } } : {}),
      },
    ],
  };
}
