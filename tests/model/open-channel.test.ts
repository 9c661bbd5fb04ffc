/**
 * Steady uniform open-channel flow driven by a constant surface slope.
 * Check values: REFERENCES §0/§1/§2/§3 worked example h = 14 m, S = 6e-6,
 * ks = 0.005 m (z0 = ks/30, Nikuradse 1933 [from memory]), κ = 0.41, g = 9.81 [CALC].
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { CaseInput } from '../../shared/model/case-schema.ts';
import type { ModelResult, ModelRun } from '../../shared/model/run.ts';
import { profileAt, runValid } from './support.ts';

const H = 14;
const S = 6e-6;
const KS = 0.005;
const Z0 = KS / 30;
const KAPPA = 0.41;
const USTAR = Math.sqrt(9.81 * H * S); // 0.028706 m/s [CALC]
const U_LOG_LAW = (USTAR / KAPPA) * (Math.log(H / Z0) - 1); // 0.72385 m/s [CALC]

function channel(closure: CaseInput['closure'], layers: number): CaseInput {
  return {
    depth_m: H,
    layers,
    time_step_s: 60,
    duration_s: 3 * 86400,
    output_interval_s: 6 * 3600,
    latitude_deg: 0,
    bed_roughness_m: KS,
    von_karman: KAPPA,
    closure,
    // A positive slope drives flow toward −x, so a negative one drives +x.
    forcing: { type: 'surface_slope', mean: -S },
  };
}

let parabolic: ModelResult;
let kEps: { run: ModelRun; result: ModelResult };

beforeAll(() => {
  parabolic = runValid(channel({ type: 'parabolic' }, 50)).result;
  kEps = runValid(channel({ type: 'k-epsilon' }, 50));
});

const last = (r: ModelResult): number => r.outputs - 1;

describe('steady open-channel flow', () => {
  it('reaches the friction velocity sqrt(g h S) within 1% under the parabolic closure', () => {
    // τ_b = ρ g h S in steady uniform flow (REFERENCES §1) [CALC 0.028706 m/s].
    expect(Math.abs(parabolic.frictionVelocity[last(parabolic)]! / USTAR - 1)).toBeLessThan(0.01);
  });

  it('reaches the friction velocity sqrt(g h S) within 1% under k-epsilon', () => {
    const r = kEps.result;
    expect(Math.abs(r.frictionVelocity[last(r)]! / USTAR - 1)).toBeLessThan(0.01);
  });

  it('gives the log-law depth mean within 2% under the parabolic closure', () => {
    // U = (u*/κ)(ln(h/z0) − 1) = 0.72385 m/s (REFERENCES §1) [CALC].
    expect(Math.abs(parabolic.depthMeanU[last(parabolic)]! / U_LOG_LAW - 1)).toBeLessThan(0.02);
  });

  it('gives the log-law depth mean within 4% under k-epsilon', () => {
    const r = kEps.result;
    expect(Math.abs(r.depthMeanU[last(r)]! / U_LOG_LAW - 1)).toBeLessThan(0.04);
  });

  it('reproduces the parabola κ u* z (1 − z/h) under the parabolic closure', () => {
    // ν_t = κ u* z (1 − z/h) (REFERENCES §2, derivation), with u* = sqrt(g h S).
    const nu = profileAt(parabolic.eddyViscosity, parabolic.layers, last(parabolic));
    for (let i = 0; i < parabolic.layers; i++) {
      const z = H - parabolic.depthM[i]!;
      if (z < 0.05 * H || z > 0.95 * H) continue;
      const expected = KAPPA * USTAR * z * (1 - z / H);
      expect(Math.abs(nu[i]! / expected - 1)).toBeLessThan(0.01);
    }
  });

  it('has its k-epsilon eddy viscosity largest between 0.3h and 0.8h', () => {
    // Parabola maximum at h/2 (REFERENCES §2); k-ε follows it in the lower half (Rodi 1993 [from memory]).
    const r = kEps.result;
    const nu = profileAt(r.eddyViscosity, r.layers, last(r));
    let best = 0;
    for (let i = 1; i < r.layers; i++) if (nu[i]! > nu[best]!) best = i;
    const zMax = H - r.depthM[best]!;
    expect(zMax).toBeGreaterThan(0.3 * H);
    expect(zMax).toBeLessThan(0.8 * H);
  });

  it('keeps the k-epsilon eddy viscosity within 20% of the parabola in the lower half', () => {
    // REFERENCES §2: k-ε close to κu*z(1 − z/h) in the lower half (Rodi 1993; Burchard 2002 [from memory]).
    const r = kEps.result;
    const nu = profileAt(r.eddyViscosity, r.layers, last(r));
    let checked = 0;
    for (let i = 0; i < r.layers; i++) {
      const z = H - r.depthM[i]!;
      if (z < 0.05 * H || z > 0.5 * H) continue;
      const parabola = KAPPA * USTAR * (z + Z0) * (1 - z / H);
      expect(Math.abs(nu[i]! / parabola - 1)).toBeLessThan(0.2);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('holds k/u*² near 1/sqrt(Cμ) = 3.333 in the log layer under k-epsilon', () => {
    // Log-layer solution k = u*²/sqrt(Cμ) (REFERENCES §3, Launder & Spalding 1974; Cμ = 0.09) [CALC 3.333].
    // Within 10% over z ≤ 0.05h, where the stress is within 5% of the bed stress.
    const { run } = kEps;
    const target = 1 / Math.sqrt(0.09);
    let checked = 0;
    for (let j = 1; j < run.grid.layers; j++) {
      const z = run.grid.zFace[j]!;
      if (z > 0.05 * H) break;
      expect(Math.abs(run.column.k[j]! / (USTAR * USTAR) / target - 1)).toBeLessThan(0.1);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(2);
  });
});
