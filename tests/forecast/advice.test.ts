import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { adviseDays, type AdviceInput } from '../../shared/forecast/advice.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { DEFAULT_WINDOW_SETTINGS } from '../../shared/forecast/window-settings.ts';
import { findWindows, type ForecastWindow } from '../../shared/forecast/windows.ts';

const MINUTE = 60_000;
const HOUR = 3_600_000;
const ZONE = 'Europe/London';
/** A winter day: London keeps GMT (UTC+0), so site-local clock times equal UTC ones. */
const DAY = Date.parse('2025-01-15T00:00:00Z');

interface GridSpec {
  startMs?: number;
  stepMin: number;
  nt: number;
  thicknessM: number[];
  conc: (tMs: number, depthM: number, k: number) => number;
}

/** A hand-made ForecastGrid with a steady 0.3 m/s current. */
function handGrid(spec: GridSpec): ForecastGrid {
  const startMs = spec.startMs ?? DAY;
  const nz = spec.thicknessM.length;
  const thicknessM = Float64Array.from(spec.thicknessM);
  const depthM = new Float64Array(nz);
  let top = 0;
  for (let k = 0; k < nz; k++) {
    depthM[k] = top + thicknessM[k]! / 2;
    top += thicknessM[k]!;
  }
  const stepMs = spec.stepMin * MINUTE;
  const concentration = new Float32Array(spec.nt * nz);
  for (let i = 0; i < spec.nt; i++) {
    for (let k = 0; k < nz; k++) concentration[i * nz + k] = spec.conc(startMs + i * stepMs, depthM[k]!, k);
  }
  return {
    startMs,
    stepMs,
    nt: spec.nt,
    nz,
    waterDepthM: top,
    depthM,
    thicknessM,
    concentration,
    speed: new Float32Array(spec.nt * nz).fill(0.3),
    diffusivity: new Float32Array(spec.nt * nz).fill(1e-3),
    depthMeanAlong: new Float64Array(spec.nt).fill(0.3),
    depthMeanSpeed: new Float64Array(spec.nt).fill(0.3),
    bedStressPa: new Float64Array(spec.nt),
  };
}

const metresLayers = (n: number, each = 1) => Array.from({ length: n }, () => each);

/** One day at 10 min outputs, 00:00 to 24:00. */
const uniformDay = (depth = 12) => handGrid({ stepMin: 10, nt: 145, thicknessM: metresLayers(depth), conc: () => 200 });

/** Ten 1 m layers; the bottom layer holds r × the depth mean of 100 cells/L, the rest share the remainder. */
const bottomShare = (r: (t: number) => number) => (t: number, _d: number, k: number) => {
  const v = r(t);
  return k === 9 ? 100 * v : (100 * (10 - v)) / 9;
};

/** Uniform until 3:00, settling to r = 4 by 4:20 and staying so to 6:00 (the windows test's column). */
const settlingGrid = () =>
  handGrid({
    stepMin: 15,
    nt: 25,
    thicknessM: metresLayers(10),
    conc: bottomShare((t) => 1 + 3 * Math.min(1, Math.max(0, (t - DAY - 3 * HOUR) / (80 * MINUTE)))),
  });

const site = (waterDepthM: number, gearTopM = 2, gearBottomM = 6) => ({ timeZone: ZONE, gearTopM, gearBottomM, waterDepthM });

const mixedWindow = (startMs: number, endMs: number): ForecastWindow => ({
  kind: 'mixed',
  startMs,
  endMs,
  peakMs: (startMs + endMs) / 2,
  strength: 0.8,
  peakValue: 0.05,
  clipped: false,
});

function advise(input: Partial<AdviceInput> & Pick<AdviceInput, 'grid'>) {
  return adviseDays({
    windows: findWindows(input.grid, DEFAULT_WINDOW_SETTINGS),
    site: site(input.grid.waterDepthM),
    triggerCellsPerL: 500,
    ...input,
  });
}

// Expected values below follow from the definitions in docs/windows.md applied to hand-made grids.
describe('representative sample', () => {
  it('is a hose sample at the middle of the longest mixed window of the day', () => {
    const grid = uniformDay();
    const windows = [mixedWindow(DAY + 2 * HOUR, DAY + 4 * HOUR), mixedWindow(DAY + 9 * HOUR, DAY + 13.5 * HOUR)];
    const rep = advise({ grid, windows })[0]!.representative;
    expect(rep.method).toBe('hose');
    expect(rep.inMixedWindow).toBe(true);
    expect(rep.timeMs).toBe(DAY + 11.25 * HOUR);
    expect(rep.expectedCellsPerL).toBeCloseTo(200, 6);
    expect(rep.reason).toContain('11:15');
  });

  it('counts only the part of a mixed window that falls on the day', () => {
    const grid = handGrid({ stepMin: 10, nt: 289, thicknessM: metresLayers(12), conc: () => 200 });
    const windows = [mixedWindow(DAY + 20 * HOUR, DAY + 30 * HOUR), mixedWindow(DAY + 33 * HOUR, DAY + 34 * HOUR)];
    const days = advise({ grid, windows });
    expect(days[0]!.representative.timeMs).toBe(DAY + 22 * HOUR);
    expect(days[1]!.representative.timeMs).toBe(DAY + 27 * HOUR);
  });

  it('falls back to the time of lowest variation over depth when no mixed window falls on the day, and says so', () => {
    // r = 2 + |t − 14:00|/6 h, so CV = (r − 1)/3 is least, 1/3, at 14:00 (derivation in windows.test.ts).
    const grid = handGrid({ stepMin: 10, nt: 145, thicknessM: metresLayers(10), conc: bottomShare((t) => 2 + Math.abs(t - DAY - 14 * HOUR) / (6 * HOUR)) });
    const rep = advise({ grid })[0]!.representative;
    expect(rep.inMixedWindow).toBe(false);
    expect(rep.timeMs).toBe(DAY + 14 * HOUR);
    expect(rep.cv).toBeCloseTo(1 / 3, 5);
    expect(rep.reason).toContain('No well-mixed period');
  });

  it('uses a hose from the surface to 10 m, or to the bed where the water is shallower', () => {
    const rep = advise({ grid: uniformDay(6) })[0]!.representative;
    expect([rep.topM, rep.bottomM]).toEqual([0, 6]);
    const deep = advise({ grid: uniformDay(20) })[0]!.representative;
    expect([deep.topM, deep.bottomM]).toEqual([0, 10]);
  });
});

describe('worst-case samples', () => {
  it('puts a bottle half a metre above the bed at the slump peak', () => {
    const grid = settlingGrid();
    const slump = findWindows(grid, DEFAULT_WINDOW_SETTINGS).find((w) => w.kind === 'slump')!;
    const bottle = advise({ grid })[0]!.worstCase.find((w) => w.kind === 'near_bed')!;
    expect(bottle.method).toBe('bottle');
    expect(bottle.depthM).toBeCloseTo(9.5, 9);
    expect(bottle.timeMs).toBe(slump.peakMs);
    // From 4:20 the column is fully settled: the bottom layer holds 4 × 100 cells/L.
    expect(bottle.timeMs).toBeGreaterThanOrEqual(DAY + 4 * HOUR + 20 * MINUTE);
    expect(bottle.expectedCellsPerL).toBeCloseTo(400, 3);
  });

  it('puts a bottle at the depth and time of a subsurface peak', () => {
    // 16 m in fifteen layers of 16/15 m (a centre at 8 m); a layer of up to 1500 cells/L at 8 m peaking at 3:00.
    const grid = handGrid({
      stepMin: 10,
      nt: 37,
      thicknessM: metresLayers(15, 16 / 15),
      conc: (t, d) => 100 + 1500 * Math.max(0, 1 - Math.abs(t - DAY - 3 * HOUR) / HOUR) * Math.exp(-((d - 8) ** 2)),
    });
    const bottle = advise({ grid })[0]!.worstCase.find((w) => w.kind === 'subsurface_peak')!;
    expect(bottle.depthM).toBeCloseTo(8, 9);
    expect(bottle.timeMs).toBe(DAY + 3 * HOUR);
    expect(bottle.expectedCellsPerL).toBeCloseTo(1600, 3);
    expect(bottle.reason).toContain('mixes the layer');
  });

  it('times a gear-band hose sample at the peak of the gear-band mean', () => {
    // A pulse of up to 900 cells/L over 2–6 m, highest at 15:20.
    const grid = handGrid({
      stepMin: 10,
      nt: 145,
      thicknessM: metresLayers(12),
      conc: (t, d) => 100 + (d > 2 && d < 6 ? 900 * Math.max(0, 1 - Math.abs(t - DAY - (15 * HOUR + 20 * MINUTE)) / (2 * HOUR)) : 0),
    });
    const gear = advise({ grid })[0]!.worstCase.find((w) => w.kind === 'gear_band')!;
    expect(gear.method).toBe('hose');
    expect([gear.topM, gear.bottomM]).toEqual([2, 6]);
    expect(gear.timeMs).toBe(DAY + 15 * HOUR + 20 * MINUTE);
    expect(gear.expectedCellsPerL).toBeCloseTo(1000, 3);
  });
});

describe('exposure of the gear band', () => {
  it('counts the hours above the trigger from the interpolated crossing', () => {
    // Uniform 100 + 50 t cells/L (t in hours) crosses 500 at 8:00 and stays above to 24:00: 16 h.
    // Outputs every 25 min, so 8:00 falls between two of them.
    const grid = handGrid({ stepMin: 25, nt: 59, thicknessM: metresLayers(12), conc: (t) => 100 + 50 * ((t - DAY) / HOUR) });
    const exposure = advise({ grid })[0]!.exposure;
    expect(exposure.periods[0]!.startMs).toBeCloseTo(DAY + 8 * HOUR, -3);
    expect(exposure.hoursAbove).toBeCloseTo(16, 6);
  });

  it('reports the highest gear-band concentration and its time', () => {
    const grid = handGrid({ stepMin: 10, nt: 145, thicknessM: metresLayers(12), conc: (t) => 300 + 200 * Math.sin(((t - DAY) / (24 * HOUR)) * 2 * Math.PI) });
    const exposure = advise({ grid })[0]!.exposure;
    expect(exposure.maxMs).toBe(DAY + 6 * HOUR);
    expect(exposure.maxCellsPerL).toBeCloseTo(500, 3);
  });
});

describe('site-local days', () => {
  // UK clocks go forward at 01:00 UTC on the last Sunday of March and back at 01:00 UTC on the last
  // Sunday of October (30 March and 26 October in 2025) [from memory; luxon's IANA data agrees].
  const spring = Date.parse('2025-03-29T00:00:00Z');
  const autumn = Date.parse('2025-10-25T00:00:00Z');
  const steady = (startMs: number) => handGrid({ startMs, stepMin: 30, nt: 3 * 48 + 1, thicknessM: metresLayers(12), conc: () => 1000 });

  it('gives the day the clocks go forward in Europe/London 23 hours, all of them above the trigger', () => {
    const days = advise({ grid: steady(spring) });
    expect(days.map((d) => d.date)).toEqual(['2025-03-29', '2025-03-30', '2025-03-31', '2025-04-01']);
    const short = days[1]!;
    expect(short.hoursInDay).toBe(23);
    expect(short.exposure.hoursAbove).toBeCloseTo(23, 9);
  });

  it('gives the day the clocks go back 25 hours', () => {
    const days = advise({ grid: steady(autumn) });
    const long = days.find((d) => d.date === '2025-10-26')!;
    expect(long.hoursInDay).toBe(25);
    expect(long.exposure.hoursAbove).toBeCloseTo(25, 9);
  });

  it('marks a day the forecast covers only in part', () => {
    // The forecast ends at 2025-04-01T00:00Z = 01:00 BST: one hour of 1 April.
    const last = advise({ grid: steady(spring) }).at(-1)!;
    expect(last.partial).toBe(true);
    expect((last.coveredEndMs - last.coveredStartMs) / HOUR).toBe(1);
  });

  it('refuses an unknown time zone', () => {
    expect(() => advise({ grid: uniformDay(), site: { ...site(12), timeZone: 'Mars/Olympus' } })).toThrow(RangeError);
  });
});

describe('official samples', () => {
  const clock = (t: number) => DateTime.fromMillis(t, { zone: ZONE }).toFormat('HH:mm');

  it('flags an official sample inside a slump window and says the hose under-reads', () => {
    const grid = settlingGrid();
    const [check] = advise({ grid, hoseRange: { topM: 0, bottomM: 5 }, officialSamples: [{ timeMs: DAY + 5 * HOUR, label: 'weekly' }] })[0]!.officialSamples;
    expect(check!.unrepresentative).toBe(true);
    expect(check!.phases).toContain('slump');
    // Upper five layers each hold (10 − 4)/9 × 100 against a depth mean of 100: 2/3 (definition).
    expect(check!.hoseToColumnRatio).toBeCloseTo(2 / 3, 5);
    expect(check!.reason).toContain('slump window');
  });

  it('names no clock time in a flag other than the sample and the window it falls in', () => {
    const grid = settlingGrid();
    const slump = findWindows(grid, DEFAULT_WINDOW_SETTINGS).find((w) => w.kind === 'slump')!;
    const t = DAY + 5 * HOUR;
    const [check] = advise({ grid, officialSamples: [{ timeMs: t }] })[0]!.officialSamples;
    const allowed = new Set([clock(t), clock(slump.startMs), clock(slump.endMs)]);
    const named = check!.reason.match(/\b\d{2}:\d{2}\b/g) ?? [];
    expect(named.length).toBeGreaterThan(0);
    for (const time of named) expect(allowed.has(time)).toBe(true);
  });

  it('does not flag an official sample inside a mixed window', () => {
    const [check] = advise({ grid: settlingGrid(), officialSamples: [{ timeMs: DAY + HOUR }] })[0]!.officialSamples;
    expect(check!.unrepresentative).toBe(false);
    expect(check!.phases).toEqual([]);
    expect(check!.reason).toContain('well-mixed');
  });

  it('flags an official sample outside any mixed window while the column is stratified', () => {
    // r = 1.8 all day: CV = 0.8/3 = 0.267 ≥ 0.25 (not mixed) and ratio 1.8 < 2 (not a slump).
    const grid = handGrid({ stepMin: 10, nt: 145, thicknessM: metresLayers(10), conc: bottomShare(() => 1.8) });
    const [check] = advise({ grid, officialSamples: [{ timeMs: DAY + 12 * HOUR }] })[0]!.officialSamples;
    expect(check!.unrepresentative).toBe(true);
    expect(check!.phases).toEqual(['stratified']);
  });

  it('leaves out official samples outside the forecast', () => {
    const days = advise({ grid: uniformDay(), officialSamples: [{ timeMs: DAY - HOUR }, { timeMs: DAY + 30 * HOUR }] });
    expect(days.flatMap((d) => d.officialSamples)).toEqual([]);
  });
});
