/**
 * Position of the sun for a UTC instant and a place on the earth.
 *
 * Source: the NOAA Global Monitoring Laboratory solar calculator (its
 * spreadsheet equations), which follow Meeus, J. (1998), "Astronomical
 * Algorithms", 2nd ed., Willmann-Bell, ch. 22 (obliquity) and ch. 25 (solar
 * coordinates, low accuracy), plus the equation of time of ch. 28 in the
 * form of Smart (1956). Stated accuracy is about 0.01° in position for
 * years 1800–2100; time is treated as UT throughout (TT − UT ≈ 70 s moves
 * the sun by less than 0.001°).
 *
 * Angles are in degrees unless a name says otherwise; times are epoch
 * milliseconds (UTC), the same as `Date.prototype.valueOf()`.
 */

const RAD = Math.PI / 180;
const DAY_MS = 86_400_000;
/** Julian date of the Unix epoch, 1970-01-01T00:00Z. */
const JD_UNIX_EPOCH = 2_440_587.5;
/** Julian date of J2000.0. */
const JD_J2000 = 2_451_545;

interface SolarCoordinates {
  /** Apparent declination, degrees. */
  declinationDeg: number;
  /** Equation of time (apparent minus mean solar time), minutes. */
  equationOfTimeMin: number;
}

/** Julian centuries since J2000.0 for an epoch-millisecond instant. */
function julianCenturies(timeUtcMs: number): number {
  const jd = timeUtcMs / DAY_MS + JD_UNIX_EPOCH;
  return (jd - JD_J2000) / 36_525;
}

/** NOAA solar-calculator equations (Meeus ch. 22, 25, 28). */
function solarCoordinates(timeUtcMs: number): SolarCoordinates {
  const t = julianCenturies(timeUtcMs);
  // Geometric mean longitude and mean anomaly of the sun (Meeus 25.2, 25.3).
  const l0 = (((280.46646 + t * (36_000.76983 + t * 0.0003032)) % 360) + 360) % 360;
  const m = 357.52911 + t * (35_999.05029 - 0.0001537 * t);
  // Eccentricity of the earth's orbit (Meeus 25.4).
  const e = 0.016708634 - t * (0.000042037 + 0.0000001267 * t);
  const mRad = m * RAD;
  // Equation of the centre.
  const c =
    Math.sin(mRad) * (1.914602 - t * (0.004817 + 0.000014 * t)) +
    Math.sin(2 * mRad) * (0.019993 - 0.000101 * t) +
    Math.sin(3 * mRad) * 0.000289;
  const trueLongitude = l0 + c;
  // Apparent longitude: nutation and aberration (Meeus 25.8 and text).
  const omegaRad = (125.04 - 1934.136 * t) * RAD;
  const apparentLongitude = trueLongitude - 0.00569 - 0.00478 * Math.sin(omegaRad);
  // Mean obliquity of the ecliptic (Meeus 22.2) and its correction (25.8).
  const meanObliquity = 23 + (26 + (21.448 - t * (46.815 + t * (0.00059 - t * 0.001813))) / 60) / 60;
  const obliquityRad = (meanObliquity + 0.00256 * Math.cos(omegaRad)) * RAD;
  const declinationDeg =
    Math.asin(Math.sin(obliquityRad) * Math.sin(apparentLongitude * RAD)) / RAD;
  // Equation of time (Meeus 28.3, Smart's series), converted from radians to minutes.
  const y = Math.tan(obliquityRad / 2) ** 2;
  const l0Rad = l0 * RAD;
  const eqTimeRad =
    y * Math.sin(2 * l0Rad) -
    2 * e * Math.sin(mRad) +
    4 * e * y * Math.sin(mRad) * Math.cos(2 * l0Rad) -
    0.5 * y * y * Math.sin(4 * l0Rad) -
    1.25 * e * e * Math.sin(2 * mRad);
  return { declinationDeg, equationOfTimeMin: (4 * eqTimeRad) / RAD };
}

/** Apparent declination of the sun, degrees (NOAA solar calculator; Meeus 25.7). */
export function solarDeclinationDeg(timeUtcMs: number): number {
  return solarCoordinates(timeUtcMs).declinationDeg;
}

/** Equation of time, minutes (apparent minus mean solar time; NOAA; Meeus 28.3). */
export function equationOfTimeMin(timeUtcMs: number): number {
  return solarCoordinates(timeUtcMs).equationOfTimeMin;
}

/**
 * Geometric elevation of the sun's centre above the horizon, degrees, with no
 * atmospheric refraction (NOAA solar calculator, Meeus ch. 25 and 13).
 * Negative when the sun is below the horizon. For the apparent elevation
 * add `atmosphericRefractionDeg`, or call `apparentSunElevationDeg`.
 *
 * @param timeUtcMs epoch milliseconds, UTC
 * @param latitudeDeg degrees north (−90..90)
 * @param longitudeDeg degrees east (west negative)
 */
export function sunElevationDeg(timeUtcMs: number, latitudeDeg: number, longitudeDeg: number): number {
  const { declinationDeg, equationOfTimeMin: eqTime } = solarCoordinates(timeUtcMs);
  const minutesOfDay = (((timeUtcMs % DAY_MS) + DAY_MS) % DAY_MS) / 60_000;
  // True solar time in minutes, then the hour angle (degrees, 0 at local noon).
  const trueSolarMin = minutesOfDay + eqTime + 4 * longitudeDeg;
  const hourAngleRad = (trueSolarMin / 4 - 180) * RAD;
  const latRad = latitudeDeg * RAD;
  const decRad = declinationDeg * RAD;
  const sinElevation =
    Math.sin(latRad) * Math.sin(decRad) + Math.cos(latRad) * Math.cos(decRad) * Math.cos(hourAngleRad);
  return Math.asin(Math.min(1, Math.max(-1, sinElevation))) / RAD;
}

/**
 * Atmospheric refraction for a true (geometric) elevation, degrees, at
 * 1010 hPa and 10 °C: R = 1.02′ / tan(h + 10.3°/(h + 5.11)).
 * Source: Sæmundsson (1986), Sky & Telescope 72:70, as Meeus (1998) eq. 16.4.
 * Below −1° the sun is treated as set and no refraction is added; between
 * −1° and 0° the formula is used as is (it stays finite there). Clamped at
 * 0 near the zenith, where the formula dips 0.002° below zero.
 */
export function atmosphericRefractionDeg(trueElevationDeg: number): number {
  if (trueElevationDeg < -1) return 0;
  const h = trueElevationDeg;
  const arcmin = 1.02 / Math.tan((h + 10.3 / (h + 5.11)) * RAD);
  return Math.max(0, arcmin / 60);
}

/** Apparent elevation of the sun's centre: geometric elevation plus refraction (Sæmundsson 1986). */
export function apparentSunElevationDeg(timeUtcMs: number, latitudeDeg: number, longitudeDeg: number): number {
  const h = sunElevationDeg(timeUtcMs, latitudeDeg, longitudeDeg);
  return h + atmosphericRefractionDeg(h);
}

/**
 * UTC instant of local solar noon (sun on the meridian) on the UTC calendar
 * day containing `dayUtcMs`, at the given longitude: noon = 720 − 4λ − EoT
 * minutes after 00:00 UTC (NOAA solar calculator). The equation of time is
 * evaluated at the noon estimate and refined once, which converges to well
 * under a second. For longitudes far from 0 the result may fall on the
 * neighbouring UTC day.
 */
export function solarNoonUtcMs(dayUtcMs: number, longitudeDeg: number): number {
  const midnight = Math.floor(dayUtcMs / DAY_MS) * DAY_MS;
  let noonMin = 720 - 4 * longitudeDeg;
  for (let i = 0; i < 2; i++) {
    noonMin = 720 - 4 * longitudeDeg - equationOfTimeMin(midnight + noonMin * 60_000);
  }
  return midnight + noonMin * 60_000;
}
