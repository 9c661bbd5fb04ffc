/**
 * Horizontal momentum of the column, one step:
 *   ∂u/∂t =  f v + G_x + ∂/∂z(ν ∂u/∂z)
 *   ∂v/∂t = −f u + G_y + ∂/∂z(ν ∂v/∂z)
 * Coriolis is applied first as an exact rotation of (u, v) by f Δt; then the
 * vertical diffusion is solved implicitly (backward Euler, Thomas algorithm)
 * with the bed stress τ_b/ρ = C_D |u_b| u_b linearised about the previous
 * speed (C_D|u_b|ⁿ u_bⁿ⁺¹) and the surface wind stress as a flux.
 *
 * Pressure gradient: either given (surface slope: G = −g ∂η/∂x), or chosen so
 * that the depth mean after the step equals the target current. The implicit
 * system is linear in G, so it is solved for G = 0 and for G = 1 with the same
 * factorisation and the two solutions are combined:
 *   u = u₀ + G u₁,  G = (U_target H − Σ h u₀) / Σ h u₁.
 * The bed stress in the system is the column's own, so the chosen gradient
 * balances the column's own friction.
 */
import type { ColumnState } from './column-state.ts';
import { solveTridiagonal3, TRIDIAGONAL_OK } from './tridiagonal.ts';

const solve3 = solveTridiagonal3;

export const MOMENTUM_OK = 0;
export const MOMENTUM_FAILED = 1;

export interface MomentumInput {
  dt: number;
  /** cos and sin of f Δt. */
  rotCos: number;
  rotSin: number;
  /** True: (gx, gy) are the target depth-mean current; false: the pressure-gradient acceleration. */
  targetMode: boolean;
  gx: number;
  gy: number;
  /** Kinematic surface stress τ_s/ρ, m²/s². */
  windX: number;
  windY: number;
}

export function stepMomentum(s: ColumnState, m: MomentumInput): number {
  const g = s.grid;
  const n = g.layers;
  const h = g.thickness;
  const dzci = g.inverseCentreSpacing;
  const u = s.u;
  const v = s.v;
  const nu = s.nu;
  const a = s.a;
  const b = s.b;
  const c = s.c;
  const ru = s.rhs1;
  const rv = s.rhs2;
  const r1 = s.rhs3;
  const dt = m.dt;

  // Coriolis rotation is applied to the bed velocity here and to every layer
  // while assembling the right-hand sides.
  const cs = m.rotCos;
  const sn = m.rotSin;
  const ub0 = u[0]!;
  const vb0 = v[0]!;
  const ub = ub0 * cs + vb0 * sn;
  const vb = vb0 * cs - ub0 * sn;
  const drag = s.dragCoefficient * Math.sqrt(ub * ub + vb * vb);

  // Assemble: a_i u_{i-1} + b_i u_i + c_i u_{i+1} = rhs_i (rows multiplied by layer thickness).
  const gxIn = m.targetMode ? 0 : m.gx;
  const gyIn = m.targetMode ? 0 : m.gy;
  let lower = 0;
  for (let i = 0; i < n; i++) {
    const hi = h[i]!;
    const upper = i < n - 1 ? dt * nu[i + 1]! * dzci[i + 1]! : 0;
    a[i] = -lower;
    c[i] = -upper;
    b[i] = hi + lower + upper;
    const ui = u[i]!;
    const vi = v[i]!;
    ru[i] = hi * (ui * cs + vi * sn + dt * gxIn);
    rv[i] = hi * (vi * cs - ui * sn + dt * gyIn);
    r1[i] = hi * dt;
    lower = upper;
  }
  b[0] = b[0]! + dt * drag;
  ru[n - 1] = ru[n - 1]! + dt * m.windX;
  rv[n - 1] = rv[n - 1]! + dt * m.windY;

  if (solve3(n, a, b, c, ru, rv, r1, s.cp) !== TRIDIAGONAL_OK) return MOMENTUM_FAILED;

  if (m.targetMode) {
    let su = 0;
    let sv = 0;
    let s1 = 0;
    for (let i = 0; i < n; i++) {
      const hi = h[i]!;
      su += hi * ru[i]!;
      sv += hi * rv[i]!;
      s1 += hi * r1[i]!;
    }
    const depth = g.depth;
    const gradX = (m.gx * depth - su) / s1;
    const gradY = (m.gy * depth - sv) / s1;
    for (let i = 0; i < n; i++) {
      const w = r1[i]!;
      u[i] = ru[i]! + gradX * w;
      v[i] = rv[i]! + gradY * w;
    }
    s.pressureGradientX = gradX;
    s.pressureGradientY = gradY;
    s.depthMeanU = (su + gradX * s1) / depth;
    s.depthMeanV = (sv + gradY * s1) / depth;
  } else {
    let su = 0;
    let sv = 0;
    for (let i = 0; i < n; i++) {
      const ui = ru[i]!;
      const vi = rv[i]!;
      u[i] = ui;
      v[i] = vi;
      su += h[i]! * ui;
      sv += h[i]! * vi;
    }
    s.depthMeanU = su / g.depth;
    s.depthMeanV = sv / g.depth;
    s.pressureGradientX = m.gx;
    s.pressureGradientY = m.gy;
  }

  s.bedStressX = drag * u[0]!;
  s.bedStressY = drag * v[0]!;
  const ubn = u[0]!;
  const vbn = v[0]!;
  s.frictionVelocity = Math.sqrt(s.dragCoefficient * (ubn * ubn + vbn * vbn));
  return MOMENTUM_OK;
}
