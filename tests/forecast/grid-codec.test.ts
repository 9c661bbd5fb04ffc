import { gunzipSync, gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { decodeGrid, encodeGrid, GridFormatError } from '../../shared/forecast/grid-codec.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';

function smallGrid(): ForecastGrid {
  const nt = 3;
  const nz = 2;
  return {
    startMs: Date.parse('2026-12-01T00:00:00Z'),
    stepMs: 900_000,
    nt,
    nz,
    waterDepthM: 10,
    depthM: Float64Array.from([2.5, 7.5]),
    thicknessM: Float64Array.from([5, 5]),
    concentration: Float32Array.from([1, 2, 3, 4, 5, 6]),
    speed: Float32Array.from([0.1, 0.2, 0.3, 0.4, 0.5, 0.6]),
    diffusivity: Float32Array.from([1e-3, 2e-3, 3e-3, 4e-3, 5e-3, 6e-3]),
    depthMeanAlong: Float64Array.from([0.2, 0, -0.2]),
    depthMeanSpeed: Float64Array.from([0.2, 0, 0.2]),
    bedStressPa: Float64Array.from([0.1, 0, 0.1]),
  };
}

describe('grid codec', () => {
  it('decodes what it encoded, also from a Node Buffer that is a view into a larger pool', () => {
    const grid = smallGrid();
    const stored = gzipSync(encodeGrid(grid));
    const decoded = decodeGrid(gunzipSync(stored));
    expect(Array.from(decoded.concentration)).toEqual(Array.from(grid.concentration));
    expect(Array.from(decoded.depthM)).toEqual([2.5, 7.5]);
    expect(decoded.stepMs).toBe(900_000);
  });

  it('refuses bytes that are not a grid', () => {
    expect(() => decodeGrid(new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8, 9]))).toThrow(GridFormatError);
  });
});
