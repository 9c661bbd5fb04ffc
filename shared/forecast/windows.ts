/**
 * Forecast windows (definitions: docs/windows.md): slack, slump, mixed and subsurface peak, found on
 * a ForecastGrid. Each criterion is a series over the output times; a window is a run of outputs
 * that meet it, with its edges placed by linear interpolation where the criterion crosses its
 * threshold, so edges are not tied to the output interval. Pure: no clocks, no I/O.
 */
import { depthMeanConcentration, gridTimeMs, rangeMeanConcentration, type ForecastGrid } from './grid.ts';
import type { WindowSettings } from './window-settings.ts';

export type WindowKind = 'slack' | 'slump' | 'mixed' | 'subsurface_peak';
/** For a slack: which way the depth-mean current turns through it. */
export type TideStage = 'before_flood' | 'before_ebb';

export interface ForecastWindow {
  kind: WindowKind;
  /** UTC epoch ms. */
  startMs: number;
  endMs: number;
  peakMs: number;
  /**
   * slack: 1 − (lowest depth-mean speed)/threshold, 0…1 (1 = the current stops);
   * slump: the highest near-bed ratio; mixed: 1 − (lowest CV)/threshold, 0…1 (1 = uniform);
   * subsurface_peak: the highest peak ratio.
   */
  strength: number;
  /** The criterion at the peak output: m/s for slack, a ratio for slump and subsurface_peak, the CV for mixed. */
  peakValue: number;
  /** slump: the near-bed sampling depth; subsurface_peak: the layer of the peak; m below the surface. */
  peakDepthM?: number;
  /** slack only, when the depth-mean along-axis current changes sign inside the window. */
  tideStage?: TideStage;
  /** True when the window is cut by the start or the end of the forecast. */
  clipped: boolean;
}

/** The criteria of every window kind at each output time (NaN where a criterion is undefined). */
export interface ColumnSeries {
  /** Depth-mean concentration, cells/L. */
  depthMean: Float64Array;
  /** Mean over the bottom `slumpNearBedM` divided by the depth mean. */
  nearBedRatio: Float64Array;
  /** Thickness-weighted coefficient of variation of concentration over depth. */
  cv: Float64Array;
  /**
   * Largest concentration away from surface and bed over the depth mean when it is a true interior
   * maximum; at most 1 when the largest value sits at the edge of the band; NaN without such layers.
   */
  subsurfaceRatio: Float64Array;
  /** Depth of that maximum, m below the surface (NaN unless it is a true interior maximum). */
  subsurfaceDepthM: Float64Array;
}

/** A run of outputs meeting a criterion, with interpolated edges. */
export interface Interval {
  startMs: number;
  endMs: number;
  /** First and last output index inside. */
  first: number;
  last: number;
  clippedStart: boolean;
  clippedEnd: boolean;
}

type TimeAxis = Pick<ForecastGrid, 'startMs' | 'stepMs' | 'nt'>;

const MS_PER_MIN = 60_000;

/** Computes every window criterion at every output time. */
export function columnSeries(grid: ForecastGrid, settings: WindowSettings): ColumnSeries {
  const { nt, nz, waterDepthM } = grid;
  const depthMean = new Float64Array(nt);
  const nearBedRatio = new Float64Array(nt);
  const cv = new Float64Array(nt);
  const subsurfaceRatio = new Float64Array(nt);
  const subsurfaceDepthM = new Float64Array(nt);
  const nearBedTop = Math.max(0, waterDepthM - settings.slumpNearBedM);
  const margin = settings.subsurfaceMarginM;
  for (let i = 0; i < nt; i++) {
    const mean = depthMeanConcentration(grid, i);
    depthMean[i] = mean;
    subsurfaceRatio[i] = Number.NaN;
    subsurfaceDepthM[i] = Number.NaN;
    if (!(mean > 0)) {
      // No cells: no concentration window is defined.
      nearBedRatio[i] = Number.NaN;
      cv[i] = Number.NaN;
      continue;
    }
    nearBedRatio[i] = rangeMeanConcentration(grid, i, nearBedTop, waterDepthM) / mean;
    let variance = 0;
    let interiorFirst = -1;
    let interiorLast = -1;
    let best = -1;
    for (let k = 0; k < nz; k++) {
      const c = grid.concentration[i * nz + k]!;
      const d = c - mean;
      variance += grid.thicknessM[k]! * d * d;
      const depth = grid.depthM[k]!;
      if (depth > margin && depth < waterDepthM - margin) {
        if (interiorFirst < 0) interiorFirst = k;
        interiorLast = k;
        if (best < 0 || c > grid.concentration[i * nz + best]!) best = k;
      }
    }
    cv[i] = Math.sqrt(Math.max(0, variance / waterDepthM)) / mean;
    // A subsurface peak must be a maximum inside the band, not at its edge: a profile that
    // keeps rising toward the bed (a slump) or the surface is not a subsurface layer, and its
    // ratio counts as at most 1 (as if uniform), so window edges still interpolate.
    if (best >= 0) {
      const ratio = grid.concentration[i * nz + best]! / mean;
      if (best > interiorFirst && best < interiorLast) {
        subsurfaceRatio[i] = ratio;
        subsurfaceDepthM[i] = grid.depthM[best]!;
      } else {
        subsurfaceRatio[i] = Math.min(ratio, 1);
      }
    }
  }
  return { depthMean, nearBedRatio, cv, subsurfaceRatio, subsurfaceDepthM };
}

/**
 * Runs of outputs where `margin` is inside (≥ 0 when inclusive, > 0 otherwise; NaN is outside).
 * `margin` is the criterion minus its threshold, signed so that inside is positive. Each edge is
 * placed where the margin, linear between the neighbouring outputs, is zero; next to a NaN the
 * edge stays at the inside output. A run touching the first or last output is clipped there.
 */
export function intervalsWhere(axis: TimeAxis, margin: Float64Array, inclusive: boolean): Interval[] {
  const out: Interval[] = [];
  const { nt, stepMs, startMs } = axis;
  const inside = (m: number) => (inclusive ? m >= 0 : m > 0);
  let i = 0;
  while (i < nt) {
    if (!inside(margin[i]!)) {
      i++;
      continue;
    }
    const first = i;
    while (i + 1 < nt && inside(margin[i + 1]!)) i++;
    const last = i;
    const t0 = startMs + first * stepMs;
    const t1 = startMs + last * stepMs;
    let s = t0;
    if (first > 0) {
      const mo = margin[first - 1]!;
      const mi = margin[first]!;
      if (Number.isFinite(mo)) s = t0 - stepMs + (stepMs * -mo) / (mi - mo);
    }
    let e = t1;
    if (last < nt - 1) {
      const mi = margin[last]!;
      const mo = margin[last + 1]!;
      if (Number.isFinite(mo)) e = t1 + (stepMs * mi) / (mi - mo);
    }
    out.push({ startMs: s, endMs: e, first, last, clippedStart: first === 0, clippedEnd: last === nt - 1 });
    i++;
  }
  return out;
}

/** A series at time tMs, linear between outputs, held at the ends. */
export function seriesAt(axis: TimeAxis, series: ArrayLike<number>, tMs: number): number {
  const x = (tMs - axis.startMs) / axis.stepMs;
  if (x <= 0) return series[0]!;
  if (x >= axis.nt - 1) return series[axis.nt - 1]!;
  const k = Math.floor(x);
  const w = x - k;
  const a = series[k]!;
  const b = series[k + 1]!;
  return w === 0 ? a : a + w * (b - a);
}

/** Index of the extreme of `series` over [first, last] (first on ties); NaN values are skipped. */
function extremeIndex(series: ArrayLike<number>, first: number, last: number, largest: boolean): number {
  let best = first;
  for (let k = first; k <= last; k++) {
    const v = series[k]!;
    const b = series[best]!;
    if (Number.isNaN(b) || (largest ? v > b : v < b)) best = k;
  }
  return best;
}

/** Time of an extreme at output k, refined by a parabola through k−1, k, k+1 when all three are finite. */
function refinedExtremeMs(axis: TimeAxis, series: ArrayLike<number>, k: number, largest: boolean): number {
  const t = axis.startMs + k * axis.stepMs;
  if (k <= 0 || k >= axis.nt - 1) return t;
  const a = series[k - 1]!;
  const b = series[k]!;
  const c = series[k + 1]!;
  const curvature = a - 2 * b + c;
  if (!Number.isFinite(curvature) || curvature === 0 || (largest ? curvature > 0 : curvature < 0)) return t;
  const shift = Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / curvature));
  return t + shift * axis.stepMs;
}

const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

/**
 * The zero crossing of the depth-mean along-axis current nearest output `near`, searched over
 * outputs lo…hi; null when the sign does not change there.
 */
function alongCrossing(grid: ForecastGrid, lo: number, hi: number, near: number): { tMs: number; stage: TideStage } | null {
  const along = grid.depthMeanAlong;
  let best: { tMs: number; stage: TideStage } | null = null;
  let bestDistance = Number.POSITIVE_INFINITY;
  let k = lo;
  while (k < hi) {
    const a = along[k]!;
    if (a === 0 || !Number.isFinite(a)) {
      k++;
      continue;
    }
    // Next output with a non-zero value; zeros between are the crossing itself.
    let m = k + 1;
    while (m <= hi && along[m] === 0) m++;
    if (m > hi) break;
    const b = along[m]!;
    if (Number.isFinite(b) && Math.sign(a) !== Math.sign(b)) {
      const tA = gridTimeMs(grid, k);
      const tMs = m === k + 1 ? tA + (grid.stepMs * a) / (a - b) : gridTimeMs(grid, (k + m) / 2);
      const distance = Math.abs((tMs - grid.startMs) / grid.stepMs - near);
      if (distance < bestDistance) {
        bestDistance = distance;
        best = { tMs, stage: a > 0 ? 'before_ebb' : 'before_flood' };
      }
    }
    k = m;
  }
  return best;
}

function margins(values: ArrayLike<number>, threshold: number, above: boolean): Float64Array {
  const m = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) m[i] = above ? values[i]! - threshold : threshold - values[i]!;
  return m;
}

/**
 * Finds every slack, slump, mixed and subsurface-peak window on the grid, sorted by start time
 * (then kind). Settings must be validated (window-settings.ts).
 */
export function findWindows(grid: ForecastGrid, settings: WindowSettings): ForecastWindow[] {
  if (grid.nt < 1) return [];
  const series = columnSeries(grid, settings);
  const minLengthMs = settings.minWindowMinutes * MS_PER_MIN;
  const out: ForecastWindow[] = [];
  const keep = (w: ForecastWindow) => {
    if (w.endMs - w.startMs >= minLengthMs && w.endMs > w.startMs) out.push(w);
  };
  const clipped = (r: Interval) => r.clippedStart || r.clippedEnd;

  // Slack: depth-mean speed below the threshold.
  const slackThreshold = settings.slackSpeedMPerS;
  for (const r of intervalsWhere(grid, margins(grid.depthMeanSpeed, slackThreshold, false), false)) {
    const k = extremeIndex(grid.depthMeanSpeed, r.first, r.last, false);
    const minSpeed = grid.depthMeanSpeed[k]!;
    const crossing = alongCrossing(grid, Math.max(0, r.first - 1), Math.min(grid.nt - 1, r.last + 1), k);
    const peakMs = crossing ? crossing.tMs : refinedExtremeMs(grid, grid.depthMeanSpeed, k, false);
    const w: ForecastWindow = {
      kind: 'slack',
      startMs: r.startMs,
      endMs: r.endMs,
      peakMs: clamp(peakMs, r.startMs, r.endMs),
      strength: clamp(1 - minSpeed / slackThreshold, 0, 1),
      peakValue: minSpeed,
      clipped: clipped(r),
    };
    if (crossing) w.tideStage = crossing.stage;
    keep(w);
  }

  // Slump: near-bed mean at least slumpRatio × depth mean.
  const slumpDepth = grid.waterDepthM - Math.min(0.5, settings.slumpNearBedM / 2);
  for (const r of intervalsWhere(grid, margins(series.nearBedRatio, settings.slumpRatio, true), true)) {
    const k = extremeIndex(series.nearBedRatio, r.first, r.last, true);
    const ratio = series.nearBedRatio[k]!;
    keep({
      kind: 'slump',
      startMs: r.startMs,
      endMs: r.endMs,
      peakMs: clamp(refinedExtremeMs(grid, series.nearBedRatio, k, true), r.startMs, r.endMs),
      strength: ratio,
      peakValue: ratio,
      peakDepthM: slumpDepth,
      clipped: clipped(r),
    });
  }

  // Mixed: coefficient of variation below the threshold.
  const cvThreshold = settings.mixedCv;
  for (const r of intervalsWhere(grid, margins(series.cv, cvThreshold, false), false)) {
    const k = extremeIndex(series.cv, r.first, r.last, false);
    const cv = series.cv[k]!;
    keep({
      kind: 'mixed',
      startMs: r.startMs,
      endMs: r.endMs,
      peakMs: clamp(refinedExtremeMs(grid, series.cv, k, false), r.startMs, r.endMs),
      strength: clamp(1 - cv / cvThreshold, 0, 1),
      peakValue: cv,
      clipped: clipped(r),
    });
  }

  // Subsurface peak: an interior maximum at least subsurfacePeakRatio × depth mean.
  for (const r of intervalsWhere(grid, margins(series.subsurfaceRatio, settings.subsurfacePeakRatio, true), true)) {
    const k = extremeIndex(series.subsurfaceRatio, r.first, r.last, true);
    const ratio = series.subsurfaceRatio[k]!;
    keep({
      kind: 'subsurface_peak',
      startMs: r.startMs,
      endMs: r.endMs,
      peakMs: clamp(refinedExtremeMs(grid, series.subsurfaceRatio, k, true), r.startMs, r.endMs),
      strength: ratio,
      peakValue: ratio,
      peakDepthM: series.subsurfaceDepthM[k]!,
      clipped: clipped(r),
    });
  }

  const order: Record<WindowKind, number> = { slack: 0, slump: 1, mixed: 2, subsurface_peak: 3 };
  return out.sort((a, b) => a.startMs - b.startMs || order[a.kind] - order[b.kind]);
}
