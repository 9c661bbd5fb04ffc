/**
 * Thomas algorithm for tridiagonal systems, in place on Float64Array.
 * Row i reads a[i] x[i-1] + b[i] x[i] + c[i] x[i+1] = d[i]; a[0] and c[n-1] are ignored.
 * Nothing is allocated; the caller owns every work array.
 */

export const TRIDIAGONAL_OK = 0;
export const TRIDIAGONAL_SINGULAR = 1;

/**
 * Solves the system, overwriting d with the solution. cp is scratch of length ≥ n.
 * Returns TRIDIAGONAL_OK or TRIDIAGONAL_SINGULAR (a zero pivot).
 */
export function solveTridiagonal(
  n: number,
  a: Float64Array,
  b: Float64Array,
  c: Float64Array,
  d: Float64Array,
  cp: Float64Array,
): number {
  let m = b[0]!;
  if (m === 0) return TRIDIAGONAL_SINGULAR;
  let inv = 1 / m;
  cp[0] = c[0]! * inv;
  let prev = d[0]! * inv;
  d[0] = prev;
  for (let i = 1; i < n; i++) {
    const ai = a[i]!;
    m = b[i]! - ai * cp[i - 1]!;
    if (m === 0) return TRIDIAGONAL_SINGULAR;
    inv = 1 / m;
    cp[i] = c[i]! * inv;
    prev = (d[i]! - ai * prev) * inv;
    d[i] = prev;
  }
  let next = d[n - 1]!;
  for (let i = n - 2; i >= 0; i--) {
    next = d[i]! - cp[i]! * next;
    d[i] = next;
  }
  return TRIDIAGONAL_OK;
}

/**
 * Solves the same tridiagonal matrix for three right-hand sides d1, d2, d3 at
 * once (in place), one forward and one backward sweep. cp is scratch.
 */
export function solveTridiagonal3(
  n: number,
  a: Float64Array,
  b: Float64Array,
  c: Float64Array,
  d1: Float64Array,
  d2: Float64Array,
  d3: Float64Array,
  cp: Float64Array,
): number {
  let m = b[0]!;
  if (m === 0) return TRIDIAGONAL_SINGULAR;
  let inv = 1 / m;
  let cPrev = c[0]! * inv;
  cp[0] = cPrev;
  let p1 = d1[0]! * inv;
  let p2 = d2[0]! * inv;
  let p3 = d3[0]! * inv;
  d1[0] = p1;
  d2[0] = p2;
  d3[0] = p3;
  for (let i = 1; i < n; i++) {
    const ai = a[i]!;
    m = b[i]! - ai * cPrev;
    if (m === 0) return TRIDIAGONAL_SINGULAR;
    inv = 1 / m;
    cPrev = c[i]! * inv;
    cp[i] = cPrev;
    p1 = (d1[i]! - ai * p1) * inv;
    p2 = (d2[i]! - ai * p2) * inv;
    p3 = (d3[i]! - ai * p3) * inv;
    d1[i] = p1;
    d2[i] = p2;
    d3[i] = p3;
  }
  for (let i = n - 2; i >= 0; i--) {
    const ci = cp[i]!;
    p1 = d1[i]! - ci * p1;
    p2 = d2[i]! - ci * p2;
    p3 = d3[i]! - ci * p3;
    d1[i] = p1;
    d2[i] = p2;
    d3[i] = p3;
  }
  return TRIDIAGONAL_OK;
}

/**
 * Solves two independent tridiagonal systems of the same size in one loop
 * (in place in d1 and d2). The two elimination chains interleave, which
 * roughly halves the wall time of two separate solves on a pipelined CPU.
 */
export function solveTridiagonalPair(
  n: number,
  a1: Float64Array,
  b1: Float64Array,
  c1: Float64Array,
  d1: Float64Array,
  cp1: Float64Array,
  a2: Float64Array,
  b2: Float64Array,
  c2: Float64Array,
  d2: Float64Array,
  cp2: Float64Array,
): number {
  let m1 = b1[0]!;
  let m2 = b2[0]!;
  if (m1 === 0 || m2 === 0) return TRIDIAGONAL_SINGULAR;
  let i1 = 1 / m1;
  let i2 = 1 / m2;
  let q1 = c1[0]! * i1;
  let q2 = c2[0]! * i2;
  cp1[0] = q1;
  cp2[0] = q2;
  let p1 = d1[0]! * i1;
  let p2 = d2[0]! * i2;
  d1[0] = p1;
  d2[0] = p2;
  for (let i = 1; i < n; i++) {
    const x1 = a1[i]!;
    const x2 = a2[i]!;
    m1 = b1[i]! - x1 * q1;
    m2 = b2[i]! - x2 * q2;
    if (m1 === 0 || m2 === 0) return TRIDIAGONAL_SINGULAR;
    i1 = 1 / m1;
    i2 = 1 / m2;
    q1 = c1[i]! * i1;
    q2 = c2[i]! * i2;
    cp1[i] = q1;
    cp2[i] = q2;
    p1 = (d1[i]! - x1 * p1) * i1;
    p2 = (d2[i]! - x2 * p2) * i2;
    d1[i] = p1;
    d2[i] = p2;
  }
  for (let i = n - 2; i >= 0; i--) {
    p1 = d1[i]! - cp1[i]! * p1;
    p2 = d2[i]! - cp2[i]! * p2;
    d1[i] = p1;
    d2[i] = p2;
  }
  return TRIDIAGONAL_OK;
}
