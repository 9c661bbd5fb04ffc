/**
 * Validation at the boundary: impossible input is refused with a message
 * naming the field; valid but extreme input runs without NaN, infinity or
 * negative concentration; the same case gives identical output.
 */
import { describe, expect, it } from 'vitest';
import { parseCase, type CaseInput } from '../../shared/model/case-schema.ts';
import { runCase } from '../../shared/model/run.ts';

function base(): CaseInput {
  return {
    depth_m: 15,
    layers: 30,
    time_step_s: 30,
    duration_s: 7200,
    output_interval_s: 600,
    latitude_deg: 52,
    bed_roughness_m: 0.01,
    closure: { type: 'k-epsilon' },
    forcing: {
      type: 'depth_mean_current',
      start: '2025-05-01T00:00:00Z',
      constituents: [{ name: 'M2', amplitude_m_s: 0.5, phase_deg: 10 }],
    },
    organisms: [{ name: 'cells', settling_velocity_m_s: 1e-4, initial_concentration: 100 }],
  };
}

function rejectionPaths(input: unknown): string[] {
  const parsed = parseCase(input);
  if (parsed.ok) return [];
  return parsed.issues.map((i) => {
    expect(i.message.startsWith(`${i.path}: `)).toBe(true);
    return i.path;
  });
}

describe('case validation', () => {
  it('accepts the base case', () => {
    expect(parseCase(base()).ok).toBe(true);
  });

  it('rejects a depth of zero naming depth_m', () => {
    expect(rejectionPaths({ ...base(), depth_m: 0 })).toContain('depth_m');
  });

  it('rejects a negative depth naming depth_m', () => {
    expect(rejectionPaths({ ...base(), depth_m: -3 })).toContain('depth_m');
  });

  it('rejects fewer than 3 layers naming layers', () => {
    expect(rejectionPaths({ ...base(), layers: 2 })).toContain('layers');
  });

  it('rejects more than 1000 layers naming layers', () => {
    expect(rejectionPaths({ ...base(), layers: 1001 })).toContain('layers');
  });

  it('rejects a time step of zero naming time_step_s', () => {
    expect(rejectionPaths({ ...base(), time_step_s: 0 })).toContain('time_step_s');
  });

  it('rejects NaN naming the field', () => {
    expect(rejectionPaths({ ...base(), latitude_deg: Number.NaN })).toContain('latitude_deg');
  });

  it('rejects an infinite value naming the field', () => {
    expect(rejectionPaths({ ...base(), bed_roughness_m: Number.POSITIVE_INFINITY })).toContain('bed_roughness_m');
  });

  it('rejects an unknown constituent naming its place in the list', () => {
    const c = base();
    c.forcing = { type: 'depth_mean_current', start: '2025-05-01T00:00:00Z', constituents: [{ name: 'X9', amplitude_m_s: 1 }] };
    expect(rejectionPaths(c)).toContain('forcing.constituents.0.name');
  });

  it('rejects an unknown slope constituent naming its place in the list', () => {
    const c = base();
    c.forcing = { type: 'surface_slope', components: [{ amplitude: 1e-5, constituent: 'Z0' }] };
    expect(rejectionPaths(c)).toContain('forcing.components.0.constituent');
  });

  it('rejects a misspelt key naming the key', () => {
    expect(rejectionPaths({ ...base(), depht_m: 10 })).toContain('depht_m');
  });

  it('requires a start time when an organism needs the sun', () => {
    const c = base();
    c.forcing = { type: 'surface_slope', mean: 1e-6 };
    c.organisms = [
      { name: 'swimmer', settling_velocity_m_s: 0, initial_concentration: 1, swimming: { speed_m_s: 1e-4, schedule: { type: 'sun' } } },
    ];
    expect(rejectionPaths(c)).toContain('start');
  });

  it('returns the issues from runCase instead of throwing', () => {
    const outcome = runCase({ ...base(), layers: 1 });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.issues.map((i) => i.path)).toContain('layers');
  });
});

describe('extreme but valid cases', () => {
  const extremes: [string, Partial<CaseInput>][] = [
    ['a very thin column with many layers and long steps', { depth_m: 0.2, layers: 1000, time_step_s: 86400, duration_s: 4 * 86400, output_interval_s: 86400 }],
    ['a deep column with a huge roughness', { depth_m: 5000, layers: 5, bed_roughness_m: 10, time_step_s: 3600, duration_s: 86400, output_interval_s: 3600 }],
    [
      'a fast current with fast settling',
      {
        forcing: { type: 'depth_mean_current', start: '2025-05-01T00:00:00Z', constituents: [{ name: 'M4', amplitude_m_s: 20 }] },
        organisms: [{ name: 'heavy', settling_velocity_m_s: 0.1, initial_concentration: 1e30 }],
      },
    ],
    [
      'bed refinement with strong wind and a rising tracer',
      {
        bed_refinement: 100,
        wind_stress: [{ time_s: 0, x_pa: 50, y_pa: -50 }],
        organisms: [{ name: 'floaters', settling_velocity_m_s: -0.1, initial_concentration: 5 }],
      },
    ],
  ];
  for (const [label, patch] of extremes) {
    it(`stays finite and non-negative with ${label}`, () => {
      const outcome = runCase({ ...base(), ...patch });
      expect(outcome.ok).toBe(true);
      if (!outcome.ok) return;
      const r = outcome.result;
      expect(r.status).toBe('ok');
      for (const arr of [r.u, r.v, r.eddyViscosity, r.bedStressPa, ...r.organisms.map((o) => o.concentration)]) {
        for (const x of arr) expect(Number.isFinite(x)).toBe(true);
      }
      for (const o of r.organisms) for (const x of o.concentration) expect(x).toBeGreaterThanOrEqual(0);
    });
  }
});

describe('determinism', () => {
  it('gives identical output for the same case', () => {
    const c = base();
    c.organisms = [
      {
        name: 'mixed',
        settling_velocity_m_s: 2e-4,
        initial_concentration: 50,
        swimming: { speed_m_s: 2e-4, schedule: { type: 'sun' } },
        growth: { max_rate_per_day: 'eppley', temperature_c: 12, light: { attenuation_per_m: 0.2, saturation_umol_m2_s: 80 } },
        bed_exchange: { critical_stress_pa: 0.1, erosion_rate: 0.01 },
      },
    ];
    const a = runCase(c);
    const b = runCase(c);
    expect(a.ok && b.ok).toBe(true);
    if (!a.ok || !b.ok) return;
    expect(Array.from(b.result.u)).toEqual(Array.from(a.result.u));
    expect(Array.from(b.result.eddyViscosity)).toEqual(Array.from(a.result.eddyViscosity));
    expect(Array.from(b.result.organisms[0]!.concentration)).toEqual(Array.from(a.result.organisms[0]!.concentration));
  });
});
