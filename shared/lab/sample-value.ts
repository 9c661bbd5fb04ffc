import { concentrationAtDepth, rangeMeanConcentration, type ForecastGrid } from '../forecast/grid.ts';

export interface SampleWhereWhen {
  /** When the sample was taken, UTC epoch ms. */
  timeMs: number;
  /** m below the surface; top = bottom for a bottle. */
  depthTopM: number;
  depthBottomM: number;
  method: 'hose' | 'bottle';
}

/** What the sample would hold at output i: the layer at the bottle's depth, or the mean over the hose's range. */
function valueAtOutput(grid: ForecastGrid, i: number, sample: SampleWhereWhen): number {
  if (sample.method === 'bottle' || sample.depthBottomM <= sample.depthTopM) return concentrationAtDepth(grid, i, sample.depthTopM);
  return rangeMeanConcentration(grid, i, sample.depthTopM, sample.depthBottomM);
}

/**
 * The grid's concentration for a sample, interpolated linearly in time between the two outputs either
 * side of it; null when the sample falls outside the grid's span or the range misses the column.
 */
export function gridValueAtSample(grid: ForecastGrid, sample: SampleWhereWhen): number | null {
  const position = (sample.timeMs - grid.startMs) / grid.stepMs;
  const last = grid.nt - 1;
  if (!(position >= -1e-9 && position <= last + 1e-9)) return null;
  const i0 = Math.min(Math.max(Math.floor(position), 0), Math.max(last - 1, 0));
  const w = Math.min(Math.max(position - i0, 0), 1);
  const a = valueAtOutput(grid, i0, sample);
  const value = last === 0 || w === 0 ? a : (1 - w) * a + w * valueAtOutput(grid, i0 + 1, sample);
  return Number.isFinite(value) ? value : null;
}

/** Last output time of a grid, UTC epoch ms. */
export const gridEndMs = (grid: ForecastGrid): number => grid.startMs + (grid.nt - 1) * grid.stepMs;
