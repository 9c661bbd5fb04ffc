import { describe, expect, it } from 'vitest';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { gridValueAtSample } from '../../shared/lab/sample-value.ts';

/** Two outputs an hour apart over four 1 m layers; the second output is ten times the first. */
function smallGrid(): ForecastGrid {
  const nz = 4;
  const concentration = Float32Array.from([100, 200, 300, 400, 1000, 2000, 3000, 4000]);
  return {
    startMs: 0,
    stepMs: 3_600_000,
    nt: 2,
    nz,
    waterDepthM: 4,
    depthM: Float64Array.from([0.5, 1.5, 2.5, 3.5]),
    thicknessM: Float64Array.from([1, 1, 1, 1]),
    concentration,
    speed: new Float32Array(8),
    diffusivity: new Float32Array(8),
    depthMeanAlong: new Float64Array(2),
    depthMeanSpeed: new Float64Array(2),
    bedStressPa: new Float64Array(2),
  };
}

describe('a forecast grid read at a sample', () => {
  it('takes the layer holding a bottle\'s depth at an output time', () => {
    expect(gridValueAtSample(smallGrid(), { timeMs: 0, depthTopM: 2.2, depthBottomM: 2.2, method: 'bottle' })).toBe(300);
  });

  it('interpolates linearly in time between outputs ([CALC] a quarter of the way from 300 to 3000 is 975)', () => {
    expect(gridValueAtSample(smallGrid(), { timeMs: 900_000, depthTopM: 2.2, depthBottomM: 2.2, method: 'bottle' })).toBeCloseTo(975, 9);
  });

  it('averages a hose over its range weighted by overlap ([CALC] 0–2.5 m at the first output: (100 + 200 + 0.5·300)/2.5 = 180)', () => {
    expect(gridValueAtSample(smallGrid(), { timeMs: 0, depthTopM: 0, depthBottomM: 2.5, method: 'hose' })).toBeCloseTo(180, 9);
  });

  it('gives nothing for a sample outside the grid\'s span', () => {
    expect(gridValueAtSample(smallGrid(), { timeMs: 3_600_001, depthTopM: 1, depthBottomM: 1, method: 'bottle' })).toBeNull();
    expect(gridValueAtSample(smallGrid(), { timeMs: -1, depthTopM: 1, depthBottomM: 1, method: 'bottle' })).toBeNull();
  });
});
