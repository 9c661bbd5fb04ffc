/**
 * Astronomical quantities for tidal prediction, all angles in degrees.
 *
 * Mean longitudes (Meeus 1998, Astronomical Algorithms, ch. 22, 25 and 47), as
 * functions of T, Julian centuries from J2000.0. Universal Time is used for
 * Terrestrial Time: the ~70 s difference moves the Moon by 0.0006°, far below
 * anything a tide prediction can resolve.
 *
 * The angles I, ν and ξ of the Moon's orbit follow Schureman (1958), Manual of
 * Harmonic Analysis and Prediction of Tides, USC&GS Special Publication 98.
 */

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

/** Obliquity of the ecliptic and inclination of the lunar orbit used by Schureman (1958). */
export const SCHUREMAN_OBLIQUITY_DEG = 23.452;
export const LUNAR_INCLINATION_DEG = 5.145;

const MS_PER_DAY = 86_400_000;
const JD_UNIX_EPOCH = 2_440_587.5;
const JD_J2000 = 2_451_545.0;

/** Wraps an angle into [0, 360). */
export function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}

/** Wraps an angle into (−180, 180]. */
export function wrap180(deg: number): number {
  const r = wrap360(deg);
  return r > 180 ? r - 360 : r;
}

/** Julian centuries from J2000.0 (2000-01-01T12:00Z) for a UTC epoch time in milliseconds. */
export function julianCenturies(timeMs: number): number {
  return (timeMs / MS_PER_DAY + JD_UNIX_EPOCH - JD_J2000) / 36525;
}

/** The fundamental astronomical arguments, degrees in [0, 360). */
export interface MeanLongitudes {
  /** Hour angle of the mean Sun at Greenwich (Schureman's T): 180° at 00:00 UTC. */
  meanSunHourAngle: number;
  /** Mean lunar time τ = T + h − s (Doodson's first argument). */
  tau: number;
  /** Mean longitude of the Moon. */
  s: number;
  /** Mean longitude of the Sun. */
  h: number;
  /** Mean longitude of the lunar perigee. */
  p: number;
  /** Longitude of the Moon's ascending node. */
  N: number;
  /** Mean longitude of the solar perigee (perihelion). */
  p1: number;
}

/**
 * Mean longitudes at a UTC time.
 * s: Meeus eq. 47.1 (L′); h: Meeus eq. 25.2 (L0); p = L′ − M′ with M′ from eq. 47.4;
 * p1 = L0 − M with M from eq. 25.3; N: Meeus ch. 22 (Ω).
 */
export function meanLongitudes(timeMs: number): MeanLongitudes {
  const T = julianCenturies(timeMs);
  const T2 = T * T;
  const T3 = T2 * T;
  const T4 = T3 * T;
  const s = 218.3164477 + 481267.88123421 * T - 0.0015786 * T2 + T3 / 538841 - T4 / 65194000;
  const moonAnomaly = 134.9633964 + 477198.8675055 * T + 0.0087414 * T2 + T3 / 69699 - T4 / 14712000;
  const h = 280.46646 + 36000.76983 * T + 0.0003032 * T2;
  const sunAnomaly = 357.52911 + 35999.05029 * T - 0.0001537 * T2;
  const N = 125.04452 - 1934.136261 * T + 0.0020708 * T2 + T3 / 450000;
  const dayFraction = (((timeMs % MS_PER_DAY) + MS_PER_DAY) % MS_PER_DAY) / MS_PER_DAY;
  const meanSunHourAngle = wrap360(180 + 360 * dayFraction);
  return {
    meanSunHourAngle,
    tau: wrap360(meanSunHourAngle + h - s),
    s: wrap360(s),
    h: wrap360(h),
    p: wrap360(s - moonAnomaly),
    N: wrap360(N),
    p1: wrap360(h - sunAnomaly),
  };
}

/** Angles of the lunar orbit relative to the equator (Schureman 1958), degrees. */
export interface NodeAngles {
  /** Longitude of the Moon's node, degrees in [0, 360). */
  N: number;
  /** Inclination of the Moon's orbit to the equator. */
  I: number;
  /** Right ascension of the lunar intersection, (−180, 180]. */
  nu: number;
  /** Longitude in the Moon's orbit of the lunar intersection, (−180, 180]. */
  xi: number;
  /** ν′ used by K1: tan ν′ = sin 2I sin ν / (sin 2I cos ν + 0.3347). */
  nuPrime: number;
  /** ν″ used by K2: tan 2ν″ = sin²I sin 2ν / (sin²I cos 2ν + 0.0727). */
  nuDoublePrime: number;
}

/**
 * I, ν, ξ, ν′ and ν″ from the node longitude N (Schureman 1958):
 * cos I = cos ω cos i − sin ω sin i cos N;
 * tan ½(N − ξ + ν) = [cos ½(ω − i) / cos ½(ω + i)] tan ½N;
 * tan ½(N − ξ − ν) = [sin ½(ω − i) / sin ½(ω + i)] tan ½N.
 * The half-angle equations are solved with atan2 so they stay continuous through N = 180°.
 */
export function nodeAngles(nodeDeg: number): NodeAngles {
  const N = wrap360(nodeDeg);
  const w = SCHUREMAN_OBLIQUITY_DEG * RAD;
  const i = LUNAR_INCLINATION_DEG * RAD;
  const n = N * RAD;
  const cosI = Math.cos(w) * Math.cos(i) - Math.sin(w) * Math.sin(i) * Math.cos(n);
  const I = Math.acos(cosI);
  const half = n / 2;
  const a = Math.atan2(Math.cos((w - i) / 2) * Math.sin(half), Math.cos((w + i) / 2) * Math.cos(half));
  const b = Math.atan2(Math.sin((w - i) / 2) * Math.sin(half), Math.sin((w + i) / 2) * Math.cos(half));
  const xi = n - (a + b);
  const nu = a - b;
  const sin2I = Math.sin(2 * I);
  const sinI2 = Math.sin(I) ** 2;
  const nuPrime = Math.atan2(sin2I * Math.sin(nu), sin2I * Math.cos(nu) + 0.3347);
  const nuDoublePrime = Math.atan2(sinI2 * Math.sin(2 * nu), sinI2 * Math.cos(2 * nu) + 0.0727) / 2;
  return {
    N,
    I: I * DEG,
    nu: wrap180(nu * DEG),
    xi: wrap180(xi * DEG),
    nuPrime: wrap180(nuPrime * DEG),
    nuDoublePrime: wrap180(nuDoublePrime * DEG),
  };
}
