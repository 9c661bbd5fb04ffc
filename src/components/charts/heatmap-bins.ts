import type { ForecastGrid } from '../../../shared/forecast/grid.ts';

export type HeatmapField = 'concentration' | 'speed' | 'diffusivity';

export interface TimeRange {
  startMs: number;
  endMs: number;
}

/** A grid aggregated to screen cells: `cols` equal time spans by `rows` equal depth spans from the surface to the bed. */
export interface HeatmapBins {
  cols: number;
  rows: number;
  /** Mean value of each cell, column-major: values[c * rows + r]; NaN where the grid has nothing. */
  values: Float32Array;
  /** The output indices drawn, first and last (inclusive). */
  first: number;
  last: number;
  /** Time at the left edge of column 0 and the right edge of the last column, UTC ms. */
  startMs: number;
  endMs: number;
  /** Depth at the bottom of the last row (the bed), m below the surface. */
  depthM: number;
  /** Smallest positive and largest value over the drawn outputs (raw grid, not the cell means). */
  minPositive: number;
  max: number;
}

/** Output indices of the grid inside the range (at least one output). */
export function outputSpan(grid: Pick<ForecastGrid, 'startMs' | 'stepMs' | 'nt'>, range?: TimeRange): [number, number] {
  if (!range) return [0, grid.nt - 1];
  const first = Math.max(0, Math.min(grid.nt - 1, Math.ceil((range.startMs - grid.startMs) / grid.stepMs - 1e-9)));
  const last = Math.max(first, Math.min(grid.nt - 1, Math.floor((range.endMs - grid.startMs) / grid.stepMs + 1e-9)));
  return [first, last];
}

/** The time span the heatmap draws for a range: its outputs, each widened by half a step either side. */
export function drawnTimeSpan(grid: Pick<ForecastGrid, 'startMs' | 'stepMs' | 'nt'>, range?: TimeRange): TimeRange {
  const [first, last] = outputSpan(grid, range);
  return { startMs: grid.startMs + (first - 0.5) * grid.stepMs, endMs: grid.startMs + (last + 0.5) * grid.stepMs };
}

/**
 * Aggregates a field of the grid to at most `maxCols` × `maxRows` cells (screen resolution): each
 * column is the mean of the outputs in its time span; each row the thickness-weighted mean of the
 * layers overlapping its depth span, so uneven layers are drawn at their true depths. When the
 * grid has fewer outputs than `maxCols`, one column per output.
 */
export function binGrid(grid: ForecastGrid, field: HeatmapField, maxCols: number, maxRows: number, range?: TimeRange): HeatmapBins {
  const [first, last] = outputSpan(grid, range);
  const n = last - first + 1;
  const cols = Math.max(1, Math.min(n, Math.floor(maxCols)));
  const rows = Math.max(1, Math.floor(maxRows));
  const depth = grid.waterDepthM;
  const data = grid[field];
  const nz = grid.nz;

  // Row r covers [r, r + 1) × depth / rows; weights of the layers overlapping it (flat lists).
  const rowStart = new Int32Array(rows + 1);
  const layerOf: number[] = [];
  const weightOf: number[] = [];
  for (let r = 0; r < rows; r++) {
    rowStart[r] = layerOf.length;
    const top = (r * depth) / rows;
    const bottom = ((r + 1) * depth) / rows;
    for (let k = 0; k < nz; k++) {
      const half = grid.thicknessM[k]! / 2;
      const overlap = Math.min(bottom, grid.depthM[k]! + half) - Math.max(top, grid.depthM[k]! - half);
      if (overlap > 0) {
        layerOf.push(k);
        weightOf.push(overlap);
      }
    }
  }
  rowStart[rows] = layerOf.length;

  const values = new Float32Array(cols * rows);
  const column = new Float64Array(rows);
  let minPositive = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  for (let i = first; i <= last; i++) {
    for (let k = 0; k < nz; k++) {
      const v = data[i * nz + k]!;
      if (v > max) max = v;
      if (v > 0 && v < minPositive) minPositive = v;
    }
  }
  for (let c = 0; c < cols; c++) {
    const i0 = first + Math.floor((c * n) / cols);
    const i1 = first + Math.floor(((c + 1) * n) / cols) - 1;
    column.fill(0);
    for (let i = i0; i <= i1; i++) {
      const base = i * nz;
      for (let r = 0; r < rows; r++) {
        let sum = 0;
        let weight = 0;
        for (let j = rowStart[r]!; j < rowStart[r + 1]!; j++) {
          sum += data[base + layerOf[j]!]! * weightOf[j]!;
          weight += weightOf[j]!;
        }
        column[r] = column[r]! + (weight > 0 ? sum / weight : Number.NaN);
      }
    }
    const count = i1 - i0 + 1;
    for (let r = 0; r < rows; r++) values[c * rows + r] = column[r]! / count;
  }
  // Each column spans its outputs ± half a step, so cells line up with the output times.
  const span = drawnTimeSpan(grid, range);
  return {
    cols,
    rows,
    values,
    first,
    last,
    startMs: span.startMs,
    endMs: span.endMs,
    depthM: depth,
    minPositive: Number.isFinite(minPositive) ? minPositive : Number.NaN,
    max: Number.isFinite(max) ? max : Number.NaN,
  };
}

/** Value of the field at the output nearest tMs and the layer holding depthM (the raw grid, for the readout). */
export function valueAt(grid: ForecastGrid, field: HeatmapField, tMs: number, depthM: number): { index: number; layer: number; timeMs: number; value: number } {
  const index = Math.max(0, Math.min(grid.nt - 1, Math.round((tMs - grid.startMs) / grid.stepMs)));
  let layer = grid.nz - 1;
  for (let k = 0; k < grid.nz; k++) {
    if (depthM <= grid.depthM[k]! + grid.thicknessM[k]! / 2) {
      layer = k;
      break;
    }
  }
  return { index, layer, timeMs: grid.startMs + index * grid.stepMs, value: grid[field][index * grid.nz + layer]! };
}

/** Colour domain of a field: linear from 0 to the maximum; log over four decades below the maximum (or down to the smallest positive value). */
export function colourDomain(bins: Pick<HeatmapBins, 'minPositive' | 'max'>, scale: 'linear' | 'log'): [number, number] {
  const max = bins.max > 0 ? bins.max : 1;
  if (scale === 'linear') return [0, max];
  const lo = Number.isFinite(bins.minPositive) ? Math.max(bins.minPositive, max / 1e4) : max / 1e4;
  return [lo >= max ? max / 10 : lo, max];
}
