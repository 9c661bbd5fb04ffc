/**
 * The standard tidal constituents: Doodson numbers, speeds derived from them,
 * and the rule that gives each its nodal correction.
 *
 * Source: IHO TWCWG Standard List of Tidal Constituents (2017). Doodson numbers
 * are written as integer multipliers of (τ, s, h, p, N′, p1) plus a phase
 * offset in quarter turns (90°), in the Schureman sign convention used by
 * published Greenwich phases (K1 carries −90°, O1 +90°). N′ = −N.
 *
 * Nodal rules (IHO list Annex A and B; Schureman 1958):
 * - 'none': f = 1, u = 0 (solar and radiational constituents).
 * - a fundamental key: Schureman's own formula for that constituent.
 * - members: a compound or derived constituent takes f = Π f_k^|n_k| and
 *   u = Σ n_k u_k over its members (IHO Annex B), e.g. MS4 = M2 + S2.
 *
 * M1 is left out on purpose: agencies disagree on its definition (the IHO list
 * carries several M1 variants), so a phase for "M1" is not portable.
 */

/** Fundamental nodal formulas available in nodal.ts. */
export type NodalFundamental = 'Mm' | 'Mf' | 'O1' | 'K1' | 'J1' | 'OO1' | 'M2' | 'K2' | 'L2';

export type NodalRule =
  | { readonly kind: 'none' }
  | { readonly kind: 'fundamental'; readonly key: NodalFundamental }
  | { readonly kind: 'members'; readonly members: readonly (readonly [NodalFundamental, number])[] };

export interface ConstituentDefinition {
  /** Canonical name (IHO spelling in ASCII). */
  readonly name: string;
  /** Other accepted spellings (NOAA upper case, Greek letters). */
  readonly aliases: readonly string[];
  /** Multipliers of τ, s, h, p, N′, p1. */
  readonly doodson: readonly [number, number, number, number, number, number];
  /** Phase offset in quarter turns: V0 includes 90° × this. */
  readonly quarterTurns: number;
  readonly nodal: NodalRule;
}

/**
 * Rates of the fundamental arguments, degrees per hour (IHO list, Doodson's values):
 * τ = 15 − s + h; s = 0.5490165; h = 0.0410686; p = 0.0046418; N′ = 0.0022064; p1 = 0.0000020.
 */
export const FUNDAMENTAL_SPEEDS_DEG_PER_H = {
  s: 0.5490165,
  h: 0.0410686,
  p: 0.0046418,
  nPrime: 0.0022064,
  p1: 0.000002,
} as const;

const NONE: NodalRule = { kind: 'none' };
const fundamental = (key: NodalFundamental): NodalRule => ({ kind: 'fundamental', key });
const members = (...m: (readonly [NodalFundamental, number])[]): NodalRule => ({ kind: 'members', members: m });

function c(
  name: string,
  doodson: [number, number, number, number, number, number],
  quarterTurns: number,
  nodal: NodalRule,
  aliases: string[] = [],
): ConstituentDefinition {
  return { name, aliases, doodson, quarterTurns, nodal };
}

/**
 * The standard list, in order of priority for harmonic analysis (the order in
 * which constituents are kept when the Rayleigh criterion forces a choice).
 */
export const STANDARD_CONSTITUENTS: readonly ConstituentDefinition[] = [
  c('M2', [2, 0, 0, 0, 0, 0], 0, fundamental('M2')),
  c('S2', [2, 2, -2, 0, 0, 0], 0, NONE),
  c('K1', [1, 1, 0, 0, 0, 0], -1, fundamental('K1')),
  c('O1', [1, -1, 0, 0, 0, 0], 1, fundamental('O1')),
  c('N2', [2, -1, 0, 1, 0, 0], 0, members(['M2', 1])),
  c('M4', [4, 0, 0, 0, 0, 0], 0, members(['M2', 2])),
  c('K2', [2, 2, 0, 0, 0, 0], 0, fundamental('K2')),
  c('P1', [1, 1, -2, 0, 0, 0], 1, NONE),
  c('Q1', [1, -2, 0, 1, 0, 0], 1, members(['O1', 1])),
  c('MS4', [4, 2, -2, 0, 0, 0], 0, members(['M2', 1])),
  c('MN4', [4, -1, 0, 1, 0, 0], 0, members(['M2', 2])),
  c('M6', [6, 0, 0, 0, 0, 0], 0, members(['M2', 3])),
  c('2N2', [2, -2, 0, 2, 0, 0], 0, members(['M2', 1])),
  c('MU2', [2, -2, 2, 0, 0, 0], 0, members(['M2', 1]), ['mu2', 'μ2']),
  c('NU2', [2, -1, 2, -1, 0, 0], 0, members(['M2', 1]), ['nu2', 'ν2']),
  c('L2', [2, 1, 0, -1, 0, 0], -2, fundamental('L2')),
  c('T2', [2, 2, -3, 0, 0, 1], 0, NONE),
  c('J1', [1, 2, 0, -1, 0, 0], -1, fundamental('J1')),
  c('OO1', [1, 3, 0, 0, 0, 0], -1, fundamental('OO1')),
  c('Mf', [0, 2, 0, 0, 0, 0], 0, fundamental('Mf'), ['MF']),
  c('MSf', [0, 2, -2, 0, 0, 0], 0, members(['M2', -1]), ['MSF']),
  c('Mm', [0, 1, 0, -1, 0, 0], 0, fundamental('Mm'), ['MM']),
  c('Sa', [0, 0, 1, 0, 0, 0], 0, NONE, ['SA']),
  c('Ssa', [0, 0, 2, 0, 0, 0], 0, NONE, ['SSA']),
  c('2Q1', [1, -3, 0, 2, 0, 0], 1, members(['O1', 1])),
  c('RHO1', [1, -2, 2, -1, 0, 0], 1, members(['O1', 1]), ['rho1', 'RHO', 'ρ1']),
  c('S1', [1, 1, -1, 0, 0, 0], 0, NONE),
  c('LAM2', [2, 1, -2, 1, 0, 0], -2, members(['M2', 1]), ['lambda2', 'LAMBDA2', 'λ2']),
  c('R2', [2, 2, -1, 0, 0, -1], -2, NONE),
  c('2SM2', [2, 4, -4, 0, 0, 0], 0, members(['M2', -1])),
  c('M3', [3, 0, 0, 0, 0, 0], -2, members(['M2', 1.5])),
  c('MK3', [3, 1, 0, 0, 0, 0], -1, members(['M2', 1], ['K1', 1])),
  c('2MK3', [3, -1, 0, 0, 0, 0], 1, members(['M2', 2], ['K1', -1])),
  c('S4', [4, 4, -4, 0, 0, 0], 0, NONE),
  c('2MS6', [6, 2, -2, 0, 0, 0], 0, members(['M2', 2])),
  c('S6', [6, 6, -6, 0, 0, 0], 0, NONE),
  c('M8', [8, 0, 0, 0, 0, 0], 0, members(['M2', 4])),
];

/** Canonical names of the standard constituents, in priority order. */
export const STANDARD_CONSTITUENT_NAMES: readonly string[] = STANDARD_CONSTITUENTS.map((d) => d.name);

const BY_KEY = new Map<string, number>();
STANDARD_CONSTITUENTS.forEach((d, index) => {
  BY_KEY.set(d.name, index);
  BY_KEY.set(d.name.toUpperCase(), index);
  for (const alias of d.aliases) {
    BY_KEY.set(alias, index);
    BY_KEY.set(alias.toUpperCase(), index);
  }
});

/**
 * Index of a constituent in STANDARD_CONSTITUENTS, or −1 if the name is unknown.
 * Matching is exact on the canonical name or an alias, then case-insensitive.
 */
export function constituentIndex(name: string): number {
  const trimmed = name.trim();
  return BY_KEY.get(trimmed) ?? BY_KEY.get(trimmed.toUpperCase()) ?? -1;
}

/** The definition for a name, or undefined if unknown. */
export function findConstituent(name: string): ConstituentDefinition | undefined {
  const i = constituentIndex(name);
  return i < 0 ? undefined : STANDARD_CONSTITUENTS[i];
}

/** Speed of a Doodson-number combination, degrees per hour. */
export function doodsonSpeedDegPerH(doodson: readonly number[]): number {
  const { s, h, p, nPrime, p1 } = FUNDAMENTAL_SPEEDS_DEG_PER_H;
  const tau = 15 - s + h;
  const rates = [tau, s, h, p, nPrime, p1];
  let speed = 0;
  for (let k = 0; k < 6; k++) speed += (doodson[k] ?? 0) * rates[k]!;
  return speed;
}

/** Speed of a standard constituent, degrees per hour, derived from its Doodson numbers. */
export function constituentSpeedDegPerH(definition: ConstituentDefinition): number {
  return doodsonSpeedDegPerH(definition.doodson);
}

/** Speeds of the standard list by canonical name, degrees per hour. */
export function standardSpeedsDegPerH(): Record<string, number> {
  const out: Record<string, number> = {};
  for (const d of STANDARD_CONSTITUENTS) out[d.name] = constituentSpeedDegPerH(d);
  return out;
}

/** Result of resolving names against the standard list. */
export type ResolveResult =
  | { ok: true; indices: Int32Array }
  | { ok: false; code: 'unknown-constituent' | 'duplicate-constituent'; message: string; names: string[] };

/**
 * Maps names to indices into STANDARD_CONSTITUENTS. Unknown names are reported
 * together, by name; so is a constituent given twice (under any spelling).
 */
export function resolveConstituentNames(names: readonly string[]): ResolveResult {
  const indices = new Int32Array(names.length);
  const unknown: string[] = [];
  const seen = new Map<number, string>();
  const duplicates: string[] = [];
  names.forEach((name, k) => {
    const i = constituentIndex(name);
    indices[k] = i;
    if (i < 0) unknown.push(name);
    else if (seen.has(i)) duplicates.push(`${name} (same as ${seen.get(i)})`);
    else seen.set(i, name);
  });
  if (unknown.length > 0) {
    return {
      ok: false,
      code: 'unknown-constituent',
      names: unknown,
      message: `unknown constituent${unknown.length > 1 ? 's' : ''}: ${unknown.map((n) => JSON.stringify(n)).join(', ')} (not in the standard list: ${STANDARD_CONSTITUENT_NAMES.join(' ')})`,
    };
  }
  if (duplicates.length > 0) {
    return {
      ok: false,
      code: 'duplicate-constituent',
      names: duplicates,
      message: `constituent given more than once: ${duplicates.join(', ')}`,
    };
  }
  return { ok: true, indices };
}
