/**
 * Prediction of water level and of the depth-mean tidal current.
 *
 * Level:   h(t) = datum + Σ f H cos(ω t + (V0 + u) − g)       (NOAA / IHO)
 * Current: each constituent is a tidal ellipse (major A, signed minor B with
 *          B > 0 anticlockwise, inclination θ of the major axis in degrees
 *          anticlockwise from east, Greenwich phase g); at phase
 *          φ = ω t + (V0 + u) − g the vector is f·(A cos φ, B sin φ) in the
 *          ellipse frame, rotated by θ.
 * Units are those of the amplitudes (m for level, m/s for current); times are
 * UTC epoch milliseconds (or Date); phases and angles in degrees.
 */

import { resolveConstituentNames } from './constituents.ts';
import { createTerms, currentAt, sumAt, type TermOptions, type Terms } from './harmonic-sum.ts';

export interface LevelConstituent {
  name: string;
  /** Amplitude H, in the unit of the result (normally m). */
  amplitude: number;
  /** Greenwich phase lag g, degrees. */
  phaseDeg: number;
}

export interface CurrentConstituent {
  name: string;
  /** Semi-major axis (amplitude along the major axis), m/s, ≥ 0. */
  major: number;
  /** Signed semi-minor axis, m/s: positive = anticlockwise rotation. Default 0 (rectilinear). */
  minor?: number;
  /** Direction of the major axis, degrees anticlockwise from east. Omit for along-axis only. */
  inclinationDeg?: number;
  /** Greenwich phase lag g, degrees. */
  phaseDeg: number;
}

export type TideErrorCode =
  | 'unknown-constituent'
  | 'duplicate-constituent'
  | 'invalid-input'
  | 'record-too-short'
  | 'record-too-sparse'
  | 'record-too-gappy'
  | 'nothing-resolvable'
  | 'singular-system';

export interface TideFailure {
  ok: false;
  code: TideErrorCode;
  message: string;
}

export type TimesInput = ArrayLike<number> | readonly Date[];

export interface PredictLevelOptions extends TermOptions {
  /** Mean level above the datum of the result (Z0), added to every value. Default 0. */
  datum?: number;
}

export interface PredictCurrentOptions extends TermOptions {
  /** Axis for the along/across components, degrees anticlockwise from east. */
  axisDeg?: number;
}

export interface LevelPrediction {
  ok: true;
  timesMs: Float64Array;
  values: Float64Array;
}

export interface CurrentPrediction {
  ok: true;
  timesMs: Float64Array;
  /** Component along the main axis (positive toward axisDeg). */
  along: Float64Array;
  /** Component across the main axis (positive 90° anticlockwise of it). */
  across: Float64Array;
  speed: Float64Array;
  /** East and north components; null when no inclinations were given. */
  east: Float64Array | null;
  north: Float64Array | null;
  /** Main axis, degrees anticlockwise from east; null when no inclinations were given. */
  axisDeg: number | null;
}

function fail(code: TideErrorCode, message: string): TideFailure {
  return { ok: false, code, message };
}

/** Converts times to a Float64Array of UTC ms, or reports the first bad entry. */
export function toTimesMs(times: TimesInput): Float64Array | TideFailure {
  const out = new Float64Array(times.length);
  for (let i = 0; i < times.length; i++) {
    const t = (times as ArrayLike<number | Date>)[i];
    const ms = t instanceof Date ? t.getTime() : t;
    if (typeof ms !== 'number' || !Number.isFinite(ms)) return fail('invalid-input', `time at index ${i} is not a valid time`);
    out[i] = ms;
  }
  return out;
}

function isFiniteNumber(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

/** Validates level constituents and builds their term arrays. */
export function levelTerms(constituents: readonly LevelConstituent[], options: TermOptions = {}): Terms | TideFailure {
  const resolved = resolveConstituentNames(constituents.map((c) => c.name));
  if (!resolved.ok) return fail(resolved.code, resolved.message);
  for (const c of constituents) {
    if (!isFiniteNumber(c.amplitude) || c.amplitude < 0) return fail('invalid-input', `${c.name}: amplitude must be a finite number ≥ 0`);
    if (!isFiniteNumber(c.phaseDeg)) return fail('invalid-input', `${c.name}: phase must be a finite number of degrees`);
  }
  return createTerms(
    resolved.indices,
    constituents.map((c) => c.amplitude),
    constituents.map((c) => c.phaseDeg),
    null,
    null,
    options,
  );
}

export interface CurrentTerms {
  terms: Terms;
  /** True when inclinations were given, so east/north are meaningful. */
  oriented: boolean;
  /** True when every constituent is rectilinear along one common axis. */
  rectilinear: boolean;
  /** Main axis, degrees anticlockwise from east (0 when not oriented). */
  axisDeg: number;
}

/**
 * Validates current constituents and builds their term arrays. Inclinations
 * must be given for all constituents or for none.
 */
export function currentTerms(
  constituents: readonly CurrentConstituent[],
  options: PredictCurrentOptions = {},
): CurrentTerms | TideFailure {
  const resolved = resolveConstituentNames(constituents.map((c) => c.name));
  if (!resolved.ok) return fail(resolved.code, resolved.message);
  const withInclination = constituents.filter((c) => c.inclinationDeg !== undefined).length;
  if (withInclination !== 0 && withInclination !== constituents.length) {
    const missing = constituents.filter((c) => c.inclinationDeg === undefined).map((c) => c.name);
    return fail('invalid-input', `inclination is given for some constituents but not for ${missing.join(', ')}`);
  }
  for (const c of constituents) {
    if (!isFiniteNumber(c.major) || c.major < 0) return fail('invalid-input', `${c.name}: major axis must be a finite number ≥ 0`);
    const minor = c.minor ?? 0;
    if (!isFiniteNumber(minor) || Math.abs(minor) > c.major) {
      return fail('invalid-input', `${c.name}: minor axis must be finite and no larger than the major axis`);
    }
    if (!isFiniteNumber(c.phaseDeg)) return fail('invalid-input', `${c.name}: phase must be a finite number of degrees`);
    if (c.inclinationDeg !== undefined && !isFiniteNumber(c.inclinationDeg)) {
      return fail('invalid-input', `${c.name}: inclination must be a finite number of degrees`);
    }
  }
  if (options.axisDeg !== undefined && !isFiniteNumber(options.axisDeg)) return fail('invalid-input', 'axis must be a finite number of degrees');
  const oriented = withInclination > 0;
  let axisDeg = options.axisDeg ?? 0;
  if (oriented && options.axisDeg === undefined) {
    let biggest = -1;
    for (const c of constituents) {
      if (c.major > biggest) {
        biggest = c.major;
        axisDeg = c.inclinationDeg ?? 0;
      }
    }
  }
  const inc0 = constituents[0]?.inclinationDeg ?? 0;
  const rectilinear = constituents.every(
    (c) => (c.minor ?? 0) === 0 && Math.abs(Math.sin(((c.inclinationDeg ?? 0) - inc0) * (Math.PI / 180))) < 1e-12,
  );
  const terms = createTerms(
    resolved.indices,
    constituents.map((c) => c.major),
    constituents.map((c) => c.phaseDeg),
    constituents.map((c) => c.minor ?? 0),
    constituents.map((c) => c.inclinationDeg ?? 0),
    options,
  );
  return { terms, oriented, rectilinear, axisDeg };
}

/** Predicted water level at each time, in the unit of the amplitudes, above the datum. */
export function predictLevel(
  constituents: readonly LevelConstituent[],
  times: TimesInput,
  options: PredictLevelOptions = {},
): LevelPrediction | TideFailure {
  const datum = options.datum ?? 0;
  if (!isFiniteNumber(datum)) return fail('invalid-input', 'datum must be a finite number');
  const timesMs = toTimesMs(times);
  if (!(timesMs instanceof Float64Array)) return timesMs;
  const terms = levelTerms(constituents, options);
  if ('ok' in terms) return terms;
  const values = new Float64Array(timesMs.length);
  for (let i = 0; i < timesMs.length; i++) values[i] = datum + sumAt(terms, timesMs[i]!);
  return { ok: true, timesMs, values };
}

/**
 * Predicted depth-mean current at each time. Without inclinations the result
 * is along the main axis only (across holds the minor-axis part, if given);
 * with them, east and north are given too.
 */
export function predictCurrent(
  constituents: readonly CurrentConstituent[],
  times: TimesInput,
  options: PredictCurrentOptions = {},
): CurrentPrediction | TideFailure {
  const timesMs = toTimesMs(times);
  if (!(timesMs instanceof Float64Array)) return timesMs;
  const prepared = currentTerms(constituents, options);
  if ('ok' in prepared) return prepared;
  const { terms, oriented, axisDeg } = prepared;
  const n = timesMs.length;
  const along = new Float64Array(n);
  const across = new Float64Array(n);
  const speed = new Float64Array(n);
  const east = oriented ? new Float64Array(n) : null;
  const north = oriented ? new Float64Array(n) : null;
  const axis = (axisDeg * Math.PI) / 180;
  const ca = oriented ? Math.cos(axis) : 1;
  const sa = oriented ? Math.sin(axis) : 0;
  const out = new Float64Array(4);
  for (let i = 0; i < n; i++) {
    currentAt(terms, timesMs[i]!, out);
    const u = out[0]!;
    const v = out[1]!;
    if (east && north) {
      east[i] = u;
      north[i] = v;
    }
    along[i] = u * ca + v * sa;
    across[i] = -u * sa + v * ca;
    speed[i] = Math.hypot(u, v);
  }
  return { ok: true, timesMs, along, across, speed, east, north, axisDeg: oriented ? axisDeg : null };
}

/** Regular times from startMs to endMs inclusive, every stepMs. */
export function regularTimes(startMs: number, endMs: number, stepMs: number): Float64Array {
  const count = Math.floor((endMs - startMs) / stepMs + 1e-9) + 1;
  const out = new Float64Array(Math.max(0, count));
  for (let i = 0; i < out.length; i++) out[i] = startMs + i * stepMs;
  return out;
}
