import { describe, expect, it } from 'vitest';
import { createTidePredictor } from '@neaps/tide-predictor';
import { findCurrentPhases, findHighLowWaters, findSlackWaters } from '../../shared/tides/events.ts';
import type { CurrentConstituent } from '../../shared/tides/predict.ts';
import { classifyFormFactor, formFactor, springNeapState } from '../../shared/tides/tide-character.ts';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;
const HOUR = 3_600_000;
const MINUTE = 60_000;
const M2_SPEED = 28.9841042; // °/h, IHO list (REFERENCES §8)
const START = Date.parse('2025-07-01T00:00:00Z');

/** A series from @neaps/tide-predictor (Schureman option) every `stepS` seconds. */
function referenceSeries(constituents: { name: string; amplitude: number; phase: number }[], days: number, stepS: number) {
  return createTidePredictor(constituents, { nodeCorrections: 'schureman' }).getTimelinePrediction({
    start: new Date(START),
    end: new Date(START + days * 24 * HOUR),
    timeFidelity: stepS,
  });
}

/** Zero crossings of a sampled series by linear interpolation between neighbouring samples. */
function crossings(times: number[], values: number[]): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length; i++) {
    const a = values[i - 1]!;
    const b = values[i]!;
    if ((a < 0 && b >= 0) || (a > 0 && b <= 0)) out.push(times[i - 1]! + ((times[i]! - times[i - 1]!) * a) / (a - b));
  }
  return out;
}

/** Local minima of a sampled series, refined by a parabola through the three samples. */
function minima(times: number[], values: number[]): { t: number; value: number }[] {
  const out: { t: number; value: number }[] = [];
  for (let i = 1; i + 1 < values.length; i++) {
    const [a, b, c] = [values[i - 1]!, values[i]!, values[i + 1]!];
    if (b < a && b <= c) {
      const denom = a - 2 * b + c;
      const shift = denom > 0 ? (0.5 * (a - c)) / denom : 0;
      out.push({ t: times[i]! + shift * (times[i + 1]! - times[i]!), value: b });
    }
  }
  return out;
}

function nearest(list: number[], t: number): number {
  return list.reduce((best, x) => (Math.abs(x - t) < Math.abs(best - t) ? x : best), Number.POSITIVE_INFINITY);
}

describe('slack water of a rectilinear current', () => {
  it('falls at the analytic zeros of a pure M2 current, ωt − g = 90° + k·180°', () => {
    // Exact: u = A cos(ωt − g) vanishes at t = (90° + g + k·180°)/ω (REFERENCES §8 M2 speed).
    const g = 37;
    const c: CurrentConstituent[] = [{ name: 'M2', major: 0.9, phaseDeg: g }];
    const r = findSlackWaters(c, START, START + 3 * 24 * HOUR, { astronomical: false, epochMs: START });
    if (!r.ok) throw new Error(r.message);
    expect(r.rectilinear).toBe(true);
    const expected: number[] = [];
    for (let k = 0; ; k++) {
      const t = START + ((90 + g + 180 * k) / M2_SPEED) * HOUR;
      if (t > START + 3 * 24 * HOUR) break;
      expected.push(t);
    }
    expect(r.slacks).toHaveLength(expected.length);
    r.slacks.forEach((s, k) => {
      expect(Math.abs(s.timeMs - expected[k]!)).toBeLessThan(2 * MINUTE);
      expect(s.speed).toBeLessThan(1e-3);
      // After the first zero (90°) the cosine turns negative: ebb for floodSign = +1.
      expect(s.turnsTo).toBe(k % 2 === 0 ? 'ebb' : 'flood');
    });
  });

  it('matches the zero crossings of the @neaps/tide-predictor series for M2 + S2 + M4 + K1 within 2 minutes', () => {
    // Reference: along-axis current from @neaps/tide-predictor 0.11.0 (Schureman option) every
    // 60 s; crossings located by linear interpolation between samples.
    const set = [
      { name: 'M2', amplitude: 0.8, phase: 100 },
      { name: 'S2', amplitude: 0.25, phase: 140 },
      { name: 'M4', amplitude: 0.12, phase: 220 },
      { name: 'K1', amplitude: 0.08, phase: 15 },
    ];
    const ref = referenceSeries(set, 7, 60);
    const refZeros = crossings(
      ref.map((p) => p.time.getTime()),
      ref.map((p) => p.level),
    );
    const r = findSlackWaters(
      set.map((c) => ({ name: c.name, major: c.amplitude, phaseDeg: c.phase })),
      START,
      START + 7 * 24 * HOUR,
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.slacks.length).toBe(refZeros.length);
    for (const s of r.slacks) expect(Math.abs(nearest(refZeros, s.timeMs) - s.timeMs)).toBeLessThan(2 * MINUTE);
  });
});

describe('slack water of a rotary current', () => {
  it('falls where a single M2 ellipse points along its minor axis, with the minor axis as its depth', () => {
    // Exact: speed² = A² cos²φ + B² sin²φ is least at φ = 90° + k·180°, where speed = |B|.
    const c: CurrentConstituent[] = [{ name: 'M2', major: 0.7, minor: -0.15, inclinationDeg: 60, phaseDeg: 10 }];
    const r = findSlackWaters(c, START, START + 2 * 24 * HOUR, { astronomical: false, epochMs: START });
    if (!r.ok) throw new Error(r.message);
    expect(r.rectilinear).toBe(false);
    // Two minima per M2 cycle: 48 h / 6.2103 h gives 8 in two days (the first at 3.45 h).
    expect(r.slacks.length).toBe(8);
    r.slacks.forEach((s, k) => {
      const t = START + ((90 + 10 + 180 * k) / M2_SPEED) * HOUR;
      expect(Math.abs(s.timeMs - t)).toBeLessThan(2 * MINUTE);
      expect(s.speed).toBeCloseTo(0.15, 6);
    });
  });

  it('matches the speed minima of @neaps/tide-predictor east/north series within 2 minutes', () => {
    // Reference: u and v from @neaps/tide-predictor every 60 s for ellipses converted with the
    // direct formulas (Foreman 1978; Pugh 1987 §3.6); minima refined by a parabola.
    const ellipses: CurrentConstituent[] = [
      { name: 'M2', major: 0.8, minor: 0.2, inclinationDeg: 30, phaseDeg: 100 },
      { name: 'S2', major: 0.25, minor: 0.05, inclinationDeg: 35, phaseDeg: 140 },
      { name: 'M4', major: 0.1, minor: 0.02, inclinationDeg: 10, phaseDeg: 220 },
    ];
    const comps = ellipses.map((e) => {
      const A = e.major;
      const B = e.minor ?? 0;
      const th = e.inclinationDeg! * RAD;
      const g = e.phaseDeg * RAD;
      const uc = A * Math.cos(th) * Math.cos(g) + B * Math.sin(th) * Math.sin(g);
      const us = A * Math.cos(th) * Math.sin(g) - B * Math.sin(th) * Math.cos(g);
      const vc = A * Math.sin(th) * Math.cos(g) - B * Math.cos(th) * Math.sin(g);
      const vs = A * Math.sin(th) * Math.sin(g) + B * Math.cos(th) * Math.cos(g);
      return {
        u: { name: e.name, amplitude: Math.hypot(uc, us), phase: Math.atan2(us, uc) * DEG },
        v: { name: e.name, amplitude: Math.hypot(vc, vs), phase: Math.atan2(vs, vc) * DEG },
      };
    });
    const u = referenceSeries(comps.map((c) => c.u), 4, 60);
    const v = referenceSeries(comps.map((c) => c.v), 4, 60);
    const times = u.map((p) => p.time.getTime());
    const speed = u.map((p, i) => Math.hypot(p.level, v[i]!.level));
    const refMinima = minima(times, speed);
    const r = findSlackWaters(ellipses, START, START + 4 * 24 * HOUR);
    if (!r.ok) throw new Error(r.message);
    expect(r.slacks.length).toBe(refMinima.length);
    for (const s of r.slacks) {
      const ref = refMinima.reduce((best, m) => (Math.abs(m.t - s.timeMs) < Math.abs(best.t - s.timeMs) ? m : best));
      expect(Math.abs(ref.t - s.timeMs)).toBeLessThan(2 * MINUTE);
      expect(Math.abs(ref.value - s.speed)).toBeLessThan(1e-3);
    }
  });
});

describe('flood and ebb', () => {
  it('alternates flood and ebb between the slacks of an M2 current, each half a period long with peak A', () => {
    // Exact for a pure M2 current: phases of 6.2103 h, peak speed A (REFERENCES §8 M2 period).
    const c: CurrentConstituent[] = [{ name: 'M2', major: 0.9, phaseDeg: 0 }];
    const r = findCurrentPhases(c, START, START + 2 * 24 * HOUR, { astronomical: false, epochMs: START });
    if (!r.ok) throw new Error(r.message);
    const complete = r.phases.filter((p) => p.complete);
    expect(complete.length).toBeGreaterThanOrEqual(6);
    for (const p of complete) {
      expect((p.endMs - p.startMs) / HOUR).toBeCloseTo(6.2103006, 3);
      // Peak from 48 samples per phase: at most half a sample (1.875°) from the crest.
      expect(p.peakSpeed).toBeGreaterThanOrEqual(0.9 * Math.cos(Math.PI / 96) - 1e-12);
      expect(p.peakSpeed).toBeLessThanOrEqual(0.9 + 1e-12);
    }
    // At t = 0 the current is +A: the first (partial) phase is a flood; then ebb, flood, …
    r.phases.forEach((p, k) => expect(p.kind).toBe(k % 2 === 0 ? 'flood' : 'ebb'));
  });

  it('swaps flood and ebb when the flood runs toward negative values', () => {
    const c: CurrentConstituent[] = [{ name: 'M2', major: 0.9, phaseDeg: 0 }];
    const r = findCurrentPhases(c, START, START + 24 * HOUR, { astronomical: false, epochMs: START, floodSign: -1 });
    if (!r.ok) throw new Error(r.message);
    expect(r.phases[0]!.kind).toBe('ebb');
    expect(r.phases[1]!.kind).toBe('flood');
  });
});

describe('high and low water', () => {
  it('match the extremes of @neaps/tide-predictor within 2 minutes and 1 mm over 14 days', () => {
    // Reference: @neaps/tide-predictor 0.11.0 getExtremesPrediction, Schureman option.
    const set = [
      { name: 'M2', amplitude: 1.42, phase: 118 },
      { name: 'S2', amplitude: 0.47, phase: 152 },
      { name: 'N2', amplitude: 0.28, phase: 99 },
      { name: 'K1', amplitude: 0.11, phase: 201 },
      { name: 'O1', amplitude: 0.09, phase: 47 },
      { name: 'M4', amplitude: 0.04, phase: 310 },
    ];
    const end = START + 14 * 24 * HOUR;
    const ref = createTidePredictor(set, { nodeCorrections: 'schureman' }).getExtremesPrediction({
      start: new Date(START),
      end: new Date(end),
    });
    const r = findHighLowWaters(
      set.map((c) => ({ name: c.name, amplitude: c.amplitude, phaseDeg: c.phase })),
      START,
      end,
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.events.length).toBe(ref.length);
    r.events.forEach((e, i) => {
      const x = ref[i]!;
      expect(e.kind).toBe(x.high ? 'high' : 'low');
      expect(Math.abs(e.timeMs - x.time.getTime())).toBeLessThan(2 * MINUTE);
      expect(Math.abs(e.level - x.level)).toBeLessThan(0.001);
    });
  });

  it('gives spring range 2.6 and neap range 1.4, 7.383 days apart, for M2 + S2 of amplitudes 1 and 0.3', () => {
    // Source: REFERENCES §8 trivial prediction checks [CALC]: f = 1, V0 + u = g = 0.
    const set = [
      { name: 'M2', amplitude: 1, phaseDeg: 0 },
      { name: 'S2', amplitude: 0.3, phaseDeg: 0 },
    ];
    const r = findHighLowWaters(set, START - HOUR, START + 15 * 24 * HOUR, { astronomical: false, epochMs: START });
    if (!r.ok) throw new Error(r.message);
    const ranges: { t: number; range: number }[] = [];
    for (let i = 0; i + 1 < r.events.length; i++) {
      const a = r.events[i]!;
      const b = r.events[i + 1]!;
      if (a.kind === 'high') ranges.push({ t: a.timeMs, range: a.level - b.level });
    }
    const spring = ranges.reduce((x, y) => (y.range > x.range ? y : x));
    const neap = ranges.reduce((x, y) => (y.range < x.range ? y : x));
    expect(spring.range).toBeCloseTo(2.6, 2);
    expect(neap.range).toBeCloseTo(1.4, 2);
    // The tidal cycle that carries the extreme range is within half a cycle of the exact instant.
    expect(Math.abs((neap.t - spring.t) / (24 * HOUR) - 7.383)).toBeLessThan(0.26);
  });
});

describe('spring–neap indicator', () => {
  const set = [
    { name: 'M2', amplitude: 1, phaseDeg: 0 },
    { name: 'S2', amplitude: 0.3, phaseDeg: 0 },
  ];
  const opts = { astronomical: false, epochMs: START };

  it('is 1 at springs and 0 at neaps, 7.383 days later', () => {
    // Exact: half the MSf period, 360/(2 (S2 − M2)) h = 7.3826 d (REFERENCES §8 beat periods).
    const spring = springNeapState(set, START, opts);
    const neap = springNeapState(set, START + 7.3826 * 24 * HOUR, opts);
    if (!spring.ok || !neap.ok) throw new Error('indicator failed');
    expect(spring.state.index).toBeCloseTo(1, 9);
    expect(spring.state.envelopeRatio).toBeCloseTo(1.3, 9);
    expect(spring.state.daysToNextNeap).toBeCloseTo(7.3826, 4);
    expect(neap.state.index).toBeCloseTo(0, 6);
    expect(neap.state.envelope).toBeCloseTo(0.7, 6);
    expect(neap.state.msfPhaseDeg).toBeCloseTo(180, 2);
    expect(neap.state.daysToNextSpring).toBeCloseTo(7.3826, 3);
  });

  it('needs both M2 and S2', () => {
    const r = springNeapState([{ name: 'M2', amplitude: 1, phaseDeg: 0 }], START);
    expect(r.ok).toBe(false);
  });
});

describe('form factor', () => {
  it('classifies by the Courtier table of REFERENCES §8', () => {
    // Source: Courtier (1938); Pugh (1987) §4.2 [MEM] via REFERENCES §8.
    expect(classifyFormFactor(0.1)).toBe('semidiurnal');
    expect(classifyFormFactor(0.2499)).toBe('semidiurnal');
    expect(classifyFormFactor(0.25)).toBe('mixed, mainly semidiurnal');
    expect(classifyFormFactor(1.49)).toBe('mixed, mainly semidiurnal');
    expect(classifyFormFactor(1.5)).toBe('mixed, mainly diurnal');
    expect(classifyFormFactor(3.0)).toBe('mixed, mainly diurnal');
    expect(classifyFormFactor(3.01)).toBe('diurnal');
  });

  it('computes F = (K1 + O1)/(M2 + S2) from a constituent list', () => {
    const r = formFactor([
      { name: 'M2', amplitude: 1 },
      { name: 'S2', amplitude: 0.25 },
      { name: 'K1', amplitude: 0.3 },
      { name: 'O1', amplitude: 0.2 },
      { name: 'N2', amplitude: 0.2 },
    ]);
    if (!r.ok) throw new Error(r.message);
    expect(r.F).toBeCloseTo(0.4, 12);
    expect(r.type).toBe('mixed, mainly semidiurnal');
  });

  it('refuses a set without semidiurnal constituents', () => {
    expect(formFactor([{ name: 'K1', amplitude: 0.3 }]).ok).toBe(false);
  });
});
