/**
 * Typical bed roughness by bed type. z0 values from Soulsby (1997), Dynamics of Marine Sands, Table 7
 * [from memory; check against the book before relying on them]; the Nikuradse roughness is ks = 30 z0.
 */
export const BED_TYPES = {
  mud: { label: 'Mud', z0M: 0.0002 },
  'mud-sand': { label: 'Mud and sand', z0M: 0.0007 },
  'sand-flat': { label: 'Sand, unrippled', z0M: 0.0004 },
  'sand-rippled': { label: 'Sand, rippled', z0M: 0.006 },
  gravel: { label: 'Gravel', z0M: 0.003 },
} as const;

export type BedType = keyof typeof BED_TYPES;

export const BED_TYPE_KEYS = Object.keys(BED_TYPES) as [BedType, ...BedType[]];

/** Nikuradse roughness ks (m) for a bed type: 30 z0. */
export function bedTypeRoughness(bedType: BedType): number {
  return 30 * BED_TYPES[bedType].z0M;
}
