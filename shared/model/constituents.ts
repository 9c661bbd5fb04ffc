/**
 * Angular speeds of the standard tidal constituents, degrees per hour.
 * Source: IHO TWCWG Standard List of Tidal Constituents (2017); each value
 * agrees with its Doodson-number derivation to 1e-7 °/h.
 */
export const CONSTITUENT_SPEEDS_DEG_PER_H = {
  M2: 28.9841042,
  S2: 30.0,
  N2: 28.4397295,
  K2: 30.0821373,
  K1: 15.0410686,
  O1: 13.9430356,
  P1: 14.9589314,
  Q1: 13.3986609,
  M4: 57.9682084,
  MS4: 58.9841042,
  MN4: 57.4238337,
  M6: 86.9523127,
  Mf: 1.098033,
  MSf: 1.0158958,
  Mm: 0.5443747,
} as const;

export type ConstituentName = keyof typeof CONSTITUENT_SPEEDS_DEG_PER_H;

export const CONSTITUENT_NAMES = Object.keys(CONSTITUENT_SPEEDS_DEG_PER_H) as ConstituentName[];

export function isConstituentName(name: string): name is ConstituentName {
  return Object.prototype.hasOwnProperty.call(CONSTITUENT_SPEEDS_DEG_PER_H, name);
}

/** Angular speed in radians per second. */
export function constituentOmega(name: ConstituentName): number {
  return (CONSTITUENT_SPEEDS_DEG_PER_H[name] * Math.PI) / 180 / 3600;
}

/** Period in seconds. */
export function constituentPeriodS(name: ConstituentName): number {
  return (360 / CONSTITUENT_SPEEDS_DEG_PER_H[name]) * 3600;
}
