/**
 * The preview of a constituent set: depth-mean current and level over a window, with slack waters
 * and high and low waters (shared/tides/predict.ts and events.ts).
 */
import type { ConstituentSet, Preview } from '../../shared/schemas/tides.schema.ts';
import { findHighLowWaters, findSlackWaters } from '../../shared/tides/events.ts';
import { predictCurrent, predictLevel, regularTimes } from '../../shared/tides/predict.ts';
import { formFactor } from '../../shared/tides/tide-character.ts';
import { AppError } from '../http/app-error.ts';

const DAY_MS = 86_400_000;

function broken(message: string): never {
  throw new AppError('conflict', `The active constituent set cannot be predicted: ${message}. Choose or make another set.`);
}

const iso = (ms: number) => new Date(ms).toISOString();

export function previewSet(set: ConstituentSet, startMs: number, days: number, stepMinutes: number): Preview {
  const endMs = startMs + days * DAY_MS;
  const timesMs = regularTimes(startMs, endMs, stepMinutes * 60_000);
  let current: Preview['current'] = null;
  let level: Preview['level'] = null;
  if (set.current) {
    const axis = set.current.axisDeg === null ? {} : { axisDeg: set.current.axisDeg };
    const predicted = predictCurrent(set.current.constituents, timesMs, axis);
    if (!predicted.ok) broken(predicted.message);
    const slacks = findSlackWaters(set.current.constituents, startMs, endMs, axis);
    if (!slacks.ok) broken(slacks.message);
    current = {
      axisDeg: set.current.axisDeg,
      along: Array.from(predicted.along),
      speed: Array.from(predicted.speed),
      slacks: slacks.slacks.map((s) => ({ time: iso(s.timeMs), speed: s.speed, turnsTo: s.turnsTo })),
    };
  }
  if (set.level) {
    const predicted = predictLevel(set.level.constituents, timesMs, { datum: set.level.datumM });
    if (!predicted.ok) broken(predicted.message);
    const events = findHighLowWaters(set.level.constituents, startMs, endMs, { datum: set.level.datumM });
    if (!events.ok) broken(events.message);
    level = {
      datumM: set.level.datumM,
      values: Array.from(predicted.values),
      highLow: events.events.map((e) => ({ time: iso(e.timeMs), levelM: e.level, kind: e.kind })),
    };
  }
  const of = set.current ? 'current' : 'level';
  const entries = set.current ? set.current.constituents.map((c) => ({ name: c.name, amplitude: c.major })) : (set.level?.constituents ?? []);
  const F = formFactor(entries);
  return {
    setId: set.id,
    version: set.version,
    start: iso(startMs),
    end: iso(endMs),
    stepMinutes,
    times: Array.from(timesMs, iso),
    current,
    level,
    formFactor: F.ok ? { value: F.F, type: F.type, of } : null,
  };
}
