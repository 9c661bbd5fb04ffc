/**
 * Nodal corrections f (amplitude factor) and u (phase correction, degrees),
 * and the Greenwich equilibrium argument V0, for the standard constituents.
 *
 * Formulas: Schureman (1958), Manual of Harmonic Analysis and Prediction of
 * Tides, USC&GS Special Publication 98 (equation numbers from memory):
 *   M2   f = cos⁴(½I) / 0.9154                         u = 2ξ − 2ν        (eq. 78)
 *   O1   f = sin I cos²(½I) / 0.3800                   u = 2ξ − ν         (eq. 75)
 *   K1   f = [0.8965 sin²2I + 0.6001 sin 2I cos ν + 0.1006]^½, u = −ν′  (eq. 227)
 *   K2   f = [19.0444 sin⁴I + 2.7702 sin²I cos 2ν + 0.0981]^½, u = −2ν″ (eq. 235)
 *   J1   f = sin 2I / 0.7214                           u = −ν
 *   OO1  f = sin I sin²(½I) / 0.01640                  u = −2ξ − ν
 *   Mf   f = sin²I / 0.1578                            u = −2ξ
 *   Mm   f = (2/3 − sin²I) / 0.5021                    u = 0
 *   L2   f = f_M2 / Ra, u = 2ξ − 2ν − R, with P = p − ξ,
 *        1/Ra = [1 − 12 tan²(½I) cos 2P + 36 tan⁴(½I)]^½,
 *        tan R = sin 2P / ((1/6) cot²(½I) − cos 2P)    (eq. 213–215)
 * The denominators are the mean values over the node cycle (Schureman eqs.
 * 65–73, with ω = 23.452° and i = 5.145°). The four-digit printed values are
 * used as published; for OO1 the mean is computed (0.016369), because the
 * printed 0.0164 has only three digits and would bias f_OO1 by 0.2 %.
 * Compound constituents: IHO list Annex B (see constituents.ts).
 */

import {
  LUNAR_INCLINATION_DEG,
  SCHUREMAN_OBLIQUITY_DEG,
  meanLongitudes,
  nodeAngles,
  wrap180,
  wrap360,
  type MeanLongitudes,
  type NodeAngles,
} from './astronomy.ts';
import { STANDARD_CONSTITUENTS, type ConstituentDefinition, type NodalFundamental } from './constituents.ts';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

/**
 * Node-cycle means of the lunar factors (Schureman 1958, eqs. 65–73), ω = 23.452°, i = 5.145°.
 * Only OO1 uses the computed value; the others use the printed four-digit constants.
 */
export const SCHUREMAN_MEANS = (() => {
  const w = SCHUREMAN_OBLIQUITY_DEG * RAD;
  const i = LUNAR_INCLINATION_DEG * RAD;
  const cos4HalfI = Math.cos(i / 2) ** 4;
  const sinI2 = Math.sin(i) ** 2;
  return {
    Mm: (2 / 3 - Math.sin(w) ** 2) * (1 - 1.5 * sinI2), // 0.5021
    Mf: Math.sin(w) ** 2 * cos4HalfI, // 0.1578
    O1: Math.sin(w) * Math.cos(w / 2) ** 2 * cos4HalfI, // 0.3800
    J1: Math.sin(2 * w) * (1 - 1.5 * sinI2), // 0.7214
    OO1: Math.sin(w) * Math.sin(w / 2) ** 2 * cos4HalfI, // 0.0164
    M2: Math.cos(w / 2) ** 4 * cos4HalfI, // 0.9154
  };
})();

export interface NodalFactor {
  f: number;
  /** Degrees, (−180, 180]. */
  u: number;
}

/** f and u of the fundamental formulas, degrees for u. */
export type FundamentalFactors = Record<NodalFundamental, NodalFactor>;

/** Evaluates Schureman's fundamental nodal formulas for the given orbit angles and lunar perigee p (degrees). */
export function fundamentalFactors(angles: NodeAngles, perigeeDeg: number): FundamentalFactors {
  const I = angles.I * RAD;
  const sinI = Math.sin(I);
  const cosHalf = Math.cos(I / 2);
  const sinHalf = Math.sin(I / 2);
  const sin2I = Math.sin(2 * I);
  const nu = angles.nu * RAD;
  const { xi, nu: nuDeg } = angles;

  const fM2 = cosHalf ** 4 / 0.9154;
  const uM2 = 2 * xi - 2 * nuDeg;

  const P = (perigeeDeg - xi) * RAD;
  const tanHalf = Math.tan(I / 2);
  const invRa = Math.sqrt(1 - 12 * tanHalf ** 2 * Math.cos(2 * P) + 36 * tanHalf ** 4);
  const R = Math.atan2(Math.sin(2 * P), 1 / (6 * tanHalf ** 2) - Math.cos(2 * P)) * DEG;

  return {
    M2: { f: fM2, u: wrap180(uM2) },
    O1: { f: (sinI * cosHalf ** 2) / 0.38, u: wrap180(2 * xi - nuDeg) },
    K1: {
      f: Math.sqrt(0.8965 * sin2I ** 2 + 0.6001 * sin2I * Math.cos(nu) + 0.1006),
      u: wrap180(-angles.nuPrime),
    },
    K2: {
      f: Math.sqrt(19.0444 * sinI ** 4 + 2.7702 * sinI ** 2 * Math.cos(2 * nu) + 0.0981),
      u: wrap180(-2 * angles.nuDoublePrime),
    },
    J1: { f: sin2I / 0.7214, u: wrap180(-nuDeg) },
    OO1: { f: (sinI * sinHalf ** 2) / SCHUREMAN_MEANS.OO1, u: wrap180(-2 * xi - nuDeg) },
    Mf: { f: sinI ** 2 / 0.1578, u: wrap180(-2 * xi) },
    Mm: { f: (2 / 3 - sinI ** 2) / 0.5021, u: 0 },
    L2: { f: fM2 * invRa, u: wrap180(uM2 - R) },
  };
}

/** f and u for one constituent given the fundamental factors. */
export function constituentNodalFactor(definition: ConstituentDefinition, fundamentals: FundamentalFactors): NodalFactor {
  const rule = definition.nodal;
  if (rule.kind === 'none') return { f: 1, u: 0 };
  if (rule.kind === 'fundamental') return { ...fundamentals[rule.key] };
  let f = 1;
  let u = 0;
  for (const [key, n] of rule.members) {
    const m = fundamentals[key];
    f *= m.f ** Math.abs(n);
    u += n * m.u;
  }
  return { f, u: wrap180(u) };
}

/** Greenwich equilibrium argument V0 of a constituent, degrees in [0, 360). */
export function equilibriumArgumentDeg(definition: ConstituentDefinition, longitudes: MeanLongitudes): number {
  const [a, b, c, d, e, g] = definition.doodson;
  const v =
    a * longitudes.tau +
    b * longitudes.s +
    c * longitudes.h +
    d * longitudes.p -
    e * longitudes.N + // N′ = −N
    g * longitudes.p1 +
    90 * definition.quarterTurns;
  return wrap360(v);
}

/** Everything that depends on the date: mean longitudes, orbit angles and fundamental nodal factors. */
export interface AstronomicalState {
  timeMs: number;
  longitudes: MeanLongitudes;
  angles: NodeAngles;
  fundamentals: FundamentalFactors;
}

export function astronomicalState(timeMs: number): AstronomicalState {
  const longitudes = meanLongitudes(timeMs);
  const angles = nodeAngles(longitudes.N);
  return { timeMs, longitudes, angles, fundamentals: fundamentalFactors(angles, longitudes.p) };
}

/** f and u (degrees) of every standard constituent at a UTC time, by canonical name. */
export function nodalTable(timeMs: number): Record<string, NodalFactor> {
  const state = astronomicalState(timeMs);
  const out: Record<string, NodalFactor> = {};
  for (const d of STANDARD_CONSTITUENTS) out[d.name] = constituentNodalFactor(d, state.fundamentals);
  return out;
}
