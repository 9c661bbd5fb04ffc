/**
 * Observed order of convergence on the cosine-mode diffusion problem,
 * whose exact amplitude is A(t) = A0 e^(−K(π/h)² t) (REFERENCES §10.1).
 * Backward Euler is first order in time; the cell-centred diffusion
 * operator is second order in space (standard results, e.g. Patankar 1980).
 */
import { describe, expect, it } from 'vitest';
import { runValid } from './support.ts';

const H = 10;
const K = 0.01;
const T = 1800;
const RATE = K * (Math.PI / H) ** 2;

function amplitudeError(layers: number, dt: number): number {
  const points = [];
  for (let p = 0; p <= 400; p++) {
    const d = (p / 400) * H;
    points.push({ depth_m: d, value: 2 + Math.cos((Math.PI * (H - d)) / H) });
  }
  const { result } = runValid({
    depth_m: H,
    layers,
    time_step_s: dt,
    duration_s: T,
    output_interval_s: T,
    latitude_deg: 0,
    bed_roughness_m: 0.01,
    closure: { type: 'constant', viscosity_m2_s: K },
    forcing: { type: 'surface_slope', mean: 0 },
    organisms: [{ name: 'tracer', settling_velocity_m_s: 0, initial_concentration: points, background_diffusivity_m2_s: 0 }],
  });
  const c = result.organisms[0]!.concentration;
  // Project on the discrete cosine mode, an exact eigenvector of the discrete operator.
  const project = (k: number): number => {
    let num = 0;
    let den = 0;
    for (let i = 0; i < layers; i++) {
      const phi = Math.cos((Math.PI * (H - result.depthM[i]!)) / H);
      num += c[k * layers + i]! * phi;
      den += phi * phi;
    }
    return num / den;
  };
  return Math.abs(project(1) / project(0) - Math.exp(-RATE * T));
}

describe('observed order of convergence', () => {
  it('is first order when the layer thickness and the step are halved together', () => {
    const e1 = amplitudeError(10, 300);
    const e2 = amplitudeError(20, 150);
    const e3 = amplitudeError(40, 75);
    const p1 = Math.log2(e1 / e2);
    const p2 = Math.log2(e2 / e3);
    expect(p1).toBeGreaterThan(0.85);
    expect(p1).toBeLessThan(1.15);
    expect(p2).toBeGreaterThan(0.85);
    expect(p2).toBeLessThan(1.15);
  });

  it('is second order in the layer thickness when the step is small', () => {
    const e1 = amplitudeError(8, 0.1);
    const e2 = amplitudeError(16, 0.1);
    const e3 = amplitudeError(32, 0.1);
    expect(Math.log2(e1 / e2)).toBeGreaterThan(1.85);
    expect(Math.log2(e2 / e3)).toBeGreaterThan(1.8);
    expect(Math.log2(e2 / e3)).toBeLessThan(2.15);
  });
});
