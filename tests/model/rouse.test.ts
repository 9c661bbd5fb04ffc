/**
 * Rouse (1937) profile: steady settling against parabolic mixing.
 * Check values: REFERENCES §4 table, C/C(a) with a/h = 0.05, β = 1 [CALC];
 * the model's diffusivity κu*(z+z0)(1 − z/h) has the exact steady profile
 * ((h − z)/(z + z0))^(P h/(h + z0)) (REFERENCES §4 variant ii), which differs
 * from the table by less than 0.1% at these heights.
 */
import { describe, expect, it } from 'vitest';
import { runValid } from './support.ts';

const H = 14;
const S = 6e-6;
const KAPPA = 0.41;
const USTAR = Math.sqrt(9.81 * H * S);

const TABLE: Record<string, number[]> = {
  // z/h = 0.1, 0.25, 0.5, 0.75, 0.9
  '0.1': [0.928002, 0.831451, 0.744946, 0.66744, 0.597999],
  '0.5': [0.688247, 0.39736, 0.229416, 0.132453, 0.076472],
};
const HEIGHTS = [0.1, 0.25, 0.5, 0.75, 0.9];

/** Concentration at height z above the bed, linear between layer centres. */
function concentrationAt(depthM: Float64Array, conc: Float64Array, z: number): number {
  const d = H - z;
  for (let i = 1; i < depthM.length; i++) {
    if (depthM[i]! >= d) {
      const w = (d - depthM[i - 1]!) / (depthM[i]! - depthM[i - 1]!);
      return conc[i - 1]! + w * (conc[i]! - conc[i - 1]!);
    }
  }
  return conc[conc.length - 1]!;
}

function steadyProfile(rouse: number): (z: number) => number {
  const ws = rouse * KAPPA * USTAR;
  const { result } = runValid({
    depth_m: H,
    layers: 100,
    time_step_s: 120,
    duration_s: 4 * 86400,
    output_interval_s: 86400,
    latitude_deg: 0,
    bed_roughness_m: 0.005,
    von_karman: KAPPA,
    closure: { type: 'parabolic', background_viscosity_m2_s: 0 },
    forcing: { type: 'surface_slope', mean: -S },
    organisms: [{ name: 'grains', settling_velocity_m_s: ws, initial_concentration: 1, background_diffusivity_m2_s: 0 }],
  });
  const n = result.layers;
  const k = result.outputs - 1;
  const conc = result.organisms[0]!.concentration.subarray(k * n, (k + 1) * n);
  return (z) => concentrationAt(result.depthM, conc, z);
}

describe('Rouse profile under the parabolic closure', () => {
  for (const rouse of ['0.1', '0.5']) {
    it(`matches the Rouse profile within 2% for Rouse number ${rouse}`, () => {
      const at = steadyProfile(Number(rouse));
      const reference = at(0.05 * H);
      HEIGHTS.forEach((zh, i) => {
        const ratio = at(zh * H) / reference;
        expect(Math.abs(ratio / TABLE[rouse]![i]! - 1)).toBeLessThan(0.02);
      });
    });
  }
});
