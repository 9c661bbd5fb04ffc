/**
 * Harmonic analysis: least-squares fit of tidal constituents to a record.
 *
 * Model: y(t) = H0 + Σ f(t) [a cos Φ(t) + b sin Φ(t)], Φ = ω t + V0 + u, so
 * that a = H cos g and b = H sin g give the amplitude H and Greenwich phase g
 * directly (nodal corrections f, u and V0 as in prediction, refreshed per UTC
 * day by default). The normal equations XᵀX β = Xᵀy are accumulated sample by
 * sample and solved by Cholesky factorisation.
 *
 * Record checks (each refusal names the rule):
 * - at least `minPoints` valid samples (default 24) and at least twice the
 *   number of unknowns;
 * - span of the valid samples at least `minSpanHours` (default 24 h);
 * - missing fraction ≤ `maxMissingFraction` (default 0.3), counting against the
 *   samples expected at the median sampling interval over the span;
 * - longest gap between valid samples ≤ `maxGapFraction` × span (default 0.25).
 * A sample is missing when its value is not finite (NaN) or when it is absent
 * from a regular series.
 *
 * Which constituents are fitted (taken in the priority order of the standard
 * list; the others are dropped with a reason):
 * - Rayleigh criterion: |ω1 − ω2| T ≥ 360° × R against every constituent kept
 *   so far, T the span in hours, R = `rayleigh` (default 1);
 * - the same test against the mean (ω T ≥ 360° R), for long-period constituents;
 * - Nyquist: ω Δt < 180°, Δt the median sampling interval.
 *
 * Uncertainties are linearised standard errors from the residual variance
 * σ² = Σ r² / (n − p), with cov(β) = σ² (XᵀX)⁻¹, propagated to amplitude and
 * phase by first-order (delta-method) formulas. They assume white residuals;
 * tidal residuals are usually coloured, so read them as lower bounds.
 * Variance explained = 1 − Σ r² / Σ (y − ȳ)².
 */

import { CHOLESKY_OK, choleskyFactor, choleskyInverse, choleskySolve } from './cholesky.ts';
import { STANDARD_CONSTITUENTS, constituentSpeedDegPerH, resolveConstituentNames } from './constituents.ts';
import { ellipseFromComponents, type EllipseParameters } from './ellipse.ts';
import { createTerms, updateTerms, type TermOptions, type Terms } from './harmonic-sum.ts';
import type { TideErrorCode, TideFailure } from './predict.ts';

const MS_PER_H = 3_600_000;
const DEG = 180 / Math.PI;

export interface AnalysisOptions extends TermOptions {
  /** Rayleigh factor R. Default 1. */
  rayleigh?: number;
  minPoints?: number;
  minSpanHours?: number;
  maxMissingFraction?: number;
  maxGapFraction?: number;
}

export interface RecordSummary {
  samples: number;
  validSamples: number;
  spanHours: number;
  sampleIntervalMinutes: number;
  missingFraction: number;
  longestGapHours: number;
}

export interface DroppedConstituent {
  name: string;
  rule: 'rayleigh' | 'mean' | 'nyquist';
  /** The kept constituent it could not be separated from (Rayleigh rule). */
  conflictsWith: string | null;
  /** Record span needed to keep it, hours (Rayleigh and mean rules). */
  requiredHours: number | null;
  reason: string;
}

export interface FittedConstituent {
  name: string;
  speedDegPerH: number;
  amplitude: number;
  amplitudeSe: number;
  phaseDeg: number;
  phaseSeDeg: number;
}

export interface SeriesAnalysis {
  ok: true;
  mean: number;
  meanSe: number;
  constituents: FittedConstituent[];
  dropped: DroppedConstituent[];
  varianceExplained: number;
  residualRms: number;
  record: RecordSummary;
}

export interface FittedEllipse extends EllipseParameters {
  name: string;
  speedDegPerH: number;
  majorSe: number;
  minorSe: number;
  inclinationSeDeg: number;
  phaseSeDeg: number;
  east: Omit<FittedConstituent, 'name' | 'speedDegPerH'>;
  north: Omit<FittedConstituent, 'name' | 'speedDegPerH'>;
}

export interface CurrentAnalysis {
  ok: true;
  meanEast: number;
  meanNorth: number;
  constituents: FittedEllipse[];
  dropped: DroppedConstituent[];
  /** 1 − (Σ r_u² + Σ r_v²)/(Σ (u − ū)² + Σ (v − v̄)²). */
  varianceExplained: number;
  varianceExplainedEast: number;
  varianceExplainedNorth: number;
  residualRmsEast: number;
  residualRmsNorth: number;
  record: RecordSummary;
}

function fail(code: TideErrorCode, message: string): TideFailure {
  return { ok: false, code, message };
}

function fmt(x: number, digits = 1): string {
  return x.toFixed(digits);
}

interface Prepared {
  valid: Int32Array;
  record: RecordSummary;
  keep: Int32Array;
  dropped: DroppedConstituent[];
  terms: Terms;
}

/** Checks the record and chooses the constituents; shared by scalar and vector analysis. */
function prepare(
  timesMs: ArrayLike<number>,
  series: ArrayLike<number>[],
  names: readonly string[],
  options: AnalysisOptions,
): Prepared | TideFailure {
  const n = timesMs.length;
  for (const s of series) if (s.length !== n) return fail('invalid-input', `the record has ${n} times but ${s.length} values`);
  for (let i = 0; i < n; i++) {
    const t = timesMs[i]!;
    if (!Number.isFinite(t)) return fail('invalid-input', `time at index ${i} is not a valid time`);
    if (i > 0 && !(t > timesMs[i - 1]!)) return fail('invalid-input', `times must increase strictly (index ${i})`);
  }
  const resolved = resolveConstituentNames(names);
  if (!resolved.ok) return fail(resolved.code, resolved.message);
  const rayleigh = options.rayleigh ?? 1;
  if (!(rayleigh > 0)) return fail('invalid-input', 'the Rayleigh factor must be positive');

  const validList: number[] = [];
  for (let i = 0; i < n; i++) if (series.every((s) => Number.isFinite(s[i]!))) validList.push(i);
  const valid = Int32Array.from(validList);
  const minPoints = options.minPoints ?? 24;
  if (valid.length < Math.max(minPoints, 2)) {
    return fail('record-too-sparse', `the record has ${valid.length} valid samples; at least ${minPoints} are needed`);
  }
  const first = timesMs[valid[0]!]!;
  const last = timesMs[valid[valid.length - 1]!]!;
  const spanHours = (last - first) / MS_PER_H;
  const diffs: number[] = [];
  for (let i = 1; i < n; i++) diffs.push(timesMs[i]! - timesMs[i - 1]!);
  diffs.sort((x, y) => x - y);
  const dtMs = diffs[Math.floor(diffs.length / 2)]!;
  let longestGapMs = 0;
  for (let k = 1; k < valid.length; k++) longestGapMs = Math.max(longestGapMs, timesMs[valid[k]!]! - timesMs[valid[k - 1]!]!);
  const expected = Math.round((last - first) / dtMs) + 1;
  const record: RecordSummary = {
    samples: n,
    validSamples: valid.length,
    spanHours,
    sampleIntervalMinutes: dtMs / 60_000,
    missingFraction: Math.max(0, 1 - valid.length / expected),
    longestGapHours: longestGapMs / MS_PER_H,
  };
  const minSpan = options.minSpanHours ?? 24;
  if (spanHours < minSpan) {
    return fail('record-too-short', `the record spans ${fmt(spanHours)} h; at least ${fmt(minSpan)} h are needed`);
  }
  const maxMissing = options.maxMissingFraction ?? 0.3;
  if (record.missingFraction > maxMissing) {
    return fail(
      'record-too-gappy',
      `${fmt(100 * record.missingFraction)} % of the samples expected every ${fmt(record.sampleIntervalMinutes)} min are missing; at most ${fmt(100 * maxMissing)} % may be`,
    );
  }
  const maxGapFraction = options.maxGapFraction ?? 0.25;
  if (record.longestGapHours > maxGapFraction * spanHours) {
    return fail(
      'record-too-gappy',
      `the longest gap is ${fmt(record.longestGapHours)} h, more than ${fmt(100 * maxGapFraction, 0)} % of the ${fmt(spanHours)} h span`,
    );
  }

  // Constituent selection, in the priority order of the standard list.
  const order = Array.from(resolved.indices).sort((x, y) => x - y);
  const kept: number[] = [];
  const dropped: DroppedConstituent[] = [];
  const dtHours = dtMs / MS_PER_H;
  for (const index of order) {
    const def = STANDARD_CONSTITUENTS[index]!;
    const speed = constituentSpeedDegPerH(def);
    if (speed * dtHours >= 180) {
      dropped.push({
        name: def.name,
        rule: 'nyquist',
        conflictsWith: null,
        requiredHours: null,
        reason: `${def.name} (period ${fmt(360 / speed, 2)} h) is faster than the Nyquist limit of samples every ${fmt(record.sampleIntervalMinutes)} min`,
      });
      continue;
    }
    if (speed * spanHours < 360 * rayleigh) {
      const need = (360 * rayleigh) / speed;
      dropped.push({
        name: def.name,
        rule: 'mean',
        conflictsWith: null,
        requiredHours: need,
        reason: `${def.name} cannot be separated from the mean level in a ${fmt(spanHours)} h record: the Rayleigh criterion (R = ${rayleigh}) needs ${fmt(need)} h (${fmt(need / 24, 2)} d)`,
      });
      continue;
    }
    let worst = -1;
    let worstGap = Infinity;
    for (const k of kept) {
      const gap = Math.abs(speed - constituentSpeedDegPerH(STANDARD_CONSTITUENTS[k]!));
      if (gap * spanHours < 360 * rayleigh && gap < worstGap) {
        worst = k;
        worstGap = gap;
      }
    }
    if (worst >= 0) {
      const other = STANDARD_CONSTITUENTS[worst]!.name;
      const need = (360 * rayleigh) / worstGap;
      dropped.push({
        name: def.name,
        rule: 'rayleigh',
        conflictsWith: other,
        requiredHours: need,
        reason: `${def.name} cannot be separated from ${other} in a ${fmt(spanHours)} h record: the Rayleigh criterion (R = ${rayleigh}) needs ${fmt(need)} h (${fmt(need / 24, 2)} d)`,
      });
      continue;
    }
    kept.push(index);
  }
  if (kept.length === 0) {
    return fail('nothing-resolvable', `none of the constituents can be resolved: ${dropped.map((d) => d.reason).join('; ')}`);
  }
  const p = 1 + 2 * kept.length;
  if (valid.length < 2 * p) {
    return fail('record-too-sparse', `the record has ${valid.length} valid samples; fitting ${kept.length} constituents needs at least ${2 * p}`);
  }
  const keep = Int32Array.from(kept);
  const ones = new Float64Array(keep.length).fill(1);
  const zeros = new Float64Array(keep.length);
  const terms = createTerms(keep, ones, zeros, null, null, options);
  return { valid, record, keep, dropped, terms };
}

/** Fills x (length p) with the regressors at tMs: 1, f cos Φ, f sin Φ, … */
function regressors(terms: Terms, tMs: number, x: Float64Array): void {
  updateTerms(terms, tMs);
  const hours = (tMs - terms.chunkStartMs) / MS_PER_H;
  x[0] = 1;
  for (let k = 0; k < terms.n; k++) {
    const phi = terms.omega[k]! * hours + terms.arg0[k]!;
    const f = terms.fa[k]!;
    x[1 + 2 * k] = f * Math.cos(phi);
    x[2 + 2 * k] = f * Math.sin(phi);
  }
}

interface Solved {
  /** One coefficient vector per series. */
  beta: Float64Array[];
  /** (XᵀX)⁻¹, p × p. */
  inverse: Float64Array;
  /** Residual sums of squares and cross-products, per pair of series (row-major, m × m). */
  residualProducts: Float64Array;
  totalSumSquares: Float64Array;
  dof: number;
}

function solve(timesMs: ArrayLike<number>, series: ArrayLike<number>[], prepared: Prepared): Solved | TideFailure {
  const { valid, terms } = prepared;
  const p = 1 + 2 * terms.n;
  const m = series.length;
  const normal = new Float64Array(p * p);
  const rhs = series.map(() => new Float64Array(p));
  const x = new Float64Array(p);
  const means = new Float64Array(m);
  for (let k = 0; k < valid.length; k++) {
    const i = valid[k]!;
    regressors(terms, timesMs[i]!, x);
    for (let r = 0; r < p; r++) {
      const xr = x[r]!;
      for (let c = 0; c <= r; c++) normal[r * p + c] = normal[r * p + c]! + xr * x[c]!;
    }
    for (let s = 0; s < m; s++) {
      const y = series[s]![i]!;
      means[s] = means[s]! + y;
      const b = rhs[s]!;
      for (let r = 0; r < p; r++) b[r] = b[r]! + x[r]! * y;
    }
  }
  for (let s = 0; s < m; s++) means[s] = means[s]! / valid.length;
  if (choleskyFactor(p, normal) !== CHOLESKY_OK) {
    return fail('singular-system', 'the normal equations are singular: the record cannot tell these constituents apart (too gappy or too short)');
  }
  for (const b of rhs) choleskySolve(p, normal, b);
  const inverse = new Float64Array(p * p);
  choleskyInverse(p, normal, inverse, new Float64Array(p));
  const residualProducts = new Float64Array(m * m);
  const totalSumSquares = new Float64Array(m);
  const resid = new Float64Array(m);
  for (let k = 0; k < valid.length; k++) {
    const i = valid[k]!;
    regressors(terms, timesMs[i]!, x);
    for (let s = 0; s < m; s++) {
      const b = rhs[s]!;
      let fit = 0;
      for (let r = 0; r < p; r++) fit += x[r]! * b[r]!;
      const y = series[s]![i]!;
      resid[s] = y - fit;
      totalSumSquares[s] = totalSumSquares[s]! + (y - means[s]!) ** 2;
    }
    for (let s = 0; s < m; s++) {
      for (let q = 0; q < m; q++) residualProducts[s * m + q] = residualProducts[s * m + q]! + resid[s]! * resid[q]!;
    }
  }
  return { beta: rhs, inverse, residualProducts, totalSumSquares, dof: valid.length - p };
}

function amplitudePhase(a: number, b: number, caa: number, cab: number, cbb: number): Omit<FittedConstituent, 'name' | 'speedDegPerH'> {
  const H = Math.hypot(a, b);
  const g = ((Math.atan2(b, a) * DEG) % 360 + 360) % 360;
  const H2 = H * H;
  const varH = H > 0 ? (a * a * caa + 2 * a * b * cab + b * b * cbb) / H2 : caa;
  const varG = H > 0 ? (b * b * caa - 2 * a * b * cab + a * a * cbb) / (H2 * H2) : Infinity;
  return { amplitude: H, amplitudeSe: Math.sqrt(Math.max(0, varH)), phaseDeg: g, phaseSeDeg: Math.sqrt(Math.max(0, varG)) * DEG };
}

/**
 * Fits the named constituents to a scalar record (water level, or a current
 * along one axis). values may contain NaN for missing samples.
 */
export function analyseSeries(
  timesMs: ArrayLike<number>,
  values: ArrayLike<number>,
  names: readonly string[],
  options: AnalysisOptions = {},
): SeriesAnalysis | TideFailure {
  const prepared = prepare(timesMs, [values], names, options);
  if ('ok' in prepared) return prepared;
  const solved = solve(timesMs, [values], prepared);
  if ('ok' in solved) return solved;
  const p = 1 + 2 * prepared.keep.length;
  const beta = solved.beta[0]!;
  const sigma2 = solved.residualProducts[0]! / solved.dof;
  const cov = (r: number, c: number): number => sigma2 * solved.inverse[r * p + c]!;
  const constituents: FittedConstituent[] = [];
  prepared.keep.forEach((index, k) => {
    const def = STANDARD_CONSTITUENTS[index]!;
    const ia = 1 + 2 * k;
    const ib = ia + 1;
    constituents.push({
      name: def.name,
      speedDegPerH: constituentSpeedDegPerH(def),
      ...amplitudePhase(beta[ia]!, beta[ib]!, cov(ia, ia), cov(ia, ib), cov(ib, ib)),
    });
  });
  const sst = solved.totalSumSquares[0]!;
  return {
    ok: true,
    mean: beta[0]!,
    meanSe: Math.sqrt(cov(0, 0)),
    constituents,
    dropped: prepared.dropped,
    varianceExplained: sst > 0 ? 1 - solved.residualProducts[0]! / sst : 1,
    residualRms: Math.sqrt(solved.residualProducts[0]! / prepared.valid.length),
    record: prepared.record,
  };
}

function wrapDiff(deg: number): number {
  const r = ((deg % 360) + 540) % 360;
  return r - 180;
}

/**
 * Fits the named constituents to a current record given as east (u) and north
 * (v) components (NaN for missing), each component separately, and converts
 * the result to tidal ellipses. Ellipse uncertainties are propagated from the
 * joint covariance of the four cosine/sine coefficients (including the
 * correlation of the u and v residuals) through a numerical Jacobian.
 */
export function analyseCurrent(
  timesMs: ArrayLike<number>,
  east: ArrayLike<number>,
  north: ArrayLike<number>,
  names: readonly string[],
  options: AnalysisOptions = {},
): CurrentAnalysis | TideFailure {
  const prepared = prepare(timesMs, [east, north], names, options);
  if ('ok' in prepared) return prepared;
  const solved = solve(timesMs, [east, north], prepared);
  if ('ok' in solved) return solved;
  const p = 1 + 2 * prepared.keep.length;
  const bu = solved.beta[0]!;
  const bv = solved.beta[1]!;
  const suu = solved.residualProducts[0]! / solved.dof;
  const suv = solved.residualProducts[1]! / solved.dof;
  const svv = solved.residualProducts[3]! / solved.dof;
  const inv = (r: number, c: number): number => solved.inverse[r * p + c]!;
  const ellipseOf = (au: number, buu: number, av: number, bvv: number): number[] => {
    const e = ellipseFromComponents({
      uAmplitude: Math.hypot(au, buu),
      uPhaseDeg: Math.atan2(buu, au) * DEG,
      vAmplitude: Math.hypot(av, bvv),
      vPhaseDeg: Math.atan2(bvv, av) * DEG,
    });
    return [e.major, e.minor, e.inclinationDeg, e.phaseDeg];
  };
  const constituents: FittedEllipse[] = [];
  prepared.keep.forEach((index, k) => {
    const def = STANDARD_CONSTITUENTS[index]!;
    const ia = 1 + 2 * k;
    const ib = ia + 1;
    const params = [bu[ia]!, bu[ib]!, bv[ia]!, bv[ib]!];
    const rows = [ia, ib, ia, ib];
    const scale = [suu, suu, svv, svv];
    // Joint covariance of (a_u, b_u, a_v, b_v): σ_xy (XᵀX)⁻¹ blocks.
    const C = new Float64Array(16);
    for (let r = 0; r < 4; r++) {
      for (let c = 0; c < 4; c++) {
        const s = r < 2 === c < 2 ? scale[r]! : suv;
        C[r * 4 + c] = s * inv(rows[r]!, rows[c]!);
      }
    }
    const base = ellipseOf(params[0]!, params[1]!, params[2]!, params[3]!);
    const h = 1e-6 * Math.max(base[0]!, 1e-9);
    const J = new Float64Array(16);
    for (let c = 0; c < 4; c++) {
      const plus = params.slice();
      const minus = params.slice();
      plus[c] = plus[c]! + h;
      minus[c] = minus[c]! - h;
      const ep = ellipseOf(plus[0]!, plus[1]!, plus[2]!, plus[3]!);
      const em = ellipseOf(minus[0]!, minus[1]!, minus[2]!, minus[3]!);
      // Keep the perturbed ellipses on the same branch as the base (θ and θ + 180° with g + 180°).
      for (const e of [ep, em]) {
        if (Math.abs(wrapDiff(e[2]! - base[2]!)) > 90) {
          e[2] = e[2]! + 180;
          e[3] = e[3]! + 180;
        }
      }
      for (let r = 0; r < 4; r++) {
        const d = r >= 2 ? wrapDiff(ep[r]! - em[r]!) : ep[r]! - em[r]!;
        J[r * 4 + c] = d / (2 * h);
      }
    }
    const se: number[] = [];
    for (let r = 0; r < 4; r++) {
      let v = 0;
      for (let a = 0; a < 4; a++) for (let b = 0; b < 4; b++) v += J[r * 4 + a]! * C[a * 4 + b]! * J[r * 4 + b]!;
      se.push(Math.sqrt(Math.max(0, v)));
    }
    constituents.push({
      name: def.name,
      speedDegPerH: constituentSpeedDegPerH(def),
      major: base[0]!,
      minor: base[1]!,
      inclinationDeg: base[2]!,
      phaseDeg: base[3]!,
      majorSe: se[0]!,
      minorSe: se[1]!,
      inclinationSeDeg: se[2]!,
      phaseSeDeg: se[3]!,
      east: amplitudePhase(bu[ia]!, bu[ib]!, suu * inv(ia, ia), suu * inv(ia, ib), suu * inv(ib, ib)),
      north: amplitudePhase(bv[ia]!, bv[ib]!, svv * inv(ia, ia), svv * inv(ia, ib), svv * inv(ib, ib)),
    });
  });
  const [sstU, sstV] = [solved.totalSumSquares[0]!, solved.totalSumSquares[1]!];
  const [ssrU, ssrV] = [solved.residualProducts[0]!, solved.residualProducts[3]!];
  const nValid = prepared.valid.length;
  return {
    ok: true,
    meanEast: bu[0]!,
    meanNorth: bv[0]!,
    constituents,
    dropped: prepared.dropped,
    varianceExplained: sstU + sstV > 0 ? 1 - (ssrU + ssrV) / (sstU + sstV) : 1,
    varianceExplainedEast: sstU > 0 ? 1 - ssrU / sstU : 1,
    varianceExplainedNorth: sstV > 0 ? 1 - ssrV / sstV : 1,
    residualRmsEast: Math.sqrt(ssrU / nValid),
    residualRmsNorth: Math.sqrt(ssrV / nValid),
    record: prepared.record,
  };
}
