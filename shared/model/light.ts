/**
 * Light at the sea surface and in the water column, and the
 * photosynthesis–light response.
 *
 * Units: irradiance in W m⁻²; photosynthetically active radiation (PAR) in
 * µmol photons m⁻² s⁻¹; attenuation coefficient Kd in m⁻¹; depth in metres
 * below the surface (positive down).
 */

const RAD = Math.PI / 180;

/** Total solar irradiance at 1 AU, W m⁻² (Kopp & Lean 2011, Geophys. Res. Lett. 38:L01706 [from memory]). */
export const SOLAR_CONSTANT_W_M2 = 1361;

/** Share of clear-sky shortwave that is PAR, 400–700 nm; 0.43–0.50 is the usual range, 0.45 common practice. */
export const PAR_FRACTION = 0.45;

/** µmol photons per joule of PAR in sunlight (McCree 1981, in Encycl. Plant Physiol. 12A [from memory]). */
export const PAR_UMOL_PER_J = 4.57;

/** Refractive index of seawater for visible light (about 1.34; common practice). */
export const SEAWATER_REFRACTIVE_INDEX = 1.34;

/**
 * Relative optical air mass for the sun at a geometric elevation, after
 * Kasten & Young (1989), Applied Optics 28(22):4735–4738 [coefficients
 * from memory]: AM = 1/(cos z + 0.50572 (96.07995° − z)^−1.6364), z the
 * zenith angle in degrees. Finite down to the horizon (AM ≈ 38 at z = 90°).
 * Returns +Infinity when the sun is more than 6° below the horizon.
 */
export function relativeAirMass(elevationDeg: number): number {
  const zenithDeg = 90 - elevationDeg;
  if (zenithDeg >= 96) return Number.POSITIVE_INFINITY;
  return 1 / (Math.cos(zenithDeg * RAD) + 0.50572 * (96.07995 - zenithDeg) ** -1.6364);
}

/**
 * Fresnel reflectance of unpolarised light at a flat air–water surface
 * (Fresnel equations; e.g. Kirk 2011, "Light and Photosynthesis in Aquatic
 * Ecosystems", 3rd ed., ch. 2 [from memory]). `incidenceDeg` is the angle
 * from the vertical; at normal incidence R = ((n − 1)/(n + 1))².
 */
export function fresnelReflectance(incidenceDeg: number, n: number = SEAWATER_REFRACTIVE_INDEX): number {
  if (incidenceDeg >= 90) return 1;
  const i = Math.max(0, incidenceDeg) * RAD;
  if (i === 0) return ((n - 1) / (n + 1)) ** 2;
  const r = Math.asin(Math.sin(i) / n);
  const rs = Math.sin(i - r) / Math.sin(i + r);
  const rp = Math.tan(i - r) / Math.tan(i + r);
  return 0.5 * (rs * rs + rp * rp);
}

/**
 * Clear-sky PAR just below the sea surface, µmol photons m⁻² s⁻¹, for a
 * solar elevation in degrees. 0 when the sun is at or below the horizon.
 *
 * Steps:
 * 1. Direct-beam transmission of a clear atmosphere 0.7^(AM^0.678)
 *    (Meinel & Meinel 1976, "Applied Solar Energy", Addison-Wesley, after
 *    Laue 1970 [from memory]), AM from `relativeAirMass`.
 * 2. Global horizontal irradiance = 1.1 × direct-beam on a horizontal plane,
 *    the 10 % allowance for diffuse sky light of Meinel & Meinel [from memory]:
 *    E = 1.1 × 1361 × sin(elevation) × 0.7^(AM^0.678) W m⁻².
 * 3. PAR = 0.45 × E × 4.57 µmol J⁻¹ (McCree 1981 [from memory]).
 * 4. Transmission through a flat surface, 1 − Fresnel reflectance at the
 *    solar zenith angle with n = 1.34 (applied to diffuse light too, a
 *    simplification).
 * The sun–earth distance (±3.4 %) and clouds are ignored; this is an
 * upper envelope for a clear day.
 */
export function clearSkyParAtSurface(elevationDeg: number): number {
  if (!(elevationDeg > 0)) return 0;
  const elevation = Math.min(elevationDeg, 90);
  const airMass = relativeAirMass(elevation);
  const direct = SOLAR_CONSTANT_W_M2 * 0.7 ** (airMass ** 0.678);
  const globalHorizontal = 1.1 * direct * Math.sin(elevation * RAD);
  const transmitted = 1 - fresnelReflectance(90 - elevation);
  return globalHorizontal * PAR_FRACTION * PAR_UMOL_PER_J * transmitted;
}

/**
 * Beer–Lambert attenuation, I(d) = I0 exp(−Kd d) (e.g. Kirk 2011, ch. 6).
 * @param surface light just below the surface (any unit; the result has the same unit)
 * @param kd diffuse attenuation coefficient, m⁻¹
 * @param depthM depth below the surface, m
 */
export function lightAtDepth(surface: number, kd: number, depthM: number): number {
  return surface * Math.exp(-kd * depthM);
}

/** Depth of the 1 % light level, ln(100)/Kd metres (from Beer–Lambert). */
export function euphoticDepth(kd: number): number {
  return Math.log(100) / kd;
}

/**
 * Photosynthesis–light curve of Jassby & Platt (1976), Limnol. Oceanogr.
 * 21(4):540–547: P = Pmax tanh(α I / Pmax). P has the unit of Pmax; α is
 * the initial slope in P per unit of light. Returns 0 when Pmax ≤ 0.
 */
export function jassbyPlatt(light: number, alpha: number, pmax: number): number {
  if (!(pmax > 0)) return 0;
  return pmax * Math.tanh((alpha * light) / pmax);
}
