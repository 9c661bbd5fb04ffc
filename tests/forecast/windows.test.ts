import { describe, expect, it } from 'vitest';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { DEFAULT_WINDOW_SETTINGS, parseWindowSettings, windowSettingsSchema } from '../../shared/forecast/window-settings.ts';
import { findWindows, type ForecastWindow } from '../../shared/forecast/windows.ts';
import { runCase } from '../../shared/model/run.ts';

const MINUTE = 60_000;
const HOUR = 3_600_000;
const START = Date.parse('2025-06-02T00:00:00Z');
const M2_DEG_PER_H = 28.9841042; // M2 speed, IHO Standard List (REFERENCES §8 [READ])
const M2_OMEGA_PER_MS = (M2_DEG_PER_H * Math.PI) / 180 / HOUR;

interface GridSpec {
  stepMin: number;
  nt: number;
  thicknessM: number[];
  conc: (tMs: number, depthM: number, k: number) => number;
  along?: (tMs: number) => number;
}

/** A hand-made ForecastGrid: concentration from a function of time and depth, current from `along`. */
function handGrid(spec: GridSpec): ForecastGrid {
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
  const speed = new Float32Array(spec.nt * nz);
  const diffusivity = new Float32Array(spec.nt * nz).fill(1e-3);
  const depthMeanAlong = new Float64Array(spec.nt);
  const depthMeanSpeed = new Float64Array(spec.nt);
  for (let i = 0; i < spec.nt; i++) {
    const t = START + i * stepMs;
    const u = spec.along ? spec.along(t) : 0.3;
    depthMeanAlong[i] = u;
    depthMeanSpeed[i] = Math.abs(u);
    for (let k = 0; k < nz; k++) {
      concentration[i * nz + k] = spec.conc(t, depthM[k]!, k);
      speed[i * nz + k] = Math.abs(u);
    }
  }
  return {
    startMs: START,
    stepMs,
    nt: spec.nt,
    nz,
    waterDepthM: top,
    depthM,
    thicknessM,
    concentration,
    speed,
    diffusivity,
    depthMeanAlong,
    depthMeanSpeed,
    bedStressPa: new Float64Array(spec.nt),
  };
}

const ofKind = (windows: ForecastWindow[], kind: ForecastWindow['kind']) => windows.filter((w) => w.kind === kind);

/**
 * 10 m of water in ten 1 m layers. The bottom layer holds r(t) × the depth mean M and the nine above
 * share the rest evenly, so the bottom-metre ratio is r and the coefficient of variation is (r − 1)/3
 * [derivation: mean 1, one value r and nine of (10 − r)/9 give variance (r − 1)²/9].
 * r = 1 (uniform) until 3:00, rises linearly to 4 at 4:20, then stays settled to 5:00.
 */
const RAMP_START = 3 * HOUR;
const RAMP_LENGTH = 80 * MINUTE;
const settlingRatio = (t: number) => 1 + 3 * Math.min(1, Math.max(0, (t - START - RAMP_START) / RAMP_LENGTH));
const settlingGrid = () =>
  handGrid({
    stepMin: 15,
    nt: 21,
    thicknessM: Array.from({ length: 10 }, () => 1),
    conc: (t, _d, k) => {
      const r = settlingRatio(t);
      return k === 9 ? 100 * r : (100 * (10 - r)) / 9;
    },
  });

describe('windows on a column that is uniform and then settles near the bed', () => {
  it('ends the mixed window where the coefficient of variation crosses 0.25, between outputs', () => {
    // CV = (r − 1)/3 = 0.25 at r = 1.75: 3:00 + 0.75/3 × 80 min = 3:20 (definition, docs/windows.md).
    const mixed = ofKind(findWindows(settlingGrid(), DEFAULT_WINDOW_SETTINGS), 'mixed');
    expect(mixed).toHaveLength(1);
    expect(Math.abs(mixed[0]!.endMs - (START + 3 * HOUR + 20 * MINUTE))).toBeLessThan(1000);
  });

  it('flags the mixed window that runs from the forecast start as clipped', () => {
    const mixed = ofKind(findWindows(settlingGrid(), DEFAULT_WINDOW_SETTINGS), 'mixed')[0]!;
    expect(mixed.startMs).toBe(START);
    expect(mixed.clipped).toBe(true);
  });

  it('starts the slump window where the bottom-metre mean reaches twice the depth mean', () => {
    // r = 2 at 3:00 + (1/3) × 80 min = 3:26:40, between the outputs at 3:15 and 3:30.
    const slump = ofKind(findWindows(settlingGrid(), DEFAULT_WINDOW_SETTINGS), 'slump');
    expect(slump).toHaveLength(1);
    expect(Math.abs(slump[0]!.startMs - (START + 3 * HOUR + 26 * MINUTE + 40_000))).toBeLessThan(1000);
  });

  it('gives the slump window the peak ratio as strength, the near-bed depth, and a clipped end', () => {
    const slump = ofKind(findWindows(settlingGrid(), DEFAULT_WINDOW_SETTINGS), 'slump')[0]!;
    expect(slump.strength).toBeCloseTo(4, 5);
    expect(slump.peakDepthM).toBeCloseTo(9.5, 9); // 10 m − 0.5 m (definition, docs/windows.md)
    expect(slump.endMs).toBe(START + 5 * HOUR);
    expect(slump.clipped).toBe(true);
  });

  it('does not call a profile that rises all the way to the bed a subsurface peak', () => {
    const windows = findWindows(settlingGrid(), DEFAULT_WINDOW_SETTINGS);
    expect(ofKind(windows, 'subsurface_peak')).toHaveLength(0);
  });

  it('moves the slump start when the site changes its slump ratio', () => {
    // r = 3 at 3:00 + (2/3) × 80 min = 3:53:20.
    const settings = windowSettingsSchema.parse({ slumpRatio: 3 });
    const slump = ofKind(findWindows(settlingGrid(), settings), 'slump')[0]!;
    expect(Math.abs(slump.startMs - (START + 3 * HOUR + 53 * MINUTE + 20_000))).toBeLessThan(1000);
  });
});

describe('slack windows of a sinusoidal depth-mean current', () => {
  // u = A sin(ω (t − t0)); zeros at t0 + kπ/ω; |u| < s inside ± asin(s/A)/ω of each zero [derivation, exact].
  // Window definitions: docs/windows.md.
  const A = 0.4;
  const T0 = 17 * MINUTE;
  const along = (t: number) => A * Math.sin(M2_OMEGA_PER_MS * (t - START - T0));
  const grid = handGrid({ stepMin: 30, nt: 97, thicknessM: [5, 5, 5], conc: () => 100, along });
  const windows = ofKind(findWindows(grid, DEFAULT_WINDOW_SETTINGS), 'slack');
  const halfWidthMs = Math.asin(0.1 / A) / M2_OMEGA_PER_MS;
  const zeroMs = (k: number) => START + T0 + (k * Math.PI) / M2_OMEGA_PER_MS;
  const endMs = START + 96 * 30 * MINUTE;
  const whole = windows.filter((w) => !w.clipped);
  const nearestZero = (t: number) => Math.round((t - START - T0) / (Math.PI / M2_OMEGA_PER_MS));

  it('finds one slack window per zero crossing in the forecast', () => {
    let zeros = 0;
    for (let k = 0; zeroMs(k) <= endMs; k++) zeros++;
    expect(windows).toHaveLength(zeros);
  });

  it('places the edges within one minute of the analytic times, with 30 min outputs', () => {
    expect(whole.length).toBeGreaterThanOrEqual(6);
    for (const w of whole) {
      const z = zeroMs(nearestZero(w.peakMs));
      expect(Math.abs(w.startMs - (z - halfWidthMs))).toBeLessThan(MINUTE);
      expect(Math.abs(w.endMs - (z + halfWidthMs))).toBeLessThan(MINUTE);
    }
  });

  it('puts the peak at the zero crossing of the along-axis current', () => {
    for (const w of whole) expect(Math.abs(w.peakMs - zeroMs(nearestZero(w.peakMs)))).toBeLessThan(MINUTE);
  });

  it('says which way the current turns', () => {
    // sin goes + to − through odd k (the ebb follows), − to + through even k (the flood follows).
    for (const w of windows) {
      const k = nearestZero(w.peakMs);
      expect(w.tideStage).toBe(k % 2 === 0 ? 'before_flood' : 'before_ebb');
    }
  });

  it('rates each slack by its lowest sampled speed against the threshold', () => {
    for (const w of whole) {
      let min = Number.POSITIVE_INFINITY;
      for (let i = 0; i < grid.nt; i++) {
        const t = START + i * grid.stepMs;
        if (t >= w.startMs && t <= w.endMs) min = Math.min(min, grid.depthMeanSpeed[i]!);
      }
      expect(w.strength).toBeCloseTo(1 - min / 0.1, 12);
    }
  });

  it('starts a slack that is under way at the forecast start at the first output, flagged clipped', () => {
    // At t = 0 the current is A sin(−ω·17 min) = −0.057 m/s, already below 0.1 m/s.
    const first = windows[0]!;
    expect(first.startMs).toBe(START);
    expect(first.clipped).toBe(true);
    expect(Math.abs(first.endMs - (zeroMs(0) + halfWidthMs))).toBeLessThan(MINUTE);
  });
});

describe('a subsurface layer at 8 m', () => {
  // 16 m in fifteen layers of 16/15 m: the eighth layer's centre is at 7.5 × 16/15 = 8 m.
  // Background 100 cells/L plus a layer P(t) exp(−(d − 8)²), P rising to 1500 at 3:00 and falling back by 4:00.
  const thickness = Array.from({ length: 15 }, () => 16 / 15);
  const pAt = (t: number) => 1500 * Math.max(0, 1 - Math.abs(t - START - 3 * HOUR) / HOUR);
  const grid = handGrid({
    stepMin: 10,
    nt: 37,
    thicknessM: thickness,
    conc: (t, d) => 100 + pAt(t) * Math.exp(-((d - 8) ** 2)),
  });
  const layers = ofKind(findWindows(grid, DEFAULT_WINDOW_SETTINGS), 'subsurface_peak');

  it('finds one subsurface-peak window at 8 m, peaking when the layer is strongest', () => {
    expect(layers).toHaveLength(1);
    expect(layers[0]!.peakDepthM).toBeCloseTo(8, 9);
    expect(layers[0]!.peakMs).toBe(START + 3 * HOUR);
  });

  it('opens and closes the window where the peak reaches twice the depth mean', () => {
    // ratio = (100 + P)/(100 + P S), S = Σ h exp(−(d − 8)²)/H; ratio = 2 at P = 100/(1 − 2S).
    let s = 0;
    for (let k = 0; k < 15; k++) s += (16 / 15) * Math.exp(-((grid.depthM[k]! - 8) ** 2));
    s /= 16;
    const p = 100 / (1 - 2 * s);
    const offsetMs = (1 - p / 1500) * HOUR;
    expect(Math.abs(layers[0]!.startMs - (START + 3 * HOUR - offsetMs))).toBeLessThan(MINUTE);
    expect(Math.abs(layers[0]!.endMs - (START + 3 * HOUR + offsetMs))).toBeLessThan(MINUTE);
  });

  it('uses the peak ratio as the strength', () => {
    let mean = 0;
    for (let k = 0; k < 15; k++) mean += (16 / 15) * grid.concentration[18 * 15 + k]!;
    mean /= 16;
    expect(layers[0]!.strength).toBeCloseTo(grid.concentration[18 * 15 + 7]! / mean, 6);
  });
});

describe('short windows', () => {
  // A slump blip: the bottom metre at 3 × the mean for one 10 min output only.
  const grid = handGrid({
    stepMin: 10,
    nt: 13,
    thicknessM: Array.from({ length: 10 }, () => 1),
    conc: (t, _d, k) => {
      const r = t === START + HOUR ? 3 : 1;
      return k === 9 ? 100 * r : (100 * (10 - r)) / 9;
    },
  });

  it('drops windows shorter than the site minimum and keeps them when the minimum is lowered', () => {
    // The blip's window runs from 5 min before to 5 min after the output (ratio 1 → 3 → 1, edge at 2): 10 min long.
    expect(ofKind(findWindows(grid, DEFAULT_WINDOW_SETTINGS), 'slump')).toHaveLength(0);
    const kept = ofKind(findWindows(grid, windowSettingsSchema.parse({ minWindowMinutes: 5 })), 'slump');
    expect(kept).toHaveLength(1);
    expect(Math.abs(kept[0]!.endMs - kept[0]!.startMs - 10 * MINUTE)).toBeLessThan(1000);
  });
});

describe('window settings', () => {
  it('fills in the defaults of docs/windows.md', () => {
    const parsed = parseWindowSettings({});
    expect(parsed).toEqual({
      ok: true,
      value: {
        slackSpeedMPerS: 0.1,
        slumpRatio: 2,
        slumpNearBedM: 1,
        mixedCv: 0.25,
        subsurfacePeakRatio: 2,
        subsurfaceMarginM: 1,
        minWindowMinutes: 20,
      },
    });
  });

  it('refuses a slump ratio of 1 or less, naming the field', () => {
    const parsed = parseWindowSettings({ slumpRatio: 1 });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.issues[0]!.path).toBe('slumpRatio');
  });

  it('refuses an unknown setting', () => {
    expect(parseWindowSettings({ slackSpeed: 0.2 }).ok).toBe(false);
  });
});

describe('windows of an engine run with a pure M2 current', () => {
  // Depth-mean forcing u = 0.4 cos(ω t) m/s from the start (docs/model-case.md: phase lag 0 at `start`),
  // a settling organism (5e-4 m/s, 43 m/d), k-epsilon closure, 60 layers in 15 m, 2 days at 10 min outputs.
  const outcome = runCase({
    depth_m: 15,
    layers: 60,
    time_step_s: 30,
    duration_s: 2 * 86_400,
    output_interval_s: 600,
    latitude_deg: 56,
    bed_roughness_m: 0.01,
    closure: { type: 'k-epsilon' },
    forcing: {
      type: 'depth_mean_current',
      start: '2025-06-02T00:00:00Z',
      constituents: [{ name: 'M2', amplitude_m_s: 0.4, phase_deg: 0 }],
    },
    organisms: [{ name: 'settling', settling_velocity_m_s: 5e-4, initial_concentration: 1000 }],
  });
  if (!outcome.ok || outcome.result.status !== 'ok') throw new Error('the engine run failed');
  const result = outcome.result;
  const grid = gridFromModelResult(result, { startMs: START, waterDepthM: 15, organismIndex: 0 });
  const windows = findWindows(grid, DEFAULT_WINDOW_SETTINGS);
  const slacks = ofKind(windows, 'slack');
  // Zeros of cos(ωt): ωt = 90° + k·180°; |u| < 0.1 within ± asin(0.25)/ω [derivation, exact]. The engine
  // holds the depth mean on its target to round-off (docs/model-case.md), so these are the run's slacks.
  const zeroMs = (k: number) => START + ((90 + 180 * k) / M2_DEG_PER_H) * HOUR;
  const halfWidthMs = (Math.asin(0.25) * (180 / Math.PI) * HOUR) / M2_DEG_PER_H;
  const runEndMs = START + 2 * 86_400_000;

  it('converts the run with its depth-mean current, layer thicknesses and layer speeds', () => {
    expect(grid.nt).toBe(result.outputs);
    let depth = 0;
    for (let k = 0; k < grid.nz; k++) depth += grid.thicknessM[k]!;
    expect(depth).toBeCloseTo(15, 9);
    for (const i of [30, 100, 200]) {
      expect(grid.depthMeanAlong[i]).toBe(result.depthMeanU[i]);
      const j = i * 60 + 45;
      expect(grid.speed[j]).toBeCloseTo(Math.hypot(result.u[j]!, result.v[j]!), 6);
      expect(grid.diffusivity[j]).toBeCloseTo(result.eddyViscosity[j]! + 1e-6, 6);
    }
  });

  it('finds one slack window at each analytic zero of the forcing', () => {
    let zeros = 0;
    for (let k = 0; zeroMs(k) < runEndMs; k++) zeros++;
    expect(slacks).toHaveLength(zeros);
  });

  it('centres the slack windows on the zero crossings within one output interval', () => {
    for (const w of slacks) {
      const k = Math.round(((w.peakMs - START) / HOUR) * (M2_DEG_PER_H / 180) - 0.5);
      expect(Math.abs((w.startMs + w.endMs) / 2 - zeroMs(k))).toBeLessThan(10 * MINUTE);
      expect(Math.abs(w.peakMs - zeroMs(k))).toBeLessThan(MINUTE);
    }
  });

  it('places the slack edges within one minute of where the forcing speed crosses 0.1 m/s', () => {
    for (const w of slacks) {
      const k = Math.round(((w.peakMs - START) / HOUR) * (M2_DEG_PER_H / 180) - 0.5);
      expect(Math.abs(w.startMs - (zeroMs(k) - halfWidthMs))).toBeLessThan(MINUTE);
      expect(Math.abs(w.endMs - (zeroMs(k) + halfWidthMs))).toBeLessThan(MINUTE);
    }
  });

  it('turns to the ebb at the first slack, since the forcing starts at flood maximum', () => {
    expect(slacks.map((w) => w.tideStage).slice(0, 4)).toEqual(['before_ebb', 'before_flood', 'before_ebb', 'before_flood']);
  });

  it('finds a slump window peaking after each slack for a settling organism', () => {
    const slumps = ofKind(windows, 'slump');
    for (const s of slacks.filter((w) => w.peakMs < runEndMs - 3 * HOUR)) {
      const after = slumps.find((w) => w.peakMs > s.peakMs && w.peakMs < s.peakMs + 3 * HOUR && w.startMs > s.startMs);
      expect(after, `slump after the slack at ${new Date(s.peakMs).toISOString()}`).toBeDefined();
    }
  });

  it('finds the column mixed at each peak of flow once turbulence has spun up', () => {
    // Peaks of |cos(ωt)| at ωt = k·180°; from the first after three hours.
    const mixed = ofKind(windows, 'mixed');
    let checked = 0;
    for (let k = 1; START + ((180 * k) / M2_DEG_PER_H) * HOUR < runEndMs - HOUR; k++) {
      const peak = START + ((180 * k) / M2_DEG_PER_H) * HOUR;
      expect(mixed.some((w) => w.startMs <= peak && w.endMs >= peak)).toBe(true);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(6);
  });
});
