/**
 * Seawater density and viscosity at atmospheric pressure.
 *
 * Salinity is practical salinity (PSS-78, ≈ g/kg); temperature in °C.
 */

/**
 * Density of seawater at one standard atmosphere, kg m⁻³: the UNESCO
 * International Equation of State of Seawater, EOS-80, one-atmosphere part
 * (Millero & Poisson 1981, Deep-Sea Res. 28A:625–629; UNESCO Tech. Pap.
 * Mar. Sci. 36 and 38, 1981; Fofonoff & Millard 1983, Tech. Pap. 44).
 * Published check values: ρ(S=0, 5 °C) = 999.96675, ρ(35, 5 °C) = 1027.67547,
 * ρ(35, 25 °C) = 1023.34306 kg m⁻³. Valid for 0–42 salinity, −2–40 °C.
 * EOS-80 is defined on the IPTS-68 temperature scale; the ITS-90 difference
 * (T68 = 1.00024 T90) changes ρ by under 0.002 kg m⁻³ and is ignored here.
 */
export function seawaterDensity(salinity: number, tempC: number): number {
  const t = tempC;
  const s = salinity;
  // Standard mean ocean water (Bigg 1967 form used in EOS-80).
  const rhoW =
    999.842594 +
    t * (6.793952e-2 + t * (-9.09529e-3 + t * (1.001685e-4 + t * (-1.120083e-6 + t * 6.536332e-9))));
  const a = 8.24493e-1 + t * (-4.0899e-3 + t * (7.6438e-5 + t * (-8.2467e-7 + t * 5.3875e-9)));
  const b = -5.72466e-3 + t * (1.0227e-4 - t * 1.6546e-6);
  const c = 4.8314e-4;
  return rhoW + a * s + b * s * Math.sqrt(s) + c * s * s;
}

/** Reference-composition salinity per unit practical salinity, 35.16504/35 (Millero et al. 2008). */
export const REFERENCE_SALINITY_PER_PRACTICAL = 35.16504 / 35;

/**
 * Dynamic viscosity of seawater, Pa s: Sharqawy, Lienhard & Zubair (2010),
 * "Thermophysical properties of seawater: a review of existing correlations
 * and data", Desalination and Water Treatment 16:354–380, eq. 22:
 *   μ_sw = μ_w (1 + A S + B S²), S in kg/kg,
 *   A = 1.541 + 1.998e-2 T − 9.52e-5 T², B = 7.974 − 7.561e-2 T + 4.724e-4 T²,
 *   μ_w = 4.2844e-5 + [0.157 (T + 64.993)² − 91.296]⁻¹.
 * Stated range 0–180 °C, 0–0.15 kg/kg; accuracy ±1.5 %.
 * Sharqawy et al. write the correlations in absolute (reference-composition)
 * salinity, so practical salinity is converted first with
 * S_R = (35.16504/35) S_P (Millero et al. 2008, Deep-Sea Res. I 55:50–72).
 */
export function seawaterDynamicViscosity(salinity: number, tempC: number): number {
  const t = tempC;
  const s = (salinity * REFERENCE_SALINITY_PER_PRACTICAL) / 1000;
  const muW = 4.2844e-5 + 1 / (0.157 * (t + 64.993) ** 2 - 91.296);
  const a = 1.541 + 1.998e-2 * t - 9.52e-5 * t * t;
  const b = 7.974 - 7.561e-2 * t + 4.724e-4 * t * t;
  return muW * (1 + a * s + b * s * s);
}

/** Kinematic viscosity of seawater, m² s⁻¹: Sharqawy et al. (2010) μ divided by EOS-80 ρ. */
export function seawaterKinematicViscosity(salinity: number, tempC: number): number {
  return seawaterDynamicViscosity(salinity, tempC) / seawaterDensity(salinity, tempC);
}
