/**
 * The harmonic sum, evaluated term by term from precomputed arrays.
 *
 * Convention (NOAA / IHO): h(t) = H0 + Σ f H cos(ω (t − t0) + (V0 + u) − g),
 * with V0 the Greenwich equilibrium argument at t0, g the Greenwich phase lag
 * (degrees) and ω the speed (degrees per hour).
 *
 * Nodal corrections are refreshed per chunk of time: per UTC day by default
 * ('day'), or per UTC hour ('hour'). Within a chunk, V0 is taken at the start
 * of the chunk and f, u at its middle; the argument then advances at the
 * constituent's speed. f and u change by less than 0.01 % and 0.01° per day.
 *
 * With `astronomical: false` the sum is a plain sum of cosines: f = 1,
 * V0 + u = 0 and t0 = epochMs (used for synthetic checks).
 *
 * Nothing here allocates after createTerms.
 */

import { STANDARD_CONSTITUENTS, constituentSpeedDegPerH } from './constituents.ts';
import { astronomicalState, constituentNodalFactor, equilibriumArgumentDeg } from './nodal.ts';

const RAD = Math.PI / 180;
const MS_PER_H = 3_600_000;

export type NodalUpdate = 'day' | 'hour';

export interface TermOptions {
  /** How often f, u and V0 are refreshed. Default 'day'. */
  nodalUpdate?: NodalUpdate;
  /** false: no astronomical arguments (f = 1, V0 + u = 0, time from epochMs). Default true. */
  astronomical?: boolean;
  /** Time origin when astronomical is false, UTC ms. Default 0. */
  epochMs?: number;
}

export interface Terms {
  readonly n: number;
  /** Indices into STANDARD_CONSTITUENTS. */
  readonly index: Int32Array;
  /** Speed, radians per hour. */
  readonly omega: Float64Array;
  /** Amplitude (level) or major semi-axis (current). */
  readonly amplitude: Float64Array;
  /** Signed minor semi-axis (positive anticlockwise); zero for levels. */
  readonly minor: Float64Array;
  readonly cosInc: Float64Array;
  readonly sinInc: Float64Array;
  /** Greenwich phase lag g, radians. */
  readonly phase: Float64Array;
  /** f × amplitude, f × minor, and V0 + u − g (radians) for the current chunk. */
  readonly fa: Float64Array;
  readonly fb: Float64Array;
  readonly arg0: Float64Array;
  chunkStartMs: number;
  chunkKey: number;
  readonly chunkMs: number;
  readonly astronomical: boolean;
}

/**
 * Builds the term arrays. `index` must hold valid indices (see resolveConstituentNames).
 * minor and inclinationDeg may be null (a level, or a rectilinear current).
 */
export function createTerms(
  index: Int32Array,
  amplitude: ArrayLike<number>,
  phaseDeg: ArrayLike<number>,
  minor: ArrayLike<number> | null,
  inclinationDeg: ArrayLike<number> | null,
  options: TermOptions = {},
): Terms {
  const n = index.length;
  const terms: Terms = {
    n,
    index: Int32Array.from(index),
    omega: new Float64Array(n),
    amplitude: Float64Array.from(amplitude),
    minor: minor ? Float64Array.from(minor) : new Float64Array(n),
    cosInc: new Float64Array(n),
    sinInc: new Float64Array(n),
    phase: new Float64Array(n),
    fa: new Float64Array(n),
    fb: new Float64Array(n),
    arg0: new Float64Array(n),
    chunkStartMs: Number.NaN,
    chunkKey: Number.NaN,
    chunkMs: (options.nodalUpdate ?? 'day') === 'hour' ? MS_PER_H : 24 * MS_PER_H,
    astronomical: options.astronomical ?? true,
  };
  for (let k = 0; k < n; k++) {
    const def = STANDARD_CONSTITUENTS[index[k]!]!;
    terms.omega[k] = constituentSpeedDegPerH(def) * RAD;
    terms.phase[k] = phaseDeg[k]! * RAD;
    const inc = inclinationDeg ? inclinationDeg[k]! * RAD : 0;
    terms.cosInc[k] = Math.cos(inc);
    terms.sinInc[k] = Math.sin(inc);
  }
  if (!terms.astronomical) {
    terms.chunkStartMs = options.epochMs ?? 0;
    terms.chunkKey = 0;
    for (let k = 0; k < n; k++) {
      terms.fa[k] = terms.amplitude[k]!;
      terms.fb[k] = terms.minor[k]!;
      terms.arg0[k] = -terms.phase[k]!;
    }
  }
  return terms;
}

/** Makes sure the chunk-dependent arrays hold the chunk that contains tMs. */
export function updateTerms(terms: Terms, tMs: number): void {
  if (!terms.astronomical) return;
  const key = Math.floor(tMs / terms.chunkMs);
  if (key === terms.chunkKey) return;
  const start = key * terms.chunkMs;
  const atStart = astronomicalState(start);
  const atMiddle = astronomicalState(start + terms.chunkMs / 2);
  for (let k = 0; k < terms.n; k++) {
    const def = STANDARD_CONSTITUENTS[terms.index[k]!]!;
    const nodal = constituentNodalFactor(def, atMiddle.fundamentals);
    const v0 = equilibriumArgumentDeg(def, atStart.longitudes);
    terms.fa[k] = nodal.f * terms.amplitude[k]!;
    terms.fb[k] = nodal.f * terms.minor[k]!;
    terms.arg0[k] = (v0 + nodal.u) * RAD - terms.phase[k]!;
  }
  terms.chunkKey = key;
  terms.chunkStartMs = start;
}

/** Σ f H cos(arg) at tMs (no mean level). */
export function sumAt(terms: Terms, tMs: number): number {
  updateTerms(terms, tMs);
  const hours = (tMs - terms.chunkStartMs) / MS_PER_H;
  let s = 0;
  for (let k = 0; k < terms.n; k++) s += terms.fa[k]! * Math.cos(terms.omega[k]! * hours + terms.arg0[k]!);
  return s;
}

/** d/dt of sumAt, per hour. */
export function sumRateAt(terms: Terms, tMs: number): number {
  updateTerms(terms, tMs);
  const hours = (tMs - terms.chunkStartMs) / MS_PER_H;
  let s = 0;
  for (let k = 0; k < terms.n; k++) {
    const w = terms.omega[k]!;
    s -= terms.fa[k]! * w * Math.sin(w * hours + terms.arg0[k]!);
  }
  return s;
}

/**
 * Current vector at tMs: writes [u, v, du/dt, dv/dt] (east, north, per hour) into out.
 * Each constituent traces its ellipse: along its major axis f·A cos φ, across it f·B sin φ,
 * rotated anticlockwise from east by the inclination.
 */
export function currentAt(terms: Terms, tMs: number, out: Float64Array): void {
  updateTerms(terms, tMs);
  const hours = (tMs - terms.chunkStartMs) / MS_PER_H;
  let u = 0;
  let v = 0;
  let du = 0;
  let dv = 0;
  for (let k = 0; k < terms.n; k++) {
    const w = terms.omega[k]!;
    const phi = w * hours + terms.arg0[k]!;
    const cp = Math.cos(phi);
    const sp = Math.sin(phi);
    const a = terms.fa[k]!;
    const b = terms.fb[k]!;
    const ci = terms.cosInc[k]!;
    const si = terms.sinInc[k]!;
    const major = a * cp;
    const minor = b * sp;
    const dMajor = -a * w * sp;
    const dMinor = b * w * cp;
    u += major * ci - minor * si;
    v += major * si + minor * ci;
    du += dMajor * ci - dMinor * si;
    dv += dMajor * si + dMinor * ci;
  }
  out[0] = u;
  out[1] = v;
  out[2] = du;
  out[3] = dv;
}
