/**
 * Events on a predicted tide: high and low waters, slack waters, and the
 * flood and ebb phases between slacks.
 *
 * Method: the window is scanned at a step no longer than 1/12 of the period
 * of the fastest constituent (and at most 30 min) for a change of sign of the
 * relevant function, and each bracket is refined by bisection to 1 s.
 * - High/low water: zeros of dh/dt (high where dh/dt goes from + to −).
 * - Slack, rectilinear current (every constituent on one axis, no minor axis):
 *   zeros of the along-axis current; the speed there is zero.
 * - Slack, rotary current: local minima of the speed, i.e. zeros of
 *   d(speed²)/dt = 2(u u′ + v v′) going from − to +; the speed at the minimum
 *   is reported as the slack's depth (how slack the slack is).
 * Events closer than one minute to the previous one of the same kind are
 * dropped (they can only come from the refresh of nodal corrections).
 */

import { STANDARD_CONSTITUENTS, constituentSpeedDegPerH } from './constituents.ts';
import { currentAt, sumAt, sumRateAt, type Terms } from './harmonic-sum.ts';
import {
  currentTerms,
  levelTerms,
  type CurrentConstituent,
  type LevelConstituent,
  type PredictCurrentOptions,
  type PredictLevelOptions,
  type TideFailure,
} from './predict.ts';

const MS_PER_H = 3_600_000;
const TOLERANCE_MS = 1000;
const MIN_SEPARATION_MS = 60_000;

export interface HighLowWater {
  timeMs: number;
  /** Level above the datum, unit of the amplitudes. */
  level: number;
  kind: 'high' | 'low';
}

export interface SlackWater {
  timeMs: number;
  /** Speed at the slack (0 for a rectilinear current; the minimum speed for a rotary one). */
  speed: number;
  /** The phase that follows this slack, from the along-axis sign and floodSign. */
  turnsTo: 'flood' | 'ebb';
}

export interface CurrentPhase {
  kind: 'flood' | 'ebb';
  startMs: number;
  endMs: number;
  /** False when the phase is cut by the start or end of the window. */
  complete: boolean;
  peakMs: number;
  /** Along-axis speed at the peak, ≥ 0. */
  peakSpeed: number;
}

export interface EventOptions {
  /** Largest scan step, minutes. Default 30. */
  maxStepMin?: number;
}

export interface CurrentEventOptions extends PredictCurrentOptions, EventOptions {
  /** +1 if a positive along-axis current is the flood, −1 if it is the ebb. Default +1. */
  floodSign?: 1 | -1;
}

function scanStepMs(terms: Terms, maxStepMin: number): number {
  let fastest = 0;
  for (let k = 0; k < terms.n; k++) {
    fastest = Math.max(fastest, constituentSpeedDegPerH(STANDARD_CONSTITUENTS[terms.index[k]!]!));
  }
  const maxStep = maxStepMin * 60_000;
  if (fastest === 0) return maxStep;
  return Math.min(maxStep, ((360 / fastest) * MS_PER_H) / 12);
}

/**
 * Calls onRoot(t, risingToPositive) for each sign change of fn in [startMs, endMs].
 * Bisection to TOLERANCE_MS. fn must be cheap and allocation-free.
 */
function findSignChanges(
  fn: (tMs: number) => number,
  startMs: number,
  endMs: number,
  stepMs: number,
  onRoot: (tMs: number, rising: boolean) => void,
): void {
  let a = startMs;
  let fa = fn(a);
  while (a < endMs) {
    const b = Math.min(a + stepMs, endMs);
    const fb = fn(b);
    if ((fa < 0 && fb >= 0) || (fa > 0 && fb <= 0)) {
      let lo = a;
      let hi = b;
      let flo = fa;
      while (hi - lo > TOLERANCE_MS) {
        const mid = 0.5 * (lo + hi);
        const fm = fn(mid);
        if ((flo < 0 && fm < 0) || (flo > 0 && fm > 0)) {
          lo = mid;
          flo = fm;
        } else {
          hi = mid;
        }
      }
      // A root exactly on b is reported here only: the next bracket starts from f = 0.
      onRoot(0.5 * (lo + hi), fa < 0);
    }
    a = b;
    fa = fb;
  }
}

function validWindow(startMs: number, endMs: number): TideFailure | null {
  if (!Number.isFinite(startMs) || !Number.isFinite(endMs) || endMs <= startMs) {
    return { ok: false, code: 'invalid-input', message: 'the window must have finite start and end times with end after start' };
  }
  return null;
}

/** High and low waters in [startMs, endMs]. */
export function findHighLowWaters(
  constituents: readonly LevelConstituent[],
  startMs: number,
  endMs: number,
  options: PredictLevelOptions & EventOptions = {},
): { ok: true; events: HighLowWater[] } | TideFailure {
  const bad = validWindow(startMs, endMs);
  if (bad) return bad;
  const terms = levelTerms(constituents, options);
  if ('ok' in terms) return terms;
  const datum = options.datum ?? 0;
  const events: HighLowWater[] = [];
  findSignChanges(
    (t) => sumRateAt(terms, t),
    startMs,
    endMs,
    scanStepMs(terms, options.maxStepMin ?? 30),
    (t, rising) => {
      const kind = rising ? 'low' : 'high';
      const last = events[events.length - 1];
      if (last && last.kind === kind && t - last.timeMs < MIN_SEPARATION_MS) return;
      events.push({ timeMs: t, level: datum + sumAt(terms, t), kind });
    },
  );
  return { ok: true, events };
}

/** Slack waters in [startMs, endMs]. */
export function findSlackWaters(
  constituents: readonly CurrentConstituent[],
  startMs: number,
  endMs: number,
  options: CurrentEventOptions = {},
): { ok: true; rectilinear: boolean; slacks: SlackWater[] } | TideFailure {
  const bad = validWindow(startMs, endMs);
  if (bad) return bad;
  const prepared = currentTerms(constituents, options);
  if ('ok' in prepared) return prepared;
  const { terms, rectilinear } = prepared;
  const floodSign = options.floodSign ?? 1;
  const axis = (prepared.axisDeg * Math.PI) / 180;
  const ca = Math.cos(axis);
  const sa = Math.sin(axis);
  const out = new Float64Array(4);
  const along = (t: number): number => {
    currentAt(terms, t, out);
    return out[0]! * ca + out[1]! * sa;
  };
  const slacks: SlackWater[] = [];
  const step = scanStepMs(terms, options.maxStepMin ?? 30);
  const push = (t: number): void => {
    const last = slacks[slacks.length - 1];
    if (last && t - last.timeMs < MIN_SEPARATION_MS) return;
    currentAt(terms, t, out);
    const speed = Math.hypot(out[0]!, out[1]!);
    // The sign a quarter of the scan step later tells which phase follows.
    const next = along(Math.min(t + step / 4, t + 15 * 60_000));
    slacks.push({ timeMs: t, speed, turnsTo: next * floodSign >= 0 ? 'flood' : 'ebb' });
  };
  if (rectilinear) {
    // Along the common axis of the constituents.
    const ci = terms.cosInc[0] ?? 1;
    const si = terms.sinInc[0] ?? 0;
    const onAxis = (t: number): number => {
      currentAt(terms, t, out);
      return out[0]! * ci + out[1]! * si;
    };
    findSignChanges(onAxis, startMs, endMs, step, (t) => push(t));
  } else {
    findSignChanges(
      (t) => {
        currentAt(terms, t, out);
        return out[0]! * out[2]! + out[1]! * out[3]!;
      },
      startMs,
      endMs,
      step,
      (t, rising) => {
        if (rising) push(t);
      },
    );
  }
  return { ok: true, rectilinear, slacks };
}

/**
 * Flood and ebb phases between slack waters. Each phase is classified by the
 * sign of the along-axis current at its peak (the largest |along| among 48
 * samples of the phase) times floodSign. Phases cut by the window carry
 * complete = false.
 */
export function findCurrentPhases(
  constituents: readonly CurrentConstituent[],
  startMs: number,
  endMs: number,
  options: CurrentEventOptions = {},
): { ok: true; phases: CurrentPhase[]; slacks: SlackWater[] } | TideFailure {
  const found = findSlackWaters(constituents, startMs, endMs, options);
  if (!found.ok) return found;
  const prepared = currentTerms(constituents, options);
  if ('ok' in prepared) return prepared;
  const { terms } = prepared;
  const floodSign = options.floodSign ?? 1;
  const axis = (prepared.axisDeg * Math.PI) / 180;
  const ca = Math.cos(axis);
  const sa = Math.sin(axis);
  const out = new Float64Array(4);
  const bounds = [startMs, ...found.slacks.map((s) => s.timeMs), endMs];
  const phases: CurrentPhase[] = [];
  for (let i = 0; i + 1 < bounds.length; i++) {
    const a = bounds[i]!;
    const b = bounds[i + 1]!;
    if (b - a < MIN_SEPARATION_MS) continue;
    let peakMs = a;
    let peak = 0;
    const samples = 48;
    for (let k = 1; k < samples; k++) {
      const t = a + ((b - a) * k) / samples;
      currentAt(terms, t, out);
      const value = out[0]! * ca + out[1]! * sa;
      if (Math.abs(value) > Math.abs(peak)) {
        peak = value;
        peakMs = t;
      }
    }
    phases.push({
      kind: peak * floodSign >= 0 ? 'flood' : 'ebb',
      startMs: a,
      endMs: b,
      complete: i > 0 && i + 1 < bounds.length - 1,
      peakMs,
      peakSpeed: Math.abs(peak),
    });
  }
  return { ok: true, phases, slacks: found.slacks };
}
