import { describe, expect, it } from 'vitest';
import { createTidePredictor } from '@neaps/tide-predictor';
import { analyseCurrent, analyseSeries } from '../../shared/tides/analysis.ts';
import { choleskyFactor, choleskySolve, CHOLESKY_NOT_POSITIVE_DEFINITE, CHOLESKY_OK } from '../../shared/tides/cholesky.ts';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;
const HOUR = 3_600_000;
const START = Date.parse('2025-05-01T00:00:00Z');

/** Mulberry32, a small seeded PRNG, so the record is the same on every run. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by the Box–Muller transform. */
function gaussian(next: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
}

function angleDiff(a: number, b: number): number {
  return ((((a - b) % 360) + 540) % 360) - 180;
}

interface Ellipse {
  name: string;
  major: number;
  minor: number;
  inclinationDeg: number;
  phaseDeg: number;
}

// Invented ellipses for a channel site (m/s, degrees).
const TRUTH: Ellipse[] = [
  { name: 'M2', major: 0.78, minor: 0.09, inclinationDeg: 32, phaseDeg: 95 },
  { name: 'S2', major: 0.26, minor: 0.03, inclinationDeg: 36, phaseDeg: 131 },
  { name: 'N2', major: 0.15, minor: -0.02, inclinationDeg: 29, phaseDeg: 74 },
  { name: 'K1', major: 0.12, minor: -0.03, inclinationDeg: 45, phaseDeg: 200 },
  { name: 'O1', major: 0.1, minor: 0.02, inclinationDeg: 50, phaseDeg: 33 },
  { name: 'M4', major: 0.1, minor: 0.03, inclinationDeg: 160, phaseDeg: 250 },
];

/** u and v amplitude/phase of an ellipse, written out directly (Foreman 1978; Pugh 1987 §3.6). */
function components(e: Ellipse) {
  const th = e.inclinationDeg * RAD;
  const g = e.phaseDeg * RAD;
  const uc = e.major * Math.cos(th) * Math.cos(g) + e.minor * Math.sin(th) * Math.sin(g);
  const us = e.major * Math.cos(th) * Math.sin(g) - e.minor * Math.sin(th) * Math.cos(g);
  const vc = e.major * Math.sin(th) * Math.cos(g) - e.minor * Math.cos(th) * Math.sin(g);
  const vs = e.major * Math.sin(th) * Math.sin(g) + e.minor * Math.cos(th) * Math.cos(g);
  return {
    u: { name: e.name, amplitude: Math.hypot(uc, us), phase: Math.atan2(us, uc) * DEG },
    v: { name: e.name, amplitude: Math.hypot(vc, vs), phase: Math.atan2(vs, vc) * DEG },
  };
}

/** A series from @neaps/tide-predictor (Schureman option), every 10 minutes for `days`. */
function referenceSeries(constituents: { name: string; amplitude: number; phase: number }[], days: number, offset = 0) {
  return createTidePredictor(constituents, { nodeCorrections: 'schureman', offset }).getTimelinePrediction({
    start: new Date(START),
    end: new Date(START + days * 24 * HOUR),
    timeFidelity: 600,
  });
}

/**
 * Synthetic current record: truth from @neaps/tide-predictor, plus N(0, σ²) noise on each
 * component, a 36-hour hole (rows absent) and 10 % random dropouts (NaN).
 */
function syntheticCurrent(days: number, sigma: number, seed: number) {
  const parts = TRUTH.map(components);
  const u = referenceSeries(parts.map((p) => p.u), days);
  const v = referenceSeries(parts.map((p) => p.v), days);
  const uniform = mulberry32(seed);
  const normal = gaussian(uniform);
  const times: number[] = [];
  const east: number[] = [];
  const north: number[] = [];
  const holeStart = START + 10 * 24 * HOUR;
  const holeEnd = holeStart + 36 * HOUR;
  u.forEach((p, i) => {
    const t = p.time.getTime();
    const drop = uniform() < 0.1;
    const ne = normal();
    const nn = normal();
    if (t >= holeStart && t < holeEnd) return;
    times.push(t);
    east.push(drop ? Number.NaN : p.level + sigma * ne);
    north.push(drop ? Number.NaN : v[i]!.level + sigma * nn);
  });
  return { times, east, north };
}

describe('harmonic analysis of a 30-day current record', () => {
  const sigma = 0.03;
  const record = syntheticCurrent(30, sigma, 20250501);
  const result = analyseCurrent(record.times, record.east, record.north, ['M2', 'S2', 'N2', 'K1', 'O1', 'M4']);

  it('fits every requested constituent and drops none', () => {
    // Rayleigh (R = 1): the closest pair, M2–N2, needs 27.55 d (REFERENCES §8 beat periods).
    if (!result.ok) throw new Error(result.message);
    expect(result.constituents.map((c) => c.name).sort()).toEqual(['K1', 'M2', 'M4', 'N2', 'O1', 'S2']);
    expect(result.dropped).toEqual([]);
  });

  it('recovers the major axes within 2 % and the phases and inclinations within 2°, with noise and gaps', () => {
    // Truth: the invented ellipses above, synthesised by @neaps/tide-predictor (reference library).
    if (!result.ok) throw new Error(result.message);
    for (const t of TRUTH) {
      const fit = result.constituents.find((c) => c.name === t.name)!;
      expect(Math.abs(fit.major - t.major) / t.major, `${t.name} major`).toBeLessThan(0.02);
      expect(Math.abs(fit.minor - t.minor), `${t.name} minor`).toBeLessThan(0.02 * t.major);
      expect(Math.abs(angleDiff(fit.phaseDeg, t.phaseDeg)), `${t.name} phase`).toBeLessThan(2);
      expect(Math.abs(angleDiff(fit.inclinationDeg, t.inclinationDeg)), `${t.name} inclination`).toBeLessThan(2);
    }
  });

  it('reports standard errors that cover the actual errors and match σ√(2/n) for white noise', () => {
    // Linearised least-squares errors: for n samples of white noise σ, a harmonic's cosine and
    // sine coefficients each have variance ≈ 2σ²/n (e.g. Pugh 1987 §4.2.1 [MEM]).
    if (!result.ok) throw new Error(result.message);
    const n = result.record.validSamples;
    const expected = sigma * Math.sqrt(2 / n);
    for (const t of TRUTH) {
      const fit = result.constituents.find((c) => c.name === t.name)!;
      expect(fit.east.amplitudeSe / expected, t.name).toBeGreaterThan(0.8);
      expect(fit.east.amplitudeSe / expected, t.name).toBeLessThan(1.25);
      expect(Math.abs(fit.major - t.major), `${t.name} major within 4 se`).toBeLessThan(4 * fit.majorSe);
      expect(Math.abs(angleDiff(fit.phaseDeg, t.phaseDeg)), `${t.name} phase within 4 se`).toBeLessThan(4 * fit.phaseSeDeg);
    }
  });

  it('explains the variance that the noise leaves', () => {
    // Expected: 1 − 2σ²/(total variance of u and v); the noise is the only unexplained part.
    if (!result.ok) throw new Error(result.message);
    expect(result.residualRmsEast).toBeGreaterThan(0.9 * sigma);
    expect(result.residualRmsEast).toBeLessThan(1.1 * sigma);
    expect(result.varianceExplained).toBeGreaterThan(0.99);
    expect(result.varianceExplained).toBeLessThan(1);
  });

  it('counts the hole and the dropouts in the record summary', () => {
    if (!result.ok) throw new Error(result.message);
    expect(result.record.longestGapHours).toBeGreaterThanOrEqual(36);
    expect(result.record.missingFraction).toBeGreaterThan(0.1);
    expect(result.record.missingFraction).toBeLessThan(0.2);
    expect(result.record.sampleIntervalMinutes).toBe(10);
  });
});

describe('harmonic analysis of a water-level record', () => {
  it('recovers amplitudes within 0.5 mm, phases within 0.1° and the mean level of a noise-free record', () => {
    // Truth synthesised by @neaps/tide-predictor (Schureman option) with an offset of 3.1 m.
    const truth = [
      { name: 'M2', amplitude: 1.6, phase: 210 },
      { name: 'S2', amplitude: 0.55, phase: 250 },
      { name: 'N2', amplitude: 0.31, phase: 190 },
      { name: 'K1', amplitude: 0.2, phase: 10 },
      { name: 'O1', amplitude: 0.16, phase: 300 },
      { name: 'MS4', amplitude: 0.03, phase: 80 },
    ];
    const series = referenceSeries(truth, 32, 3.1);
    const r = analyseSeries(
      series.map((p) => p.time.getTime()),
      series.map((p) => p.level),
      truth.map((c) => c.name),
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.mean).toBeCloseTo(3.1, 3);
    for (const c of truth) {
      const fit = r.constituents.find((x) => x.name === c.name)!;
      expect(Math.abs(fit.amplitude - c.amplitude), c.name).toBeLessThan(5e-4);
      expect(Math.abs(angleDiff(fit.phaseDeg, c.phase)), c.name).toBeLessThan(0.1);
    }
    expect(r.varianceExplained).toBeGreaterThan(0.99999);
  });
});

describe('which constituents a record can resolve', () => {
  it('refuses to separate S2 from M2 in a 3-day record and says why (Rayleigh criterion)', () => {
    // Rayleigh criterion (e.g. Pugh 1987 §4.2.2 [MEM]): |ω_S2 − ω_M2| T ≥ 360°, i.e. T ≥ 354.4 h
    // (REFERENCES §8: 360/(S2 − M2) = 354.367 h).
    const series = referenceSeries(
      [
        { name: 'M2', amplitude: 1, phase: 0 },
        { name: 'S2', amplitude: 0.3, phase: 40 },
      ],
      3,
    );
    const r = analyseSeries(
      series.map((p) => p.time.getTime()),
      series.map((p) => p.level),
      ['S2', 'M2'],
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.constituents.map((c) => c.name)).toEqual(['M2']);
    expect(r.dropped).toHaveLength(1);
    const d = r.dropped[0]!;
    expect(d.name).toBe('S2');
    expect(d.rule).toBe('rayleigh');
    expect(d.conflictsWith).toBe('M2');
    expect(d.requiredHours).toBeCloseTo(354.367, 2);
    expect(d.reason).toMatch(/cannot be separated from M2/);
    expect(d.reason).toMatch(/Rayleigh/);
    expect(d.reason).toMatch(/72\.0 h/);
  });

  it('keeps S2 apart from M2 once the record is longer than 14.77 days', () => {
    const series = referenceSeries(
      [
        { name: 'M2', amplitude: 1, phase: 0 },
        { name: 'S2', amplitude: 0.3, phase: 40 },
      ],
      15,
    );
    const r = analyseSeries(
      series.map((p) => p.time.getTime()),
      series.map((p) => p.level),
      ['M2', 'S2'],
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.dropped).toEqual([]);
    expect(r.constituents.find((c) => c.name === 'S2')!.amplitude).toBeCloseTo(0.3, 3);
  });

  it('drops a long-period constituent that the record cannot separate from the mean', () => {
    const series = referenceSeries([{ name: 'M2', amplitude: 1, phase: 0 }], 10);
    const r = analyseSeries(
      series.map((p) => p.time.getTime()),
      series.map((p) => p.level),
      ['M2', 'Mf'],
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.dropped.map((d) => [d.name, d.rule])).toEqual([['Mf', 'mean']]);
  });

  it('drops a constituent above the Nyquist frequency of the sampling', () => {
    // Sampling theorem: a period shorter than two sampling intervals cannot be fitted.
    // With 3-hourly samples (Nyquist period 6 h) M6 (4.14 h) is too fast; M2 (12.42 h) is not.
    const times: number[] = [];
    const values: number[] = [];
    for (let t = START; t <= START + 20 * 24 * HOUR; t += 3 * HOUR) {
      times.push(t);
      values.push(Math.cos(((t - START) / HOUR) * 28.9841042 * RAD));
    }
    const r = analyseSeries(times, values, ['M2', 'M6'], { astronomical: false, epochMs: START });
    if (!r.ok) throw new Error(r.message);
    expect(r.dropped.map((d) => [d.name, d.rule])).toEqual([['M6', 'nyquist']]);
    expect(r.constituents[0]!.amplitude).toBeCloseTo(1, 9);
    expect(Math.abs(angleDiff(r.constituents[0]!.phaseDeg, 0))).toBeLessThan(1e-6);
  });
});

describe('records that are refused', () => {
  const hourly = (hours: number) => {
    const times: number[] = [];
    const values: number[] = [];
    for (let h = 0; h <= hours; h++) {
      times.push(START + h * HOUR);
      values.push(Math.cos(h * 28.9841042 * RAD));
    }
    return { times, values };
  };

  it('refuses a record shorter than a day', () => {
    const { times, values } = hourly(18);
    const r = analyseSeries(times, values, ['M2'], { minPoints: 10 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('record-too-short');
      expect(r.message).toMatch(/18\.0 h/);
    }
  });

  it('refuses a record with too few valid samples', () => {
    const { times, values } = hourly(48);
    const r = analyseSeries(times, values.map((v, i) => (i % 3 === 0 ? v : Number.NaN)), ['M2']);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.code).toBe('record-too-sparse');
  });

  it('refuses a record with more than 30 % of its samples missing', () => {
    const { times, values } = hourly(24 * 10);
    const gappy = values.map((v, i) => (i % 5 < 2 ? Number.NaN : v));
    const r = analyseSeries(times, gappy, ['M2']);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('record-too-gappy');
      expect(r.message).toMatch(/39\.5 %/); // 144 valid of 238 expected between the first and last valid sample
    }
  });

  it('refuses a record whose longest gap exceeds a quarter of its span', () => {
    const { times, values } = hourly(24 * 10);
    const keep = times.map((t) => t < START + 2 * 24 * HOUR || t > START + 5 * 24 * HOUR);
    const r = analyseSeries(
      times.filter((_, i) => keep[i]),
      values.filter((_, i) => keep[i]),
      ['M2'],
      { maxMissingFraction: 0.5 },
    );
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.code).toBe('record-too-gappy');
      expect(r.message).toMatch(/longest gap is 74\.0 h/); // from hour 47 to hour 121
    }
  });

  it('refuses times that do not increase and an unknown constituent', () => {
    const { times, values } = hourly(48);
    const swapped = times.slice();
    [swapped[3], swapped[4]] = [swapped[4]!, swapped[3]!];
    const a = analyseSeries(swapped, values, ['M2']);
    expect(a.ok).toBe(false);
    if (!a.ok) expect(a.code).toBe('invalid-input');
    const b = analyseSeries(times, values, ['M2', 'Z7']);
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.message).toContain('"Z7"');
  });
});

describe('Cholesky solver', () => {
  it('solves a symmetric positive-definite system to round-off', () => {
    // A = [[4,12,−16],[12,37,−43],[−16,−43,98]] = L Lᵀ with L = [[2,0,0],[6,1,0],[−8,5,3]]
    // (a textbook example [from memory]; L Lᵀ = A checks by hand).
    const a = Float64Array.from([4, 12, -16, 12, 37, -43, -16, -43, 98]);
    expect(choleskyFactor(3, a)).toBe(CHOLESKY_OK);
    expect([a[0], a[3], a[4], a[6], a[7], a[8]]).toEqual([2, 6, 1, -8, 5, 3]);
    // x = (1, 2, 3): b = A x.
    const b = Float64Array.from([4 + 24 - 48, 12 + 74 - 129, -16 - 86 + 294]);
    choleskySolve(3, a, b);
    expect(b[0]).toBeCloseTo(1, 12);
    expect(b[1]).toBeCloseTo(2, 12);
    expect(b[2]).toBeCloseTo(3, 12);
  });

  it('reports a singular matrix instead of returning garbage', () => {
    const a = Float64Array.from([1, 2, 2, 4]);
    expect(choleskyFactor(2, a)).toBe(CHOLESKY_NOT_POSITIVE_DEFINITE);
  });
});
