/**
 * Exact solutions of the transport equations in a closed column
 * (REFERENCES §10, all [CALC] from the formulas given there).
 */
import { describe, expect, it } from 'vitest';
import type { CaseInput } from '../../shared/model/case-schema.ts';
import { runValid } from './support.ts';

const still = { type: 'surface_slope', mean: 0 } as const;

/** Amplitude of the cos(π z/h) mode of a profile (surface first, uniform layers). */
function cosineAmplitude(depthM: Float64Array, h: number, conc: Float64Array): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < conc.length; i++) {
    const phi = Math.cos((Math.PI * (h - depthM[i]!)) / h);
    num += conc[i]! * phi;
    den += phi * phi;
  }
  return num / den;
}

/** Profile points tracing 1 + 0.5 cos(π z/h), z up from the bed, d = h − z. */
function cosinePoints(h: number, count: number): { depth_m: number; value: number }[] {
  const pts = [];
  for (let p = 0; p <= count; p++) {
    const d = (p / count) * h;
    pts.push({ depth_m: d, value: 1 + 0.5 * Math.cos((Math.PI * (h - d)) / h) });
  }
  return pts;
}

describe('closed-column checks against exact solutions', () => {
  it('decays a cosine mode at K(π/h)² within 1% under constant viscosity', () => {
    // REFERENCES §10.1: K = 0.01 m²/s, h = 14 m give 5.0355e-4 s⁻¹ [CALC].
    const h = 14;
    const { result } = runValid({
      depth_m: h,
      layers: 100,
      time_step_s: 5,
      duration_s: 3600,
      output_interval_s: 3600,
      latitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'constant', viscosity_m2_s: 0.01 },
      forcing: still,
      organisms: [
        { name: 'tracer', settling_velocity_m_s: 0, initial_concentration: cosinePoints(h, 999), background_diffusivity_m2_s: 0 },
      ],
    });
    const n = result.layers;
    const conc = result.organisms[0]!.concentration;
    const a0 = cosineAmplitude(result.depthM, h, conc.subarray(0, n));
    const a1 = cosineAmplitude(result.depthM, h, conc.subarray(n, 2 * n));
    const rate = -Math.log(a1 / a0) / 3600;
    expect(Math.abs(rate / 5.0355e-4 - 1)).toBeLessThan(0.01);
  });

  it('moves a pure settling front down at the settling velocity', () => {
    // REFERENCES §10.4: with K = 0 the clear-water front is at depth ws t.
    const ws = 1e-3;
    const { result } = runValid({
      depth_m: 10,
      layers: 200,
      time_step_s: 5,
      duration_s: 5000,
      output_interval_s: 2500,
      latitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'constant', viscosity_m2_s: 0 },
      forcing: still,
      organisms: [{ name: 'cells', settling_velocity_m_s: ws, initial_concentration: 1, background_diffusivity_m2_s: 0 }],
    });
    const n = result.layers;
    for (const k of [1, 2]) {
      const conc = result.organisms[0]!.concentration.subarray(k * n, (k + 1) * n);
      let front = Number.NaN;
      for (let i = 1; i < n; i++) {
        if (conc[i - 1]! < 0.5 && conc[i]! >= 0.5) {
          const w = (0.5 - conc[i - 1]!) / (conc[i]! - conc[i - 1]!);
          front = result.depthM[i - 1]! + w * (result.depthM[i]! - result.depthM[i - 1]!);
        }
      }
      const expected = ws * result.timeS[k]!;
      expect(Math.abs(front - expected)).toBeLessThan(0.1);
    }
  });

  it('conserves closed-column totals to 1e-10 over a week of tidal flow', () => {
    // REFERENCES §10.1: with no-flux ends the total is conserved to round-off.
    const { result } = runValid({
      depth_m: 20,
      layers: 50,
      time_step_s: 60,
      duration_s: 7 * 86400,
      output_interval_s: 3600,
      start: '2025-06-01T00:00:00Z',
      latitude_deg: 55,
      longitude_deg: -5,
      bed_roughness_m: 0.01,
      closure: { type: 'k-epsilon' },
      forcing: {
        type: 'depth_mean_current',
        start: '2025-06-01T00:00:00Z',
        constituents: [{ name: 'M2', amplitude_m_s: 0.6, phase_deg: 0 }],
      },
      organisms: [
        { name: 'sinker', settling_velocity_m_s: 5e-4, initial_concentration: 100 },
        {
          name: 'swimmer',
          settling_velocity_m_s: 1e-5,
          initial_concentration: 100,
          swimming: { speed_m_s: 3e-4, schedule: { type: 'sun' }, min_depth_m: 1, max_depth_m: 15 },
        },
      ],
    });
    for (const o of result.organisms) {
      const t0 = o.total[0]!;
      for (let k = 0; k < result.outputs; k++) expect(Math.abs(o.total[k]! / t0 - 1)).toBeLessThan(1e-10);
    }
  });

  it('conserves water plus bed when cells are deposited and resuspended', () => {
    // REFERENCES §9: the bed flux E − D moves cells between water and bed pool only.
    const { result } = runValid({
      depth_m: 12,
      layers: 40,
      time_step_s: 30,
      duration_s: 2 * 86400,
      output_interval_s: 1800,
      latitude_deg: 50,
      bed_roughness_m: 0.02,
      closure: { type: 'k-epsilon' },
      forcing: {
        type: 'depth_mean_current',
        start: '2025-03-01T00:00:00Z',
        constituents: [{ name: 'M2', amplitude_m_s: 0.7 }],
      },
      organisms: [
        {
          name: 'cysts',
          settling_velocity_m_s: 3e-4,
          initial_concentration: 50,
          bed_exchange: { critical_stress_pa: 0.15, erosion_rate: 0.05, initial_bed: 300 },
        },
      ],
    });
    const o = result.organisms[0]!;
    const start = o.total[0]! + o.bed[0]!;
    let moved = 0;
    for (let k = 0; k < result.outputs; k++) {
      expect(Math.abs((o.total[k]! + o.bed[k]!) / start - 1)).toBeLessThan(1e-10);
      moved = Math.max(moved, Math.abs(o.bed[k]! - o.bed[0]!));
    }
    // The exchange really happened: the bed pool changed by more than 1% of the total.
    expect(moved).toBeGreaterThan(0.01 * start);
  });

  it('follows exp((μ − m) t) for uniform net growth', () => {
    // REFERENCES §10.5: M(t) = M0 e^((μ − m)t).
    const mu = 0.9;
    const m = 0.25;
    const c: CaseInput = {
      depth_m: 10,
      layers: 20,
      time_step_s: 300,
      duration_s: 3 * 86400,
      output_interval_s: 21600,
      latitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'parabolic' },
      forcing: { type: 'surface_slope', mean: -1e-6 },
      organisms: [
        {
          name: 'bloom',
          settling_velocity_m_s: 2e-5,
          initial_concentration: 10,
          growth: { max_rate_per_day: mu },
          mortality_per_day: m,
        },
      ],
    };
    const { result } = runValid(c);
    const o = result.organisms[0]!;
    for (let k = 0; k < result.outputs; k++) {
      const expected = o.total[0]! * Math.exp(((mu - m) * result.timeS[k]!) / 86400);
      expect(Math.abs(o.total[k]! / expected - 1)).toBeLessThan(1e-9);
    }
  });

  it('grows cells with light only while the sun is up', () => {
    // Jassby & Platt (1976) with Beer–Lambert light: no light, no growth; at night only mortality acts
    // (REFERENCES §6). The site is at 56° N in December: the sun is down from 16:00 to 08:00 UTC.
    const m = 0.2;
    const { result } = runValid({
      depth_m: 10,
      layers: 20,
      time_step_s: 300,
      duration_s: 86400,
      output_interval_s: 3600,
      start: '2025-12-10T00:00:00Z',
      latitude_deg: 56,
      longitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'constant', viscosity_m2_s: 0.01 },
      forcing: still,
      organisms: [
        {
          name: 'diatom',
          settling_velocity_m_s: 0,
          initial_concentration: 10,
          growth: { max_rate_per_day: 1.5, light: { attenuation_per_m: 0.3, saturation_umol_m2_s: 100 } },
          mortality_per_day: m,
        },
      ],
    });
    const total = result.organisms[0]!.total;
    // Midnight to 04:00 UTC: exact mortality decay.
    expect(total[4]! / total[0]!).toBeCloseTo(Math.exp((-m * 4) / 24), 12);
    // 09:00 to 14:00 UTC: net growth.
    expect(total[14]!).toBeGreaterThan(total[9]! * 1.01);
  });
});
