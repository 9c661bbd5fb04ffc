/**
 * Harmonic analysis of an uploaded record (shared/tides/analysis.ts) and what the screen shows of it:
 * the fitted constituents, the fit statistics, and observed against predicted (thinned for display).
 */
import type { AnalysisResult, CurrentPart, LevelPart, SetFit } from '../../shared/schemas/tides.schema.ts';
import { analyseCurrent, analyseSeries, type DroppedConstituent } from '../../shared/tides/analysis.ts';
import { resolveConstituentNames } from '../../shared/tides/constituents.ts';
import { predictCurrent, predictLevel } from '../../shared/tides/predict.ts';
import { AppError } from '../http/app-error.ts';
import type { ParsedRecord } from './tide-csv.ts';

/** Tried by default, in the priority order of the standard list; the Rayleigh criterion drops what the record cannot separate. */
export const DEFAULT_ANALYSIS_CONSTITUENTS = ['M2', 'S2', 'N2', 'K2', 'K1', 'O1', 'P1', 'Q1', 'M4', 'MS4', 'M6'];

/** Points of the observed/predicted series sent for display. */
const DISPLAY_POINTS = 1500;

export interface AnalysisRequest {
  constituents?: string;
  rayleigh?: number;
}

function namesOf(request: AnalysisRequest): string[] {
  if (!request.constituents) return DEFAULT_ANALYSIS_CONSTITUENTS;
  const names = request.constituents
    .split(/[,\s;]+/)
    .map((n) => n.trim())
    .filter(Boolean);
  const resolved = resolveConstituentNames(names);
  if (!resolved.ok) throw new AppError('validation_failed', `The constituents to fit: ${resolved.message}.`, [{ path: 'constituents', row: null, column: null, message: resolved.message }]);
  if (names.length === 0) throw new AppError('validation_failed', 'Name at least one constituent to fit, e.g. M2,S2,K1,O1.');
  return names;
}

const droppedOf = (dropped: DroppedConstituent[]) => dropped.map((d) => ({ name: d.name, reason: d.reason }));

function thin(n: number): number[] {
  const step = Math.max(1, Math.ceil(n / DISPLAY_POINTS));
  const out: number[] = [];
  for (let i = 0; i < n; i += step) out.push(i);
  return out;
}

const finiteOrNull = (x: number) => (Number.isFinite(x) ? x : null);

function refuse(message: string): never {
  throw new AppError('validation_failed', `The record cannot be analysed: ${message}. Nothing was stored.`, [{ path: 'file', row: null, column: null, message }]);
}

export function analyseRecord(record: ParsedRecord, request: AnalysisRequest, fileName: string | null): AnalysisResult {
  const names = namesOf(request);
  const options = request.rayleigh !== undefined ? { rayleigh: request.rayleigh } : {};
  const times = record.timesMs;
  const shown = thin(times.length);
  const iso = shown.map((i) => new Date(times[i]!).toISOString());

  if (record.kind === 'level') {
    const values = record.level!;
    const fit = analyseSeries(times, values, names, options);
    if (!fit.ok) refuse(fit.message);
    const level: LevelPart = { datumM: fit.mean, constituents: fit.constituents.map((c) => ({ name: c.name, amplitude: c.amplitude, phaseDeg: c.phaseDeg })) };
    const predicted = predictLevel(level.constituents, times, { datum: level.datumM });
    if (!predicted.ok) refuse(predicted.message);
    const stats: SetFit = {
      recordKind: 'level',
      fileName,
      ...fit.record,
      varianceExplained: fit.varianceExplained,
      residualRms: fit.residualRms,
      uncertainties: fit.constituents.map((c) => ({ name: c.name, amplitudeSe: c.amplitudeSe, phaseSeDeg: c.phaseSeDeg })),
      dropped: droppedOf(fit.dropped),
    };
    return {
      kind: 'level',
      fileName,
      fit: stats,
      constituents: fit.constituents.map((c) => ({ ...c, minor: null, inclinationDeg: null })),
      current: null,
      level,
      series: {
        quantity: 'water level above the record’s datum',
        unit: 'm',
        times: iso,
        observed: shown.map((i) => finiteOrNull(values[i]!)),
        predicted: shown.map((i) => predicted.values[i]!),
        residual: shown.map((i) => finiteOrNull(values[i]! - predicted.values[i]!)),
      },
    };
  }

  const east = record.east!;
  const north = record.north!;
  const fit = analyseCurrent(times, east, north, names, options);
  if (!fit.ok) refuse(fit.message);
  const largest = fit.constituents.reduce((best, c) => (c.major > best.major ? c : best), fit.constituents[0]!);
  const current: CurrentPart = {
    axisDeg: largest.inclinationDeg,
    constituents: fit.constituents.map((c) => ({ name: c.name, major: c.major, minor: c.minor, inclinationDeg: c.inclinationDeg, phaseDeg: c.phaseDeg })),
  };
  // The fitted mean flow (residual current) is not part of the tide; it is removed before comparing.
  const predicted = predictCurrent(current.constituents, times, { axisDeg: current.axisDeg ?? 0 });
  if (!predicted.ok) refuse(predicted.message);
  const axis = ((current.axisDeg ?? 0) * Math.PI) / 180;
  const ca = Math.cos(axis);
  const sa = Math.sin(axis);
  const meanAlong = fit.meanEast * ca + fit.meanNorth * sa;
  const observedAlong = (i: number) => east[i]! * ca + north[i]! * sa - meanAlong;
  const stats: SetFit = {
    recordKind: 'current',
    fileName,
    ...fit.record,
    varianceExplained: fit.varianceExplained,
    residualRms: Math.hypot(fit.residualRmsEast, fit.residualRmsNorth),
    uncertainties: fit.constituents.map((c) => ({ name: c.name, amplitudeSe: c.majorSe, phaseSeDeg: c.phaseSeDeg })),
    dropped: droppedOf(fit.dropped),
  };
  return {
    kind: 'current',
    fileName,
    fit: stats,
    constituents: fit.constituents.map((c) => ({
      name: c.name,
      speedDegPerH: c.speedDegPerH,
      amplitude: c.major,
      amplitudeSe: c.majorSe,
      phaseDeg: c.phaseDeg,
      phaseSeDeg: c.phaseSeDeg,
      minor: c.minor,
      inclinationDeg: c.inclinationDeg,
    })),
    current,
    level: null,
    series: {
      quantity: `depth-mean current along the main axis (${(current.axisDeg ?? 0).toFixed(0)}° anticlockwise from east), mean flow removed`,
      unit: 'm/s',
      times: iso,
      observed: shown.map((i) => finiteOrNull(observedAlong(i))),
      predicted: shown.map((i) => predicted.along[i]!),
      residual: shown.map((i) => finiteOrNull(observedAlong(i) - predicted.along[i]!)),
    },
  };
}
