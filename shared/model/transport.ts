/**
 * Vertical transport of one organism, one step, fully implicit:
 *   h_i (C_iⁿ⁺¹ − C_iⁿ)/Δt = J_i − J_{i+1}
 * with the upward flux through interface j (velocity w_j, positive up)
 *   J_j = (D_j A(|Pe_j|) + w_j⁺) C_{j−1} − (D_j A(|Pe_j|) + w_j⁻) C_j,
 *   D_j = K_j/Δz_j, Pe_j = w_j Δz_j/K_j, A(|Pe|) = max(0, (1 − 0.1|Pe|)⁵),
 * the power-law scheme of Patankar (1980, Numerical Heat Transfer and Fluid
 * Flow, §5.2), a close fit to the exponential (exact steady) scheme: central
 * differencing where mixing dominates, upwind where settling dominates.
 * The matrix is an M-matrix (non-positive off-diagonals, column sums h_i/Δt),
 * so the Thomas algorithm gives non-negative concentrations for any Δt, and
 * the column total Σ h_i C_i changes only through the bed face.
 * Bed face: closed (zero flux), or, with bed exchange, deposition w_s C_0
 * into a bed pool and Partheniades (1965) erosion E = M(τ_b/τ_ce − 1) for
 * τ_b > τ_ce, limited to what the pool holds. Surface face: closed.
 */
import type { ColumnState } from './column-state.ts';
import type { OrganismRuntime } from './organisms.ts';
import { solveTridiagonal, TRIDIAGONAL_OK } from './tridiagonal.ts';

const solve = solveTridiagonal;

export const TRANSPORT_OK = 0;
export const TRANSPORT_FAILED = 1;

/**
 * Sets the interface velocities (settling plus swimming) and diffusivities.
 * `up` is the swimming direction for this step.
 */
export function setFaceTransport(s: ColumnState, o: OrganismRuntime, up: boolean): void {
  const n = s.grid.layers;
  const zf = s.grid.zFace;
  const depth = s.grid.depth;
  const w = o.wFace;
  const kf = o.kFace;
  const nu = s.nu;
  const ws = o.settling;
  const sci = o.schmidtInverse;
  const bg = o.backgroundDiffusivity;
  const speed = o.swimSpeed;
  if (speed === 0) {
    for (let j = 1; j < n; j++) {
      w[j] = -ws;
      kf[j] = nu[j]! * sci + bg;
    }
  } else {
    const minD = o.minDepth;
    const maxD = o.maxDepth;
    for (let j = 1; j < n; j++) {
      const d = depth - zf[j]!;
      let swim = 0;
      if (up) {
        if (d > minD) swim = speed;
      } else if (d < maxD) swim = -speed;
      w[j] = swim - ws;
      kf[j] = nu[j]! * sci + bg;
    }
  }
  w[0] = o.bedExchange && ws > 0 ? -ws : 0;
  w[n] = 0;
  kf[0] = 0;
  kf[n] = 0;
}

/**
 * Advances the concentrations by dt. bedStressPa is the bed stress magnitude
 * (for erosion). Returns TRANSPORT_OK or TRANSPORT_FAILED.
 */
export function stepTransport(s: ColumnState, o: OrganismRuntime, dt: number, bedStressPa: number): number {
  const g = s.grid;
  const n = g.layers;
  const h = g.thickness;
  const dzci = g.inverseCentreSpacing;
  const w = o.wFace;
  const kf = o.kFace;
  const conc = o.conc;
  const a = o.a;
  const b = o.b;
  const c = o.c;

  let before = 0;
  // Upward flux through face j: J_j = L_j C_{j−1} − R_j C_j (coefficients × Δt).
  // Face 0 (bed) only carries deposition; face n (surface) is closed.
  let lowL = 0;
  let lowR = w[0]! < 0 ? -w[0]! * dt : 0;
  for (let i = 0; i < n; i++) {
    let highL = 0;
    let highR = 0;
    if (i < n - 1) {
      const wf = w[i + 1]!;
      const kd = kf[i + 1]! * dzci[i + 1]!;
      let diff = 0;
      if (kd > 0) {
        // Patankar's power-law weighting A(|Pe|) = max(0, (1 − 0.1|Pe|)⁵).
        const pe = Math.abs(wf) / kd;
        const t = 1 - 0.1 * pe;
        if (t > 0) {
          const t2 = t * t;
          diff = kd * t2 * t2 * t;
        }
      }
      highL = (diff + (wf > 0 ? wf : 0)) * dt;
      highR = (diff + (wf < 0 ? -wf : 0)) * dt;
    }
    a[i] = -lowL;
    c[i] = -highR;
    b[i] = h[i]! + lowR + highL;
    const mass = h[i]! * conc[i]!;
    conc[i] = mass;
    before += mass;
    lowL = highL;
    lowR = highR;
  }

  let erosion = 0;
  if (o.bedExchange && bedStressPa > o.criticalStress && o.bed > 0) {
    erosion = Math.min(o.erosionRate * (bedStressPa / o.criticalStress - 1) * dt, o.bed);
    conc[0] = conc[0]! + erosion;
  }

  if (solve(n, a, b, c, conc, o.cp) !== TRIDIAGONAL_OK) return TRANSPORT_FAILED;

  let deposited = 0;
  if (o.bedExchange) {
    const wb = w[0]!;
    deposited = wb < 0 ? -wb * dt * conc[0]! : 0;
    o.bed = o.bed - erosion + deposited;
    if (o.bed < 0) o.bed = 0;
  }

  // Remove the round-off of the elimination from the column budget: the total
  // must equal the old total plus erosion minus deposition. The difference (of
  // order 1e-15 of the total) is put into the layer holding the most cells, so
  // no concentration can become negative.
  let after = 0;
  let big = 0;
  let bigMass = -1;
  for (let i = 0; i < n; i++) {
    const mass = h[i]! * conc[i]!;
    after += mass;
    if (mass > bigMass) {
      bigMass = mass;
      big = i;
    }
  }
  const expected = before + erosion - deposited;
  if (after !== expected && bigMass > 0) {
    const fixed = conc[big]! + (expected - after) / h[big]!;
    conc[big] = fixed > 0 ? fixed : 0;
  }
  return TRANSPORT_OK;
}
