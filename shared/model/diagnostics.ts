/**
 * Column diagnostics of a concentration profile (index 0 = bottom layer).
 * Depths are positive down from the surface.
 */
import type { Grid } from './grid.ts';

/** Column total Σ h_i C_i (concentration × m). */
export function columnTotal(grid: Grid, conc: Float64Array): number {
  const h = grid.thickness;
  let sum = 0;
  for (let i = 0; i < grid.layers; i++) sum += h[i]! * conc[i]!;
  return sum;
}

/** Depth of the centre of mass below the surface, m; NaN for an empty column. */
export function centreOfMassDepth(grid: Grid, conc: Float64Array): number {
  const h = grid.thickness;
  const zc = grid.zCentre;
  let sum = 0;
  let moment = 0;
  for (let i = 0; i < grid.layers; i++) {
    const m = h[i]! * conc[i]!;
    sum += m;
    moment += m * (grid.depth - zc[i]!);
  }
  return sum > 0 ? moment / sum : Number.NaN;
}

/**
 * Share of the column total within `height` metres of the bed (layers cut by
 * the limit count in proportion to the part below it); NaN for an empty column.
 */
export function shareNearBed(grid: Grid, conc: Float64Array, height: number): number {
  const h = grid.thickness;
  const zf = grid.zFace;
  let sum = 0;
  let near = 0;
  for (let i = 0; i < grid.layers; i++) {
    const m = h[i]! * conc[i]!;
    sum += m;
    const bottom = zf[i]!;
    const top = zf[i + 1]!;
    if (top <= height) near += m;
    else if (bottom < height) near += (m * (height - bottom)) / (top - bottom);
  }
  return sum > 0 ? near / sum : Number.NaN;
}

/** Maximum of an array. */
export function maxOf(values: Float64Array): number {
  let m = -Infinity;
  for (let i = 0; i < values.length; i++) if (values[i]! > m) m = values[i]!;
  return m;
}
