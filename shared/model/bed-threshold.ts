/**
 * Threshold of motion at the bed, and the bed erosion and deposition fluxes.
 *
 * SI units: stress Pa (N m⁻²), diameter m, density kg m⁻³, kinematic
 * viscosity m² s⁻¹, settling velocity m s⁻¹, concentration kg m⁻³ (or any
 * amount per m³), fluxes per m² per s.
 */

import { GRAVITY, dimensionlessGrainSize } from './settling.ts';
import type { GrainInput } from './settling.ts';

/**
 * Critical Shields parameter for the threshold of motion, Soulsby &
 * Whitehouse (1997), Proc. Pacific Coasts & Ports '97, 1:149–154, as
 * Soulsby (1997) "Dynamics of Marine Sands" eq. 77:
 *   θ_cr = 0.30/(1 + 1.2 D*) + 0.055 [1 − exp(−0.020 D*)].
 */
export function soulsbyWhitehouseCriticalShields(dStar: number): number {
  return 0.3 / (1 + 1.2 * dStar) + 0.055 * (1 - Math.exp(-0.02 * dStar));
}

/**
 * Critical bed shear stress for the threshold of motion, Pa, from the
 * Shields (1936) definition θ = τ / [g (ρs − ρw) d] with θ_cr from
 * `soulsbyWhitehouseCriticalShields`.
 */
export function criticalBedStress(input: GrainInput): number {
  const theta = soulsbyWhitehouseCriticalShields(dimensionlessGrainSize(input));
  return theta * GRAVITY * (input.particleDensity - input.waterDensity) * input.diameterM;
}

/**
 * Erosion flux of Partheniades (1965), J. Hydraul. Div. ASCE 91(HY1):105–139
 * [from memory]: E = M (τb/τce − 1) for τb > τce, otherwise 0.
 * @param tauB bed shear stress, Pa
 * @param tauCe critical stress for erosion, Pa (> 0)
 * @param m erosion rate constant, per m² per s (e.g. kg m⁻² s⁻¹)
 */
export function partheniadesErosion(tauB: number, tauCe: number, m: number): number {
  return tauB > tauCe ? m * (tauB / tauCe - 1) : 0;
}

/**
 * Deposition flux of Krone (1962), "Flume Studies of the Transport of
 * Sediment in Estuarial Shoaling Processes", Univ. of California, Berkeley
 * [from memory]: D = ws Cb (1 − τb/τcd) for τb < τcd, otherwise 0.
 * Pass τcd = Infinity for deposition with no critical stress, D = ws Cb
 * (the form of Sanford & Halka 1993 [from memory]).
 * @param ws settling velocity, m s⁻¹ (≥ 0)
 * @param cBed concentration just above the bed, per m³
 * @param tauB bed shear stress, Pa
 * @param tauCd critical stress for deposition, Pa
 */
export function kroneDeposition(ws: number, cBed: number, tauB: number, tauCd: number): number {
  return tauB < tauCd ? ws * cBed * (1 - tauB / tauCd) : 0;
}
