/**
 * Cholesky factorisation A = L Lᵀ of a small dense symmetric positive-definite
 * matrix, in place on a row-major Float64Array (n × n). Only the lower
 * triangle of A is read; L overwrites it (the upper triangle is left alone).
 * Golub & Van Loan, Matrix Computations, algorithm 4.2.1 (the jki form).
 * Nothing is allocated; statuses instead of exceptions.
 */

export const CHOLESKY_OK = 0;
/** A pivot was not positive, or fell below the relative tolerance: A is (numerically) singular. */
export const CHOLESKY_NOT_POSITIVE_DEFINITE = 1;

/**
 * Factorises in place. A pivot below `relativeTolerance` × the original
 * diagonal entry counts as a loss of rank (default 1e-12).
 */
export function choleskyFactor(n: number, a: Float64Array, relativeTolerance = 1e-12): number {
  for (let j = 0; j < n; j++) {
    const original = a[j * n + j]!;
    let d = original;
    for (let k = 0; k < j; k++) {
      const l = a[j * n + k]!;
      d -= l * l;
    }
    if (!(d > relativeTolerance * Math.abs(original)) || !(d > 0)) return CHOLESKY_NOT_POSITIVE_DEFINITE;
    const ljj = Math.sqrt(d);
    a[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j]!;
      for (let k = 0; k < j; k++) s -= a[i * n + k]! * a[j * n + k]!;
      a[i * n + j] = s / ljj;
    }
  }
  return CHOLESKY_OK;
}

/** Solves L Lᵀ x = b in place on b, with L from choleskyFactor. */
export function choleskySolve(n: number, l: Float64Array, b: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = b[i]!;
    for (let k = 0; k < i; k++) s -= l[i * n + k]! * b[k]!;
    b[i] = s / l[i * n + i]!;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = b[i]!;
    for (let k = i + 1; k < n; k++) s -= l[k * n + i]! * b[k]!;
    b[i] = s / l[i * n + i]!;
  }
}

/** Writes A⁻¹ (full, symmetric) into out, using column as scratch of length n. */
export function choleskyInverse(n: number, l: Float64Array, out: Float64Array, column: Float64Array): void {
  for (let j = 0; j < n; j++) {
    column.fill(0);
    column[j] = 1;
    choleskySolve(n, l, column);
    for (let i = 0; i < n; i++) out[i * n + j] = column[i]!;
  }
}
