/**
 * 200 random valid short cases from a seeded generator: every value finite,
 * concentrations non-negative, closed columns (and water plus bed) conserved.
 * Conservation check: REFERENCES §9/§10.1 (no-flux ends, bed pool included).
 */
import { describe, expect, it } from 'vitest';
import type { CaseInput } from '../../shared/model/case-schema.ts';
import { CONSTITUENT_NAMES } from '../../shared/model/constituents.ts';
import { runValid, seededRandom } from './support.ts';

type Organism = NonNullable<CaseInput['organisms']>[number];

function randomCase(rnd: () => number, index: number): { c: CaseInput; conserving: boolean[] } {
  const between = (lo: number, hi: number): number => lo + (hi - lo) * rnd();
  const logBetween = (lo: number, hi: number): number => Math.exp(between(Math.log(lo), Math.log(hi)));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const depth = logBetween(0.5, 150);
  const closureKind = pick(['k-epsilon', 'parabolic', 'constant'] as const);
  const closure: CaseInput['closure'] =
    closureKind === 'constant'
      ? { type: 'constant', viscosity_m2_s: logBetween(1e-6, 0.5) }
      : closureKind === 'parabolic'
        ? { type: 'parabolic' }
        : { type: 'k-epsilon', surface_roughness_m: logBetween(0.01, 2) };
  const forcing: CaseInput['forcing'] =
    rnd() < 0.5
      ? {
          type: 'surface_slope',
          mean: between(-5e-5, 5e-5),
          components: Array.from({ length: Math.floor(rnd() * 3) }, () =>
            rnd() < 0.5
              ? { amplitude: between(-1e-4, 1e-4), constituent: pick(CONSTITUENT_NAMES), phase_deg: between(0, 360) }
              : { amplitude: between(-1e-4, 1e-4), period_s: logBetween(600, 2e6), phase_deg: between(0, 360) },
          ),
        }
      : {
          type: 'depth_mean_current',
          start: '2025-04-01T00:00:00Z',
          mean_u_m_s: between(-0.3, 0.3),
          constituents: Array.from({ length: 1 + Math.floor(rnd() * 3) }, () => ({
            name: pick(CONSTITUENT_NAMES),
            amplitude_m_s: between(0, 2),
            phase_deg: between(0, 360),
            minor_amplitude_m_s: between(-0.3, 0.3),
            inclination_deg: between(-90, 90),
          })),
        };
  const organisms: Organism[] = [];
  const conserving: boolean[] = [];
  const count = 1 + Math.floor(rnd() * 3);
  for (let k = 0; k < count; k++) {
    const o: Organism = {
      name: `org${k}`,
      settling_velocity_m_s: rnd() < 0.2 ? 0 : between(-1e-3, 5e-3),
      initial_concentration:
        rnd() < 0.6
          ? logBetween(1e-3, 1e6)
          : [
              { depth_m: 0, value: logBetween(1, 1000) },
              { depth_m: depth * rnd(), value: rnd() < 0.3 ? 0 : logBetween(1, 1000) },
              { depth_m: depth, value: logBetween(1, 1000) },
            ],
    };
    if (rnd() < 0.4) {
      const sun = rnd() < 0.5;
      o.swimming = {
        speed_m_s: between(0, 2e-3),
        schedule: sun ? { type: 'sun' } : { type: 'clock', up_hour: between(0, 24), down_hour: between(0, 24) },
        min_depth_m: depth * 0.3 * rnd(),
      };
    }
    let grows = false;
    if (rnd() < 0.3) {
      grows = true;
      o.growth =
        rnd() < 0.5
          ? { max_rate_per_day: 'eppley', temperature_c: between(-2, 30) }
          : {
              max_rate_per_day: between(0, 3),
              light: { attenuation_per_m: logBetween(0.02, 5), saturation_umol_m2_s: logBetween(10, 500) },
            };
    }
    if (rnd() < 0.2) {
      grows = true;
      o.mortality_per_day = between(0, 2);
    }
    if (rnd() < 0.3) {
      o.bed_exchange = {
        critical_stress_pa: logBetween(0.01, 2),
        erosion_rate: logBetween(1e-4, 10),
        initial_bed: rnd() < 0.5 ? 0 : logBetween(1, 1e4),
      };
    }
    organisms.push(o);
    conserving.push(!grows);
  }
  const dt = logBetween(2, 900);
  const c: CaseInput = {
    depth_m: depth,
    layers: 3 + Math.floor(rnd() * 58),
    time_step_s: dt,
    duration_s: logBetween(600, 3 * 3600),
    output_interval_s: logBetween(300, 3600),
    start: `2025-0${1 + (index % 9)}-15T0${index % 10}:30:00Z`,
    latitude_deg: between(-80, 80),
    longitude_deg: between(-180, 180),
    bed_roughness_m: logBetween(1e-4, 0.5),
    bed_refinement: rnd() < 0.3 ? between(1, 20) : 1,
    closure,
    forcing,
    organisms,
  };
  if (rnd() < 0.3) {
    c.wind_stress = [
      { time_s: 0, x_pa: between(-1, 1), y_pa: between(-1, 1) },
      { time_s: 3600, x_pa: between(-1, 1), y_pa: between(-1, 1) },
    ];
  }
  return { c, conserving };
}

function allFinite(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (!Number.isFinite(values[i]!)) return false;
  return true;
}

function minOf(values: Float64Array): number {
  let m = Infinity;
  for (let i = 0; i < values.length; i++) if (values[i]! < m) m = values[i]!;
  return m;
}

describe('random valid cases', () => {
  it('stay finite, non-negative and conserving in 200 seeded random cases', () => {
    const rnd = seededRandom(20250601);
    for (let index = 0; index < 200; index++) {
      const { c, conserving } = randomCase(rnd, index);
      const label = `case ${index}: ${JSON.stringify(c)}`;
      const { result } = runValid(c);
      for (const arr of [result.u, result.v, result.eddyViscosity, result.bedStressPa, result.frictionVelocity]) {
        expect(allFinite(arr), label).toBe(true);
      }
      expect(minOf(result.eddyViscosity), label).toBeGreaterThanOrEqual(0);
      result.organisms.forEach((o, q) => {
        expect(allFinite(o.concentration), label).toBe(true);
        expect(allFinite(o.total), label).toBe(true);
        expect(minOf(o.concentration), label).toBeGreaterThanOrEqual(0);
        expect(minOf(o.bed), label).toBeGreaterThanOrEqual(0);
        if (conserving[q]) {
          const start = o.total[0]! + o.bed[0]!;
          const end = o.total[result.outputs - 1]! + o.bed[result.outputs - 1]!;
          expect(Math.abs(end - start) / start, label).toBeLessThan(1e-10);
        }
      });
    }
  });
});
