/**
 * Algebraic eddy viscosities at the interfaces.
 * Parabolic: ν_t = κ u* (z + z0)(1 − z/h), the profile that, with the linear
 * stress of uniform channel flow, gives the law of the wall at every height
 * (see REFERENCES §2). u* is the current friction velocity from the bed stress.
 */
import type { ColumnState } from './column-state.ts';

export function updateParabolicViscosity(
  s: ColumnState,
  vonKarman: number,
  z0: number,
  background: number,
): void {
  const zf = s.grid.zFace;
  const n = s.grid.layers;
  const depth = s.grid.depth;
  const scale = vonKarman * s.frictionVelocity;
  const nu = s.nu;
  for (let j = 0; j <= n; j++) {
    const z = zf[j]!;
    nu[j] = scale * (z + z0) * (1 - z / depth) + background;
  }
}

/** Constant eddy viscosity at every interface. */
export function setConstantViscosity(s: ColumnState, viscosity: number): void {
  s.nu.fill(viscosity);
}
