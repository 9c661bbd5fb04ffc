/**
 * Maximum phytoplankton growth rate from temperature.
 *
 * Source: Eppley, R.W. (1972), "Temperature and phytoplankton growth in the
 * sea", Fish. Bull. 70(4):1063–1085, in the form quoted by Kremer & Nixon
 * (1978), "A Coastal Marine Ecosystem", Springer:
 *   log10 μ = 0.0275 T − 0.070, μ in doublings (divisions) per day, T in °C.
 * It is an upper envelope over many species (Q10 ≈ 1.89).
 */

/** Eppley (1972) maximum growth rate in doublings per day at temperature `tempC` (°C). */
export function eppleyMaxDoublingsPerDay(tempC: number): number {
  return 10 ** (0.0275 * tempC - 0.07);
}

/**
 * Eppley (1972) maximum specific growth rate, d⁻¹ (natural-log rate, so
 * N(t) = N0 e^(μ t)): ln 2 × 10^(0.0275 T − 0.070).
 */
export function eppleyMaxGrowthPerDay(tempC: number): number {
  return Math.LN2 * eppleyMaxDoublingsPerDay(tempC);
}
