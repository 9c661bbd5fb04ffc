/**
 * The model run: validates a case at the boundary (zod), builds the work
 * arrays once, and steps the column to the end, storing profiles and
 * diagnostics at each output time. No clocks, no I/O: time is model time.
 *
 * Output profiles are ordered from the surface down (index 0 = top layer);
 * depths are positive down from the surface at layer centres.
 */
import { parseCase, type CaseIssue, type ModelCase } from './case-schema.ts';
import { bedDragCoefficient, createColumnState, type ColumnState } from './column-state.ts';
import { centreOfMassDepth, columnTotal, shareNearBed } from './diagnostics.ts';
import {
  compileForcing,
  depthMeanTargetAt,
  FORCING_DEPTH_MEAN,
  surfaceSlopeAt,
  windStressAt,
  type Forcing,
} from './forcing.ts';
import { buildGrid, type Grid } from './grid.ts';
import { clearSkyParAtSurface } from './light.ts';
import { MOMENTUM_OK, stepMomentum, type MomentumInput } from './momentum.ts';
import { applyGrowth, compileOrganism, SWIM_NONE, swimsUp, type OrganismRuntime } from './organisms.ts';
import { EARTH_ROTATION_RAD_S, GRAVITY } from './physical-constants.ts';
import { sunElevationDeg } from './sun.ts';
import { setFaceTransport, stepTransport, TRANSPORT_OK } from './transport.ts';
import { initKEpsilon, K_EPSILON_OK, stepKEpsilon, type KEpsilonParams } from './turbulence-k-epsilon.ts';
import { setConstantViscosity, updateParabolicViscosity } from './turbulence-parabolic.ts';

const CLOSURE_K_EPSILON = 0;
const CLOSURE_PARABOLIC = 1;
const CLOSURE_CONSTANT = 2;

export type RunStatus = 'ok' | 'solver-failed' | 'non-finite';

export interface OrganismOutput {
  name: string;
  /** Concentration profiles, outputs × layers, surface first. */
  concentration: Float64Array;
  /** Column total Σ h C at each output time (concentration × m). */
  total: Float64Array;
  /** Bed pool at each output time (concentration × m; 0 without bed exchange). */
  bed: Float64Array;
  /** Centre of mass, depth below the surface (m). */
  centreOfMassDepthM: Float64Array;
  /** Share of the column total in the bottom metre and in the bottom tenth of the depth. */
  shareBottomMetre: Float64Array;
  shareBottomTenth: Float64Array;
}

export interface ModelSummary {
  steps: number;
  bedStressMaxPa: number;
  depthMeanSpeedMaxMS: number;
  surfaceSpeedMaxMS: number;
  eddyViscosityMaxM2S: number;
  organisms: { name: string; totalInitial: number; totalFinal: number; bedInitial: number; bedFinal: number }[];
}

export interface ModelResult {
  status: RunStatus;
  layers: number;
  outputs: number;
  /** Layer-centre depths below the surface, surface first. */
  depthM: Float64Array;
  /** Output times, s since the start. */
  timeS: Float64Array;
  /** Profiles, outputs × layers, surface first. */
  u: Float64Array;
  v: Float64Array;
  /** Eddy viscosity interpolated to layer centres. */
  eddyViscosity: Float64Array;
  /** Series at output times. */
  bedStressPa: Float64Array;
  frictionVelocity: Float64Array;
  depthMeanU: Float64Array;
  depthMeanV: Float64Array;
  surfaceU: Float64Array;
  surfaceV: Float64Array;
  organisms: OrganismOutput[];
  summary: ModelSummary;
}

export interface RunOptions {
  /** Called after each stored output with the fraction of model time done. */
  onProgress?: (fraction: number, timeS: number) => void;
}

export interface ModelRun {
  readonly modelCase: ModelCase;
  readonly grid: Grid;
  readonly column: ColumnState;
  readonly forcing: Forcing;
  readonly organisms: OrganismRuntime[];
  readonly result: ModelResult;
  readonly closure: number;
  readonly kEpsilon: KEpsilonParams;
  readonly momentum: MomentumInput;
  readonly startMs: number;
  readonly needsSun: boolean;
  readonly coriolis: number;
  readonly z0: number;
  readonly background: number;
  readonly constantViscosity: number;
  readonly windPair: Float64Array;
  windHint: number;
  steps: number;
  bedStressMax: number;
  depthMeanSpeedMax: number;
  surfaceSpeedMax: number;
  eddyViscosityMax: number;
}

export type RunCaseOutcome = { ok: true; result: ModelResult } | { ok: false; issues: CaseIssue[] };

/** Validates and runs a case. Invalid input gives the issues, each naming its field. */
export function runCase(input: unknown, options: RunOptions = {}): RunCaseOutcome {
  const parsed = parseCase(input);
  if (!parsed.ok) return parsed;
  const run = createRun(parsed.value);
  return { ok: true, result: runToEnd(run, options) };
}

/** Output times: every output_interval_s from 0, plus the end if it is not on the grid. */
function outputTimes(c: ModelCase): Float64Array {
  const whole = Math.floor(c.duration_s / c.output_interval_s + 1e-9);
  const lastOnGrid = whole * c.output_interval_s;
  const extra = c.duration_s - lastOnGrid > 1e-9 * c.duration_s ? 1 : 0;
  const times = new Float64Array(whole + 1 + extra);
  for (let k = 0; k <= whole; k++) times[k] = k * c.output_interval_s;
  if (extra) times[whole + 1] = c.duration_s;
  return times;
}

/** Builds every array of a run from a validated case. */
export function createRun(c: ModelCase): ModelRun {
  const grid = buildGrid(c.depth_m, c.layers, c.bed_refinement);
  const z0 = c.bed_roughness_m / 30;
  const column = createColumnState(grid, bedDragCoefficient(c.von_karman, grid.thickness[0]!, z0));
  const forcing = compileForcing(c);
  const organisms = c.organisms.map((o) => compileOrganism(o, grid));
  const n = grid.layers;
  const timeS = outputTimes(c);
  const nOut = timeS.length;
  const depthM = new Float64Array(n);
  for (let i = 0; i < n; i++) depthM[i] = c.depth_m - grid.zCentre[n - 1 - i]!;

  const cl = c.closure;
  const closure = cl.type === 'k-epsilon' ? CLOSURE_K_EPSILON : cl.type === 'parabolic' ? CLOSURE_PARABOLIC : CLOSURE_CONSTANT;
  const background = cl.type === 'constant' ? 0 : cl.background_viscosity_m2_s;
  const kEpsilon: KEpsilonParams = {
    cMu: cl.type === 'k-epsilon' ? cl.c_mu : 0.09,
    c1: cl.type === 'k-epsilon' ? cl.c1 : 1.44,
    c2: cl.type === 'k-epsilon' ? cl.c2 : 1.92,
    sigmaK: cl.type === 'k-epsilon' ? cl.sigma_k : 1,
    sigmaEpsilon: cl.type === 'k-epsilon' ? cl.sigma_epsilon : 1.3,
    vonKarman: c.von_karman,
    z0,
    surfaceRoughness: cl.type === 'k-epsilon' ? cl.surface_roughness_m : 0.2,
    background,
  };
  const constantViscosity = cl.type === 'constant' ? cl.viscosity_m2_s : 0;
  if (closure === CLOSURE_K_EPSILON) initKEpsilon(column, kEpsilon, 1e-6);
  else if (closure === CLOSURE_PARABOLIC) updateParabolicViscosity(column, c.von_karman, z0, background);
  else setConstantViscosity(column, constantViscosity);

  const startIso = c.start ?? (c.forcing.type === 'depth_mean_current' ? c.forcing.start : undefined);
  const needsSun = c.organisms.some((o) => o.swimming !== undefined || o.growth?.light !== undefined);

  const result: ModelResult = {
    status: 'ok',
    layers: n,
    outputs: nOut,
    depthM,
    timeS,
    u: new Float64Array(nOut * n),
    v: new Float64Array(nOut * n),
    eddyViscosity: new Float64Array(nOut * n),
    bedStressPa: new Float64Array(nOut),
    frictionVelocity: new Float64Array(nOut),
    depthMeanU: new Float64Array(nOut),
    depthMeanV: new Float64Array(nOut),
    surfaceU: new Float64Array(nOut),
    surfaceV: new Float64Array(nOut),
    organisms: organisms.map((o) => ({
      name: o.name,
      concentration: new Float64Array(nOut * n),
      total: new Float64Array(nOut),
      bed: new Float64Array(nOut),
      centreOfMassDepthM: new Float64Array(nOut),
      shareBottomMetre: new Float64Array(nOut),
      shareBottomTenth: new Float64Array(nOut),
    })),
    summary: {
      steps: 0,
      bedStressMaxPa: 0,
      depthMeanSpeedMaxMS: 0,
      surfaceSpeedMaxMS: 0,
      eddyViscosityMaxM2S: 0,
      organisms: organisms.map((o) => ({ name: o.name, totalInitial: 0, totalFinal: 0, bedInitial: o.bed, bedFinal: o.bed })),
    },
  };

  return {
    modelCase: c,
    grid,
    column,
    forcing,
    organisms,
    result,
    closure,
    kEpsilon,
    momentum: { dt: 0, rotCos: 1, rotSin: 0, targetMode: forcing.kind === FORCING_DEPTH_MEAN, gx: 0, gy: 0, windX: 0, windY: 0 },
    startMs: startIso === undefined ? 0 : Date.parse(startIso),
    needsSun,
    coriolis: 2 * EARTH_ROTATION_RAD_S * Math.sin((c.latitude_deg * Math.PI) / 180),
    z0,
    background,
    constantViscosity,
    windPair: new Float64Array(2),
    windHint: 0,
    steps: 0,
    bedStressMax: 0,
    depthMeanSpeedMax: 0,
    surfaceSpeedMax: 0,
    eddyViscosityMax: 0,
  };
}

/** One model step from time t (s since start) over dt. Returns a status. */
export function stepRun(run: ModelRun, t: number, dt: number): RunStatus {
  const col = run.column;
  const m = run.momentum;
  const f = run.forcing;
  const tNew = t + dt;
  const rho = run.modelCase.water_density_kg_m3;
  if (m.dt !== dt) {
    m.dt = dt;
    m.rotCos = Math.cos(run.coriolis * dt);
    m.rotSin = Math.sin(run.coriolis * dt);
  }
  if (m.targetMode) {
    depthMeanTargetAt(f, tNew, col.pair);
    m.gx = col.pair[0]!;
    m.gy = col.pair[1]!;
  } else {
    m.gx = -GRAVITY * surfaceSlopeAt(f, tNew);
    m.gy = 0;
  }
  if (f.windTime.length > 0) {
    run.windHint = windStressAt(f, tNew, run.windHint, run.windPair);
    m.windX = run.windPair[0]! / rho;
    m.windY = run.windPair[1]! / rho;
  }
  if (stepMomentum(col, m) !== MOMENTUM_OK) return 'solver-failed';

  if (run.closure === CLOSURE_K_EPSILON) {
    if (stepKEpsilon(col, run.kEpsilon, dt) !== K_EPSILON_OK) return 'solver-failed';
  } else if (run.closure === CLOSURE_PARABOLIC) {
    updateParabolicViscosity(col, run.kEpsilon.vonKarman, run.z0, run.background);
  }

  const bedStressPa = rho * Math.sqrt(col.bedStressX * col.bedStressX + col.bedStressY * col.bedStressY);
  const orgs = run.organisms;
  if (orgs.length > 0) {
    let surfaceLight = 0;
    let elevation = 0;
    let solarHour = 0;
    if (run.needsSun) {
      const ms = run.startMs + (t + 0.5 * dt) * 1000;
      const c = run.modelCase;
      elevation = sunElevationDeg(ms, c.latitude_deg, c.longitude_deg);
      surfaceLight = clearSkyParAtSurface(elevation);
      solarHour = (((ms / 3.6e6 + c.longitude_deg / 15) % 24) + 24) % 24;
    }
    for (let k = 0; k < orgs.length; k++) {
      const o = orgs[k]!;
      const up = o.swimMode !== SWIM_NONE && swimsUp(o, elevation, solarHour);
      setFaceTransport(col, o, up);
      if (stepTransport(col, o, dt, bedStressPa) !== TRANSPORT_OK) return 'solver-failed';
      applyGrowth(o, dt, surfaceLight);
    }
  }

  // Running maxima of the scalar diagnostics.
  const n = run.grid.layers;
  const meanSpeed = Math.sqrt(col.depthMeanU * col.depthMeanU + col.depthMeanV * col.depthMeanV);
  const ut = col.u[n - 1]!;
  const vt = col.v[n - 1]!;
  const surfaceSpeed = Math.sqrt(ut * ut + vt * vt);
  if (bedStressPa > run.bedStressMax) run.bedStressMax = bedStressPa;
  if (meanSpeed > run.depthMeanSpeedMax) run.depthMeanSpeedMax = meanSpeed;
  if (surfaceSpeed > run.surfaceSpeedMax) run.surfaceSpeedMax = surfaceSpeed;
  run.steps++;
  return 'ok';
}

/** Stores the state at output index k; returns false if a value is not finite. */
function record(run: ModelRun, k: number): boolean {
  const r = run.result;
  const col = run.column;
  const g = run.grid;
  const n = g.layers;
  const base = k * n;
  let check = 0;
  let su = 0;
  let sv = 0;
  for (let i = 0; i < n; i++) {
    const layer = n - 1 - i;
    const ui = col.u[layer]!;
    const vi = col.v[layer]!;
    const nui = 0.5 * (col.nu[layer]! + col.nu[layer + 1]!);
    r.u[base + i] = ui;
    r.v[base + i] = vi;
    r.eddyViscosity[base + i] = nui;
    if (nui > run.eddyViscosityMax) run.eddyViscosityMax = nui;
    su += g.thickness[layer]! * ui;
    sv += g.thickness[layer]! * vi;
    check += ui + vi + nui;
  }
  const rho = run.modelCase.water_density_kg_m3;
  r.bedStressPa[k] = rho * Math.sqrt(col.bedStressX * col.bedStressX + col.bedStressY * col.bedStressY);
  r.frictionVelocity[k] = col.frictionVelocity;
  r.depthMeanU[k] = su / g.depth;
  r.depthMeanV[k] = sv / g.depth;
  r.surfaceU[k] = col.u[n - 1]!;
  r.surfaceV[k] = col.v[n - 1]!;
  const tenth = 0.1 * g.depth;
  for (let q = 0; q < run.organisms.length; q++) {
    const o = run.organisms[q]!;
    const out = r.organisms[q]!;
    for (let i = 0; i < n; i++) {
      const ci = o.conc[n - 1 - i]!;
      out.concentration[base + i] = ci;
      check += ci;
    }
    out.total[k] = columnTotal(g, o.conc);
    out.bed[k] = o.bed;
    out.centreOfMassDepthM[k] = centreOfMassDepth(g, o.conc);
    out.shareBottomMetre[k] = shareNearBed(g, o.conc, 1);
    out.shareBottomTenth[k] = shareNearBed(g, o.conc, tenth);
    check += o.bed;
  }
  check += col.frictionVelocity;
  return Number.isFinite(check);
}

/** Where a run is up to: lets a caller step it in slices (e.g. to report progress between them). */
export interface RunCursor {
  /** Outputs stored so far. */
  stored: number;
  status: RunStatus;
}

export function startRun(run: ModelRun): RunCursor {
  return { stored: 1, status: record(run, 0) ? 'ok' : 'non-finite' };
}

/** Steps on by at most `maxOutputs` outputs; returns whether the run has ended (done or failed). */
export function advanceRun(run: ModelRun, cursor: RunCursor, maxOutputs: number, options: RunOptions = {}): boolean {
  const times = run.result.timeS;
  const dtMax = run.modelCase.time_step_s;
  const duration = run.modelCase.duration_s;
  const last = Math.min(times.length, cursor.stored + maxOutputs);
  for (let k = cursor.stored; k < last && cursor.status === 'ok'; k++) {
    const t0 = times[k - 1]!;
    const span = times[k]! - t0;
    const steps = Math.max(1, Math.ceil(span / dtMax - 1e-9));
    const dt = span / steps;
    for (let s = 0; s < steps && cursor.status === 'ok'; s++) cursor.status = stepRun(run, t0 + s * dt, dt);
    if (cursor.status !== 'ok') break;
    if (!record(run, k)) {
      cursor.status = 'non-finite';
      break;
    }
    cursor.stored = k + 1;
    options.onProgress?.(times[k]! / duration, times[k]!);
  }
  return cursor.status !== 'ok' || cursor.stored >= times.length;
}

/** Fills the result's status and summary once the run has ended. */
export function finishRun(run: ModelRun, cursor: RunCursor): ModelResult {
  const r = run.result;
  const stored = cursor.stored;
  r.status = cursor.status;
  const sm = r.summary;
  sm.steps = run.steps;
  sm.bedStressMaxPa = Math.max(run.bedStressMax, maxUpTo(r.bedStressPa, stored));
  sm.depthMeanSpeedMaxMS = run.depthMeanSpeedMax;
  sm.surfaceSpeedMaxMS = run.surfaceSpeedMax;
  sm.eddyViscosityMaxM2S = run.eddyViscosityMax;
  run.organisms.forEach((o, q) => {
    const out = r.organisms[q]!;
    const s = sm.organisms[q]!;
    s.totalInitial = out.total[0]!;
    s.totalFinal = out.total[stored - 1]!;
    s.bedFinal = o.bed;
  });
  return r;
}

/** Steps the run to the end, storing every output; returns the filled result. */
export function runToEnd(run: ModelRun, options: RunOptions = {}): ModelResult {
  const cursor = startRun(run);
  advanceRun(run, cursor, Number.MAX_SAFE_INTEGER, options);
  return finishRun(run, cursor);
}

function maxUpTo(values: Float64Array, count: number): number {
  let m = 0;
  for (let i = 0; i < count; i++) if (values[i]! > m) m = values[i]!;
  return m;
}
