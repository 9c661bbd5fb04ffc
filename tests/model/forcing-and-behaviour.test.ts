/**
 * The column follows its forcing and the organisms behave as specified.
 */
import { describe, expect, it } from 'vitest';
import { runValid } from './support.ts';

// M2 speed 28.9841042 °/h: IHO TWCWG Standard List of Tidal Constituents (2017), REFERENCES §8 [READ].
const M2_OMEGA = (28.9841042 * Math.PI) / 180 / 3600;

describe('forcing and behaviour', () => {
  it('makes the depth-mean current follow the target from the constituents', () => {
    // Target U(t) = mean + A cos(ωt − φ) along the major axis (case definition, docs/model-case.md).
    const { result } = runValid({
      depth_m: 25,
      layers: 40,
      time_step_s: 60,
      duration_s: 86400,
      output_interval_s: 1800,
      latitude_deg: 57,
      bed_roughness_m: 0.02,
      closure: { type: 'k-epsilon' },
      forcing: {
        type: 'depth_mean_current',
        start: '2025-07-01T00:00:00Z',
        mean_u_m_s: 0.05,
        constituents: [{ name: 'M2', amplitude_m_s: 0.8, phase_deg: 40, minor_amplitude_m_s: 0.1, inclination_deg: 30 }],
      },
    });
    const inc = (30 * Math.PI) / 180;
    for (let k = 1; k < result.outputs; k++) {
      const arg = M2_OMEGA * result.timeS[k]! - (40 * Math.PI) / 180;
      const along = 0.8 * Math.cos(arg);
      const across = 0.1 * Math.sin(arg);
      expect(result.depthMeanU[k]!).toBeCloseTo(0.05 + along * Math.cos(inc) - across * Math.sin(inc), 9);
      expect(result.depthMeanV[k]!).toBeCloseTo(along * Math.sin(inc) + across * Math.cos(inc), 9);
    }
    // Bed friction slows the flow near the bed: the surface runs faster than the depth mean at peak flow.
    let peak = 1;
    for (let k = 1; k < result.outputs; k++) if (Math.abs(result.depthMeanU[k]!) > Math.abs(result.depthMeanU[peak]!)) peak = k;
    expect(Math.abs(result.surfaceU[peak]!)).toBeGreaterThan(Math.abs(result.depthMeanU[peak]!));
  });

  it('turns a slope-driven current to the right in the northern hemisphere', () => {
    // Coriolis f = 2Ω sin(latitude) deflects flow to the right north of the equator (Ekman, standard result).
    const { result } = runValid({
      depth_m: 30,
      layers: 30,
      time_step_s: 120,
      duration_s: 6 * 3600,
      output_interval_s: 3600,
      latitude_deg: 60,
      bed_roughness_m: 0.01,
      closure: { type: 'parabolic' },
      forcing: { type: 'surface_slope', mean: -5e-6 },
    });
    const k = result.outputs - 1;
    expect(result.depthMeanU[k]!).toBeGreaterThan(0);
    expect(result.depthMeanV[k]!).toBeLessThan(0);
  });

  it('gathers swimmers in the upper water by day and deeper by night', () => {
    // Diel vertical migration, upward by day (REFERENCES §6, Erga et al. 2015 [READ]).
    const { result } = runValid({
      depth_m: 20,
      layers: 40,
      time_step_s: 120,
      duration_s: 86400,
      output_interval_s: 3600,
      start: '2025-06-21T00:00:00Z',
      latitude_deg: 50,
      longitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'constant', viscosity_m2_s: 1e-4 },
      forcing: { type: 'surface_slope', mean: 0 },
      organisms: [
        {
          name: 'dinos',
          settling_velocity_m_s: 0,
          initial_concentration: 10,
          swimming: { speed_m_s: 5e-4, schedule: { type: 'sun' }, min_depth_m: 2, max_depth_m: 15 },
        },
      ],
    });
    const com = result.organisms[0]!.centreOfMassDepthM;
    // Late afternoon (17:00 UTC) after a day of swimming up, against the end of the night (04:00 UTC).
    expect(com[17]!).toBeLessThan(5);
    expect(com[4]!).toBeGreaterThan(10);
  });

  it('puts settled cells near the bed in the bottom-share diagnostics', () => {
    // Pure settling in still water (REFERENCES §10.4): after h/ws every cell is in the bottom layer.
    const { result } = runValid({
      depth_m: 10,
      layers: 20,
      time_step_s: 60,
      duration_s: 3 * 3600,
      output_interval_s: 3600,
      latitude_deg: 0,
      bed_roughness_m: 0.01,
      closure: { type: 'constant', viscosity_m2_s: 0 },
      forcing: { type: 'surface_slope', mean: 0 },
      organisms: [{ name: 'sinkers', settling_velocity_m_s: 2e-3, initial_concentration: 1, background_diffusivity_m2_s: 0 }],
    });
    const o = result.organisms[0]!;
    expect(o.shareBottomMetre[0]!).toBeCloseTo(0.1, 12);
    expect(o.shareBottomTenth[0]!).toBeCloseTo(0.1, 12);
    const k = result.outputs - 1;
    expect(o.shareBottomMetre[k]!).toBeGreaterThan(0.99);
    expect(o.centreOfMassDepthM[k]!).toBeGreaterThan(9.5);
  });
});
