import { describe, expect, it } from 'vitest';
import { createTidePredictor } from '@neaps/tide-predictor';
import { componentsFromEllipse, ellipseFromComponents } from '../../shared/tides/ellipse.ts';
import { predictCurrent, predictLevel, regularTimes, type CurrentConstituent, type LevelConstituent } from '../../shared/tides/predict.ts';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;
const HOUR = 3_600_000;

// An invented mixed, mainly semidiurnal site (amplitudes m, phases °).
const LEVEL_SET: LevelConstituent[] = [
  { name: 'M2', amplitude: 1.42, phaseDeg: 118 },
  { name: 'S2', amplitude: 0.47, phaseDeg: 152 },
  { name: 'N2', amplitude: 0.28, phaseDeg: 99 },
  { name: 'K2', amplitude: 0.13, phaseDeg: 149 },
  { name: 'K1', amplitude: 0.31, phaseDeg: 201 },
  { name: 'O1', amplitude: 0.24, phaseDeg: 47 },
  { name: 'P1', amplitude: 0.1, phaseDeg: 195 },
  { name: 'Q1', amplitude: 0.05, phaseDeg: 12 },
  { name: 'M4', amplitude: 0.08, phaseDeg: 310 },
  { name: 'MS4', amplitude: 0.05, phaseDeg: 355 },
  { name: 'MN4', amplitude: 0.03, phaseDeg: 290 },
  { name: 'M6', amplitude: 0.02, phaseDeg: 40 },
  { name: '2N2', amplitude: 0.04, phaseDeg: 80 },
  { name: 'NU2', amplitude: 0.05, phaseDeg: 101 },
  { name: 'MU2', amplitude: 0.04, phaseDeg: 130 },
  { name: 'L2', amplitude: 0.04, phaseDeg: 140 },
  { name: 'T2', amplitude: 0.03, phaseDeg: 150 },
  { name: 'J1', amplitude: 0.02, phaseDeg: 220 },
  { name: 'OO1', amplitude: 0.015, phaseDeg: 250 },
  { name: 'Mf', amplitude: 0.03, phaseDeg: 10 },
  { name: 'MSf', amplitude: 0.02, phaseDeg: 20 },
  { name: 'Mm', amplitude: 0.025, phaseDeg: 30 },
];

const CURRENT_SET: CurrentConstituent[] = [
  { name: 'M2', major: 0.82, minor: 0.11, inclinationDeg: 35, phaseDeg: 84 },
  { name: 'S2', major: 0.27, minor: 0.04, inclinationDeg: 38, phaseDeg: 121 },
  { name: 'N2', major: 0.16, minor: -0.02, inclinationDeg: 31, phaseDeg: 66 },
  { name: 'K2', major: 0.07, minor: 0.01, inclinationDeg: 40, phaseDeg: 118 },
  { name: 'K1', major: 0.09, minor: -0.03, inclinationDeg: 52, phaseDeg: 190 },
  { name: 'O1', major: 0.07, minor: 0.02, inclinationDeg: 48, phaseDeg: 31 },
  { name: 'M4', major: 0.06, minor: 0.02, inclinationDeg: 170, phaseDeg: 250 },
  { name: 'MS4', major: 0.03, minor: 0.0, inclinationDeg: 20, phaseDeg: 300 },
];

const START = Date.parse('2024-03-01T00:00:00Z');
const END = START + 30 * 24 * HOUR;

/** @neaps/tide-predictor with its Schureman nodal corrections (like for like), every 10 min. */
function reference(constituents: { name: string; amplitude: number; phase: number }[], offset = 0) {
  return createTidePredictor(constituents, { nodeCorrections: 'schureman', offset }).getTimelinePrediction({
    start: new Date(START),
    end: new Date(END),
    timeFidelity: 600,
  });
}

/**
 * East and north amplitude and phase of an ellipse, written out directly (Foreman 1978 /
 * Pugh 1987 §3.6): u = A cosθ cos(Φ − g) − B sinθ sin(Φ − g), v = A sinθ cos(Φ − g) + B cosθ sin(Φ − g).
 */
function directComponents(c: CurrentConstituent) {
  const A = c.major;
  const B = c.minor ?? 0;
  const th = (c.inclinationDeg ?? 0) * RAD;
  const g = c.phaseDeg * RAD;
  const uc = A * Math.cos(th) * Math.cos(g) + B * Math.sin(th) * Math.sin(g);
  const us = A * Math.cos(th) * Math.sin(g) - B * Math.sin(th) * Math.cos(g);
  const vc = A * Math.sin(th) * Math.cos(g) - B * Math.cos(th) * Math.sin(g);
  const vs = A * Math.sin(th) * Math.sin(g) + B * Math.cos(th) * Math.cos(g);
  return { uAmp: Math.hypot(uc, us), uPhase: Math.atan2(us, uc) * DEG, vAmp: Math.hypot(vc, vs), vPhase: Math.atan2(vs, vc) * DEG };
}

describe('water level prediction', () => {
  it('matches @neaps/tide-predictor within 1 mm over 30 days for a 22-constituent set', () => {
    // Reference: npm @neaps/tide-predictor 0.11.0 (general-purpose reference library),
    // nodeCorrections "schureman", offset = datum.
    const ref = reference(
      LEVEL_SET.map((c) => ({ name: c.name, amplitude: c.amplitude, phase: c.phaseDeg })),
      2.35,
    );
    const mine = predictLevel(LEVEL_SET, ref.map((p) => p.time), { datum: 2.35 });
    expect(mine.ok).toBe(true);
    if (!mine.ok) return;
    let worst = 0;
    ref.forEach((p, i) => (worst = Math.max(worst, Math.abs(p.level - mine.values[i]!))));
    expect(ref.length).toBe(30 * 144 + 1);
    expect(worst).toBeLessThan(0.001);
  });

  it('gives the same values with hourly and daily nodal updates to 0.1 mm', () => {
    const times = regularTimes(START, START + 10 * 24 * HOUR, 600_000);
    const daily = predictLevel(LEVEL_SET, times, { nodalUpdate: 'day' });
    const hourly = predictLevel(LEVEL_SET, times, { nodalUpdate: 'hour' });
    if (!daily.ok || !hourly.ok) throw new Error('prediction failed');
    let worst = 0;
    for (let i = 0; i < times.length; i++) worst = Math.max(worst, Math.abs(daily.values[i]! - hourly.values[i]!));
    expect(worst).toBeLessThan(1e-4);
  });

  it('gives h(3 h) = 0.053167 and h(6.2103006 h) = −1 for M2 alone with H = 1, f = 1, V0 + u = g = 0', () => {
    // Source: REFERENCES §8 trivial prediction checks [CALC]: cos(86.952°) = 0.053167.
    const epoch = Date.parse('2030-01-01T00:00:00Z');
    const r = predictLevel([{ name: 'M2', amplitude: 1, phaseDeg: 0 }], [epoch + 3 * HOUR, epoch + 6.2103006 * HOUR], {
      astronomical: false,
      epochMs: epoch,
    });
    if (!r.ok) throw new Error(r.message);
    expect(r.values[0]).toBeCloseTo(0.053167, 6);
    expect(r.values[1]).toBeCloseTo(-1, 9);
  });

  it('refuses an unknown constituent and names it', () => {
    const r = predictLevel([{ name: 'M2', amplitude: 1, phaseDeg: 0 }, { name: 'Q9', amplitude: 1, phaseDeg: 0 }], [START]);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('unknown-constituent');
      expect(r.message).toContain('"Q9"');
    }
  });

  it('refuses a negative amplitude and an invalid time', () => {
    expect(predictLevel([{ name: 'M2', amplitude: -1, phaseDeg: 0 }], [START]).ok).toBe(false);
    expect(predictLevel([{ name: 'M2', amplitude: 1, phaseDeg: 0 }], [Number.NaN]).ok).toBe(false);
  });
});

describe('current prediction', () => {
  it('matches @neaps/tide-predictor within 1 mm/s along a rectilinear axis over 30 days', () => {
    // Reference: @neaps/tide-predictor 0.11.0, Schureman option, the along-axis current as a scalar series.
    const rectilinear = CURRENT_SET.map((c) => ({ name: c.name, major: c.major, phaseDeg: c.phaseDeg }));
    const ref = reference(rectilinear.map((c) => ({ name: c.name, amplitude: c.major, phase: c.phaseDeg })));
    const mine = predictCurrent(rectilinear, ref.map((p) => p.time));
    if (!mine.ok) throw new Error(mine.message);
    expect(mine.east).toBeNull();
    let worst = 0;
    ref.forEach((p, i) => (worst = Math.max(worst, Math.abs(p.level - mine.along[i]!))));
    expect(worst).toBeLessThan(0.001);
  });

  it('matches @neaps/tide-predictor within 1 mm/s in east and north components of tidal ellipses over 30 days', () => {
    // Reference: @neaps/tide-predictor 0.11.0 run once for u and once for v, with component
    // amplitudes and phases from the direct ellipse formulas above (Foreman 1978; Pugh 1987).
    const comps = CURRENT_SET.map((c) => ({ name: c.name, ...directComponents(c) }));
    const refU = reference(comps.map((c) => ({ name: c.name, amplitude: c.uAmp, phase: c.uPhase })));
    const refV = reference(comps.map((c) => ({ name: c.name, amplitude: c.vAmp, phase: c.vPhase })));
    const mine = predictCurrent(CURRENT_SET, refU.map((p) => p.time));
    if (!mine.ok) throw new Error(mine.message);
    let worst = 0;
    refU.forEach((p, i) => {
      worst = Math.max(worst, Math.abs(p.level - mine.east![i]!), Math.abs(refV[i]!.level - mine.north![i]!));
    });
    expect(worst).toBeLessThan(0.001);
  });

  it('projects onto the main axis, taken from the largest constituent by default', () => {
    const times = regularTimes(START, START + 2 * 24 * HOUR, 1_800_000);
    const r = predictCurrent(CURRENT_SET, times);
    if (!r.ok) throw new Error(r.message);
    expect(r.axisDeg).toBe(35);
    const c = Math.cos(35 * RAD);
    const s = Math.sin(35 * RAD);
    for (let i = 0; i < times.length; i++) {
      expect(r.along[i]).toBeCloseTo(r.east![i]! * c + r.north![i]! * s, 12);
      expect(r.speed[i]).toBeCloseTo(Math.hypot(r.along[i]!, r.across[i]!), 12);
    }
  });

  it('refuses inclinations given for some constituents only', () => {
    const r = predictCurrent([CURRENT_SET[0]!, { name: 'S2', major: 0.2, phaseDeg: 0 }], [START]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('S2');
  });
});

describe('tidal ellipse conversion', () => {
  it('agrees with the direct component formulas and round-trips', () => {
    // Direct formulas (Foreman 1978; Pugh 1987 §3.6) against the rotary-component route.
    for (const c of CURRENT_SET) {
      const d = directComponents(c);
      const mine = componentsFromEllipse({ major: c.major, minor: c.minor ?? 0, inclinationDeg: c.inclinationDeg!, phaseDeg: c.phaseDeg });
      expect(mine.uAmplitude).toBeCloseTo(d.uAmp, 12);
      expect(mine.vAmplitude).toBeCloseTo(d.vAmp, 12);
      expect(Math.cos((mine.uPhaseDeg - d.uPhase) * RAD)).toBeCloseTo(1, 12);
      expect(Math.cos((mine.vPhaseDeg - d.vPhase) * RAD)).toBeCloseTo(1, 12);
      const back = ellipseFromComponents(mine);
      expect(back.major).toBeCloseTo(c.major, 12);
      expect(back.minor).toBeCloseTo(c.minor ?? 0, 12);
      // θ in [0, 180): an inclination of 170° stays, others unchanged; phase follows.
      expect(back.inclinationDeg).toBeCloseTo(c.inclinationDeg!, 9);
      expect(Math.cos((back.phaseDeg - c.phaseDeg) * RAD)).toBeCloseTo(1, 12);
    }
  });

  it('reports an inclination of 200° as 20° with the phase moved by 180°', () => {
    const e = ellipseFromComponents(componentsFromEllipse({ major: 1, minor: 0.3, inclinationDeg: 200, phaseDeg: 10 }));
    expect(e.inclinationDeg).toBeCloseTo(20, 9);
    expect(e.phaseDeg).toBeCloseTo(190, 9);
    expect(e.minor).toBeCloseTo(0.3, 12);
  });
});
