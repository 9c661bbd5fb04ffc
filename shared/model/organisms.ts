/**
 * Organism parameters compiled once per run into a runtime record with its
 * own work arrays, plus the per-step pieces that depend on the time of day:
 * swimming direction and growth with light and temperature.
 */
import type { OrganismCase } from './case-schema.ts';
import type { Grid } from './grid.ts';
import { eppleyMaxGrowthPerDay } from './growth.ts';
import { jassbyPlatt, lightAtDepth } from './light.ts';
import { SECONDS_PER_DAY } from './physical-constants.ts';

export const SWIM_NONE = 0;
export const SWIM_SUN = 1;
export const SWIM_CLOCK = 2;

export interface OrganismRuntime {
  readonly name: string;
  /** Concentration at layer centres (index 0 = bottom layer). */
  readonly conc: Float64Array;
  /** Vertical velocity at interfaces, positive up, m/s (work). */
  readonly wFace: Float64Array;
  /** Diffusivity at interfaces, m²/s (work). */
  readonly kFace: Float64Array;
  /** Growth factor per layer for the current step (work). */
  readonly factor: Float64Array;
  /** Tridiagonal work arrays. */
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly c: Float64Array;
  readonly cp: Float64Array;
  /** Settling velocity, positive down, m/s. */
  readonly settling: number;
  readonly schmidtInverse: number;
  readonly backgroundDiffusivity: number;
  readonly swimMode: number;
  readonly swimSpeed: number;
  readonly upHour: number;
  readonly downHour: number;
  readonly minDepth: number;
  readonly maxDepth: number;
  /** Maximum specific growth rate, s⁻¹ (0 without growth). */
  readonly growthRate: number;
  readonly hasLight: boolean;
  /** exp(−Kd d) at each layer centre (index 0 = bottom layer). */
  readonly attenuation: Float64Array;
  /** Initial slope of the light response: 1/I_k, per µmol m⁻² s⁻¹. */
  readonly lightSlope: number;
  readonly surfaceScale: number;
  readonly mortality: number;
  readonly bedExchange: boolean;
  readonly criticalStress: number;
  readonly erosionRate: number;
  /** Cells in the bed pool per unit area (concentration × m). */
  bed: number;
}

export function compileOrganism(o: OrganismCase, grid: Grid): OrganismRuntime {
  const n = grid.layers;
  const conc = new Float64Array(n);
  fillInitial(o, grid, conc);
  const attenuation = new Float64Array(n);
  const light = o.growth?.light;
  for (let i = 0; i < n; i++) {
    attenuation[i] = light ? lightAtDepth(1, light.attenuation_per_m, grid.depth - grid.zCentre[i]!) : 1;
  }
  let growthRate = 0;
  if (o.growth) {
    const perDay =
      o.growth.max_rate_per_day === 'eppley'
        ? eppleyMaxGrowthPerDay(o.growth.temperature_c ?? 0)
        : o.growth.max_rate_per_day;
    growthRate = perDay / SECONDS_PER_DAY;
  }
  const sw = o.swimming;
  let swimMode = SWIM_NONE;
  if (sw && sw.speed_m_s > 0) swimMode = sw.schedule.type === 'sun' ? SWIM_SUN : SWIM_CLOCK;
  return {
    name: o.name,
    conc,
    wFace: new Float64Array(n + 1),
    kFace: new Float64Array(n + 1),
    factor: new Float64Array(n),
    a: new Float64Array(n),
    b: new Float64Array(n),
    c: new Float64Array(n),
    cp: new Float64Array(n),
    settling: o.settling_velocity_m_s,
    schmidtInverse: 1 / o.schmidt_number,
    backgroundDiffusivity: o.background_diffusivity_m2_s,
    swimMode,
    swimSpeed: sw ? sw.speed_m_s : 0,
    upHour: sw && sw.schedule.type === 'clock' ? sw.schedule.up_hour : 0,
    downHour: sw && sw.schedule.type === 'clock' ? sw.schedule.down_hour : 0,
    minDepth: sw ? sw.min_depth_m : 0,
    maxDepth: sw?.max_depth_m ?? grid.depth,
    growthRate,
    hasLight: light !== undefined,
    attenuation,
    lightSlope: light ? 1 / light.saturation_umol_m2_s : 0,
    surfaceScale: light ? light.surface_scale : 1,
    mortality: o.mortality_per_day / SECONDS_PER_DAY,
    bedExchange: o.bed_exchange !== undefined,
    criticalStress: o.bed_exchange?.critical_stress_pa ?? 0,
    erosionRate: o.bed_exchange?.erosion_rate ?? 0,
    bed: o.bed_exchange?.initial_bed ?? 0,
  };
}

/** Uniform value, or piecewise-linear in depth below the surface (held beyond the ends). */
function fillInitial(o: OrganismCase, grid: Grid, conc: Float64Array): void {
  const init = o.initial_concentration;
  if (typeof init === 'number') {
    conc.fill(init);
    return;
  }
  const pts = [...init].sort((p, q) => p.depth_m - q.depth_m);
  for (let i = 0; i < grid.layers; i++) {
    const d = grid.depth - grid.zCentre[i]!;
    let value = pts[pts.length - 1]!.value;
    if (d <= pts[0]!.depth_m) value = pts[0]!.value;
    else {
      for (let p = 1; p < pts.length; p++) {
        const hi = pts[p]!;
        if (d <= hi.depth_m) {
          const lo = pts[p - 1]!;
          const span = hi.depth_m - lo.depth_m;
          value = span > 0 ? lo.value + ((d - lo.depth_m) / span) * (hi.value - lo.value) : hi.value;
          break;
        }
      }
    }
    conc[i] = value;
  }
}

/** Whether swimmers go up now: sun above the horizon, or inside the clock window (local mean solar hours). */
export function swimsUp(o: OrganismRuntime, sunElevationDeg: number, solarHour: number): boolean {
  if (o.swimMode === SWIM_SUN) return sunElevationDeg > 0;
  if (o.upHour <= o.downHour) return solarHour >= o.upHour && solarHour < o.downHour;
  return solarHour >= o.upHour || solarHour < o.downHour;
}

/**
 * Multiplies the concentrations by the exact net-growth factor of the step,
 * exp((μ − m) Δt) with μ = μmax tanh(I/I_k) (Jassby & Platt 1976) and
 * I = I0 e^(−Kd d) (Beer–Lambert). Never makes a concentration negative.
 */
export function applyGrowth(o: OrganismRuntime, dt: number, surfaceLight: number): void {
  const n = o.conc.length;
  const conc = o.conc;
  if (o.growthRate === 0 || !o.hasLight) {
    const net = o.growthRate - o.mortality;
    if (net === 0) return;
    const f = Math.exp(net * dt);
    for (let i = 0; i < n; i++) conc[i] = conc[i]! * f;
    return;
  }
  const i0 = surfaceLight * o.surfaceScale;
  if (!(i0 > 0)) {
    const f = Math.exp(-o.mortality * dt);
    if (f !== 1) for (let i = 0; i < n; i++) conc[i] = conc[i]! * f;
    return;
  }
  const att = o.attenuation;
  const mu = o.growthRate;
  const slope = o.lightSlope;
  const m = o.mortality;
  for (let i = 0; i < n; i++) {
    const limited = jassbyPlatt(i0 * att[i]!, slope, 1);
    conc[i] = conc[i]! * Math.exp((mu * limited - m) * dt);
  }
}
