/**
 * Work arrays of one run, allocated once. Layer arrays have `layers` entries
 * (index 0 = bottom layer); interface arrays have layers+1 (index 0 = bed).
 */
import type { Grid } from './grid.ts';

export interface ColumnState {
  readonly grid: Grid;
  /** Velocity components at layer centres, m/s. */
  readonly u: Float64Array;
  readonly v: Float64Array;
  /** Eddy viscosity at interfaces, m²/s (background included). */
  readonly nu: Float64Array;
  /** Turbulent kinetic energy (m²/s²) and its dissipation (m²/s³) at interfaces. */
  readonly k: Float64Array;
  readonly eps: Float64Array;
  /** Tridiagonal work arrays, length layers+1. */
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly c: Float64Array;
  readonly cp: Float64Array;
  /** A second tridiagonal system (ε while a, b, c hold k). */
  readonly a2: Float64Array;
  readonly b2: Float64Array;
  readonly c2: Float64Array;
  readonly cp2: Float64Array;
  readonly rhs1: Float64Array;
  readonly rhs2: Float64Array;
  readonly rhs3: Float64Array;
  /** Scratch for two-component values. */
  readonly pair: Float64Array;
  /** Bed drag coefficient of the bottom layer (law of the wall). */
  dragCoefficient: number;
  /** Friction velocity from the bed stress, m/s. */
  frictionVelocity: number;
  /** Kinematic bed stress components (τ/ρ), m²/s². */
  bedStressX: number;
  bedStressY: number;
  /** Barotropic pressure-gradient acceleration used in the last step, m/s². */
  pressureGradientX: number;
  pressureGradientY: number;
  /** Depth-mean velocity after the last step, m/s. */
  depthMeanU: number;
  depthMeanV: number;
}

export function createColumnState(grid: Grid, dragCoefficient: number): ColumnState {
  const n = grid.layers;
  return {
    grid,
    u: new Float64Array(n),
    v: new Float64Array(n),
    nu: new Float64Array(n + 1),
    k: new Float64Array(n + 1),
    eps: new Float64Array(n + 1),
    a: new Float64Array(n + 1),
    b: new Float64Array(n + 1),
    c: new Float64Array(n + 1),
    cp: new Float64Array(n + 1),
    a2: new Float64Array(n + 1),
    b2: new Float64Array(n + 1),
    c2: new Float64Array(n + 1),
    cp2: new Float64Array(n + 1),
    rhs1: new Float64Array(n + 1),
    rhs2: new Float64Array(n + 1),
    rhs3: new Float64Array(n + 1),
    pair: new Float64Array(2),
    dragCoefficient,
    frictionVelocity: 0,
    bedStressX: 0,
    bedStressY: 0,
    pressureGradientX: 0,
    pressureGradientY: 0,
    depthMeanU: 0,
    depthMeanV: 0,
  };
}

/**
 * Drag coefficient of the bottom layer from the law of the wall,
 * C_D = (κ / ln((Δz/2 + z0)/z0))², with Δz the bottom layer's thickness.
 */
export function bedDragCoefficient(vonKarman: number, bottomThickness: number, z0: number): number {
  const r = vonKarman / Math.log((0.5 * bottomThickness + z0) / z0);
  return r * r;
}
