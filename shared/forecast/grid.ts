/**
 * A forecast's gridded output for one organism at one site, in the compact form that is stored,
 * sent to the client and drawn: flat typed arrays, time-major (value at output i, layer k is
 * `values[i * nz + k]`), layers ordered from the surface down.
 */
export interface ForecastGrid {
  /** First output time, UTC epoch milliseconds. */
  startMs: number;
  /** Time between outputs, milliseconds. */
  stepMs: number;
  /** Number of output times. */
  nt: number;
  /** Number of layers. */
  nz: number;
  /** Water depth, m. */
  waterDepthM: number;
  /** Layer-centre depths, m below the surface, surface first (length nz). */
  depthM: Float64Array;
  /** Layer thicknesses, m (length nz). */
  thicknessM: Float64Array;
  /** Organism concentration, cells/L (nt × nz). */
  concentration: Float32Array;
  /** Current speed at the layer centre, m/s (nt × nz). */
  speed: Float32Array;
  /** Eddy diffusivity of the organism at the layer centre, m²/s (nt × nz). */
  diffusivity: Float32Array;
  /** Depth-mean current along the site's main axis, m/s, positive = flood direction (length nt). */
  depthMeanAlong: Float64Array;
  /** Depth-mean current speed, m/s (length nt). */
  depthMeanSpeed: Float64Array;
  /** Bed shear stress, Pa (length nt). */
  bedStressPa: Float64Array;
}

/** Output time i in UTC epoch milliseconds. */
export const gridTimeMs = (grid: ForecastGrid, i: number): number => grid.startMs + i * grid.stepMs;

/** Depth-mean concentration at output i (thickness-weighted). */
export function depthMeanConcentration(grid: ForecastGrid, i: number): number {
  let sum = 0;
  for (let k = 0; k < grid.nz; k++) sum += grid.concentration[i * grid.nz + k]! * grid.thicknessM[k]!;
  return sum / grid.waterDepthM;
}

/**
 * Mean concentration over a depth range [topM, bottomM] below the surface at output i, weighting each
 * layer by its overlap with the range (what an integrated hose sample over that range collects).
 */
export function rangeMeanConcentration(grid: ForecastGrid, i: number, topM: number, bottomM: number): number {
  let sum = 0;
  let weight = 0;
  for (let k = 0; k < grid.nz; k++) {
    const layerTop = grid.depthM[k]! - grid.thicknessM[k]! / 2;
    const layerBottom = grid.depthM[k]! + grid.thicknessM[k]! / 2;
    const overlap = Math.min(layerBottom, bottomM) - Math.max(layerTop, topM);
    if (overlap > 0) {
      sum += grid.concentration[i * grid.nz + k]! * overlap;
      weight += overlap;
    }
  }
  return weight > 0 ? sum / weight : Number.NaN;
}

/** Concentration at a depth (m below surface) at output i: the value of the layer holding that depth. */
export function concentrationAtDepth(grid: ForecastGrid, i: number, depthM: number): number {
  for (let k = 0; k < grid.nz; k++) {
    if (depthM <= grid.depthM[k]! + grid.thicknessM[k]! / 2) return grid.concentration[i * grid.nz + k]!;
  }
  return grid.concentration[i * grid.nz + grid.nz - 1]!;
}
