/**
 * Standard k-epsilon closure (Launder & Spalding 1974) on the interfaces.
 *   ∂k/∂t = ∂/∂z(ν_t/σk ∂k/∂z) + P − ε
 *   ∂ε/∂t = ∂/∂z(ν_t/σε ∂ε/∂z) + (ε/k)(C1 P − C2 ε)
 *   ν_t = Cμ k²/ε,  P = ν_t [(∂u/∂z)² + (∂v/∂z)²]
 * Backward Euler with implicit diffusion (Thomas algorithm). Sources after
 * Patankar (1980): the positive sources P and C1 (ε/k) P are explicit, the sinks
 * ε = (εⁿ/kⁿ) kⁿ⁺¹ and C2 (εⁿ/kⁿ) εⁿ⁺¹ implicit, so k and ε stay positive for any Δt;
 * both are floored (K_MIN, EPSILON_MIN) and the length scale is capped at the depth.
 *
 * Boundary conditions (z up from the bed):
 * - Bed: k = u*²/√Cμ at the bed interface (log law, Dirichlet). For ε the log-law
 *   flux is imposed on the lower face of the first interior control volume, at
 *   the centre of the bottom layer z_b: F = (ν_t/σε)|∂ε/∂z| = u*⁴/(σε (z_b + z0)),
 *   which is exact for ε = u*³/(κ(z + z0)), ν_t = κu*(z + z0) and avoids the
 *   unresolved gradient of ε between the bed and the first interface.
 * - Surface: zero flux of k; for ε a flux with a surface roughness length z0s,
 *   i.e. the length scale l = κ(d + z0s) at depth d below the surface:
 *   F = (Cμ⁰)⁴ k²/(σε (d + z0s)) with Cμ⁰ = Cμ^¼, taken at the centre of the top layer.
 *   This keeps l finite at the surface, so ν_t falls toward the surface.
 */
import type { ColumnState } from './column-state.ts';
import { EPSILON_MIN, K_MIN } from './physical-constants.ts';
import { solveTridiagonalPair, TRIDIAGONAL_OK } from './tridiagonal.ts';

export interface KEpsilonParams {
  cMu: number;
  c1: number;
  c2: number;
  sigmaK: number;
  sigmaEpsilon: number;
  vonKarman: number;
  z0: number;
  surfaceRoughness: number;
  background: number;
}

// Module-local copies: imported bindings can be slower to read in hot loops.
const kFloor = K_MIN;
const epsilonFloor = EPSILON_MIN;
const solvePair = solveTridiagonalPair;

export const K_EPSILON_OK = 0;
export const K_EPSILON_FAILED = 1;

/** Sets k and ε to a weak state consistent with length scale κ min(z+z0, d+z0s). */
export function initKEpsilon(s: ColumnState, p: KEpsilonParams, kInitial: number): void {
  const n = s.grid.layers;
  const zf = s.grid.zFace;
  const depth = s.grid.depth;
  const c0cube = Math.pow(p.cMu, 0.75);
  for (let j = 0; j <= n; j++) {
    const z = zf[j]!;
    const l = p.vonKarman * Math.min(z + p.z0, depth - z + p.surfaceRoughness);
    s.k[j] = kInitial;
    s.eps[j] = (c0cube * kInitial * Math.sqrt(kInitial)) / l;
  }
  updateViscosityFromKEpsilon(s, p);
}

function updateViscosityFromKEpsilon(s: ColumnState, p: KEpsilonParams): void {
  const n = s.grid.layers;
  const k = s.k;
  const eps = s.eps;
  const nu = s.nu;
  const cMu = p.cMu;
  const bg = p.background;
  for (let j = 0; j <= n; j++) {
    const kj = k[j]!;
    nu[j] = (cMu * kj * kj) / eps[j]! + bg;
  }
}

/**
 * Advances k and ε by dt using the velocities already advanced by the momentum
 * step, then refreshes the eddy viscosity s.nu. The sink terms use kⁿ, so the
 * k and ε systems are independent and are solved together.
 * Uses the tridiagonal work arrays of s.
 */
export function stepKEpsilon(s: ColumnState, p: KEpsilonParams, dt: number): number {
  const g = s.grid;
  const n = g.layers;
  const hi = g.inverseThickness;
  const dzc = g.centreSpacing;
  const dzci = g.inverseCentreSpacing;
  const u = s.u;
  const v = s.v;
  const k = s.k;
  const eps = s.eps;
  const nu = s.nu;
  const ak = s.a;
  const bk = s.b;
  const ck = s.c;
  const ae = s.a2;
  const be = s.b2;
  const ce = s.c2;
  const rk = s.rhs1;
  const re = s.rhs2;
  const bg = p.background;
  const m = n - 1; // interior interfaces 1..n-1 are unknowns 0..m-1
  const kMin = kFloor;
  const eMin = epsilonFloor;

  const ustar = s.frictionVelocity;
  const kBed = Math.max((ustar * ustar) / Math.sqrt(p.cMu), kMin);
  const epsBed = Math.max((ustar * ustar * ustar) / (p.vonKarman * p.z0), eMin);
  k[0] = kBed;
  eps[0] = epsBed;

  // Diffusivities on layer centres: mean of the two interfaces / σ.
  const hk = (0.5 * dt) / p.sigmaK;
  const he = (0.5 * dt) / p.sigmaEpsilon;
  const c1 = p.c1;
  const c2 = p.c2;
  // k has a Dirichlet value at the bed (moved to the right-hand side); ε a flux condition.
  let dkLow = hk * (nu[0]! + nu[1]!) * hi[0]!;
  const kBedFlux = dkLow * kBed;
  let dLow = 0;
  let nuLow = nu[1]!;
  for (let j = 1; j < n; j++) {
    const nuHigh = nu[j + 1]!;
    const dHigh = j < m ? (nuLow + nuHigh) * hi[j]! : 0;
    const dkHigh = hk * dHigh;
    const deHigh = he * dHigh;
    const du = u[j]! - u[j - 1]!;
    const dv = v[j]! - v[j - 1]!;
    const inv = dzci[j]!;
    // Shear production with the current ν_t.
    const pj = (nuLow - bg) * (du * du + dv * dv) * inv * inv;
    const w = dzc[j]!;
    const r = j - 1;
    const kj = k[j]!;
    const ej = eps[j]!;
    const overK = dt / kj;
    ak[r] = -dkLow;
    ck[r] = -dkHigh;
    bk[r] = w * (1 + ej * overK) + dkLow + dkHigh;
    rk[r] = w * (kj + dt * pj);
    ae[r] = -dLow;
    ce[r] = -deHigh;
    be[r] = w * (1 + c2 * ej * overK) + dLow + deHigh;
    re[r] = w * ej * (1 + c1 * pj * overK);
    dkLow = dkHigh;
    dLow = deHigh;
    nuLow = nuHigh;
  }
  rk[0] = rk[0]! + kBedFlux;
  const se = 1 / p.sigmaEpsilon;
  const c04 = p.cMu;
  // Log-law flux from the bed, u*⁴/(σε (z_b + z0)) = (Cμ⁰)⁴ k_b²/(σε (z_b + z0)).
  re[0] = re[0]! + (dt * se * c04 * kBed * kBed) / (g.zCentre[0]! + p.z0);
  // Surface flux with roughness length z0s, from k just below the surface.
  const kBelowTop = k[n - 1]!;
  const dTop = g.depth - g.zCentre[n - 1]!;
  re[m - 1] = re[m - 1]! + (dt * se * c04 * kBelowTop * kBelowTop) / (dTop + p.surfaceRoughness);
  if (solvePair(m, ak, bk, ck, rk, s.cp, ae, be, ce, re, s.cp2) !== TRIDIAGONAL_OK) return K_EPSILON_FAILED;

  // Store with floors; cap the length scale l = (Cμ⁰)³ k^{3/2}/ε at the depth;
  // refresh ν_t = Cμ k²/ε + background.
  const cMu = p.cMu;
  const c0cube = Math.pow(cMu, 0.75);
  const lMaxInv = c0cube / g.depth;
  for (let j = 1; j < n; j++) {
    let kj = rk[j - 1]!;
    if (kj < kMin) kj = kMin;
    let ej = re[j - 1]!;
    const eLimit = kj * Math.sqrt(kj) * lMaxInv;
    if (!(ej > eLimit)) ej = eLimit;
    if (ej < eMin) ej = eMin;
    k[j] = kj;
    eps[j] = ej;
    nu[j] = (cMu * kj * kj) / ej + bg;
  }
  const kTop = k[n - 1]!;
  k[n] = kTop;
  let eTop = (c0cube * kTop * Math.sqrt(kTop)) / (p.vonKarman * p.surfaceRoughness);
  if (eTop < eMin) eTop = eMin;
  eps[n] = eTop;
  nu[0] = (cMu * kBed * kBed) / epsBed + bg;
  nu[n] = (cMu * kTop * kTop) / eTop + bg;
  return K_EPSILON_OK;
}
