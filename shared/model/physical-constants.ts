/** Gravitational acceleration, m s⁻² (the value used in the check tables). */
export const GRAVITY = 9.81;

/** Earth's rotation rate, rad s⁻¹ (sidereal day). */
export const EARTH_ROTATION_RAD_S = 7.2921159e-5;

/** Default von Kármán constant (open-channel value; a case may override it). */
export const DEFAULT_VON_KARMAN = 0.41;

/** Default seawater density, kg m⁻³. */
export const DEFAULT_WATER_DENSITY = 1025;

/** Standard k-epsilon constants, Launder & Spalding (1974). */
export const K_EPSILON_DEFAULTS = {
  cMu: 0.09,
  c1: 1.44,
  c2: 1.92,
  sigmaK: 1.0,
  sigmaEpsilon: 1.3,
} as const;

/** Floors that keep k and epsilon positive (m² s⁻², m² s⁻³). */
export const K_MIN = 1e-10;
export const EPSILON_MIN = 1e-14;

export const SECONDS_PER_DAY = 86400;
