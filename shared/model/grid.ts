/**
 * Vertical grid. Internally z is measured UP from the bed (0 at the bed, h at
 * the surface); layer 0 is the bottom layer and interface 0 is the bed.
 * Velocities and concentrations live at layer centres, turbulence at interfaces.
 */
export interface Grid {
  readonly layers: number;
  readonly depth: number;
  /** Interface heights above the bed, length layers+1 (zFace[0] = 0, zFace[layers] = depth). */
  readonly zFace: Float64Array;
  /** Layer-centre heights above the bed, length layers. */
  readonly zCentre: Float64Array;
  /** Layer thicknesses, length layers. */
  readonly thickness: Float64Array;
  /**
   * Distance between the centres either side of interface j, length layers+1;
   * entries 0 and layers are half the adjacent layer (distance to the boundary).
   */
  readonly centreSpacing: Float64Array;
  /** 1 / thickness, length layers. */
  readonly inverseThickness: Float64Array;
  /** 1 / centreSpacing, length layers+1. */
  readonly inverseCentreSpacing: Float64Array;
}

/**
 * Builds a grid of `layers` layers over `depth` metres. bedRefinement is the
 * ratio of the top layer's thickness to the bottom layer's (1 = uniform; the
 * thicknesses then grow geometrically upward).
 */
export function buildGrid(depth: number, layers: number, bedRefinement = 1): Grid {
  const thickness = new Float64Array(layers);
  if (bedRefinement === 1 || layers < 2) {
    thickness.fill(depth / layers);
  } else {
    const q = Math.pow(bedRefinement, 1 / (layers - 1));
    let sum = 0;
    for (let i = 0; i < layers; i++) {
      thickness[i] = Math.pow(q, i);
      sum += thickness[i]!;
    }
    for (let i = 0; i < layers; i++) thickness[i] = (thickness[i]! * depth) / sum;
  }
  const zFace = new Float64Array(layers + 1);
  for (let i = 0; i < layers; i++) zFace[i + 1] = zFace[i]! + thickness[i]!;
  zFace[layers] = depth;
  const zCentre = new Float64Array(layers);
  for (let i = 0; i < layers; i++) zCentre[i] = 0.5 * (zFace[i]! + zFace[i + 1]!);
  const centreSpacing = new Float64Array(layers + 1);
  centreSpacing[0] = 0.5 * thickness[0]!;
  centreSpacing[layers] = 0.5 * thickness[layers - 1]!;
  for (let j = 1; j < layers; j++) centreSpacing[j] = zCentre[j]! - zCentre[j - 1]!;
  const inverseThickness = new Float64Array(layers);
  for (let i = 0; i < layers; i++) inverseThickness[i] = 1 / thickness[i]!;
  const inverseCentreSpacing = new Float64Array(layers + 1);
  for (let j = 0; j <= layers; j++) inverseCentreSpacing[j] = 1 / centreSpacing[j]!;
  return { layers, depth, zFace, zCentre, thickness, centreSpacing, inverseThickness, inverseCentreSpacing };
}
