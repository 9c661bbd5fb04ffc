/**
 * Thomas algorithm (Thomas 1949; e.g. Press et al., Numerical Recipes §2.4):
 * the solution must satisfy A x = d for a diagonally dominant system, and the
 * paired and three-right-hand-side variants must agree with the single solve.
 */
import { describe, expect, it } from 'vitest';
import { solveTridiagonal, solveTridiagonal3, solveTridiagonalPair, TRIDIAGONAL_OK } from '../../shared/model/tridiagonal.ts';
import { seededRandom } from './support.ts';

const N = 50;

function system(seed: number): { a: Float64Array; b: Float64Array; c: Float64Array; d: Float64Array } {
  const rnd = seededRandom(seed);
  const a = new Float64Array(N).map(() => -rnd());
  const c = new Float64Array(N).map(() => -rnd());
  const b = new Float64Array(N).map((_, i) => 0.1 + Math.abs(a[i]!) + Math.abs(c[i]!) + rnd());
  const d = new Float64Array(N).map(() => rnd() * 10 - 5);
  return { a, b, c, d };
}

function residual(s: ReturnType<typeof system>, x: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < N; i++) {
    const lhs = (i > 0 ? s.a[i]! * x[i - 1]! : 0) + s.b[i]! * x[i]! + (i < N - 1 ? s.c[i]! * x[i + 1]! : 0);
    worst = Math.max(worst, Math.abs(lhs - s.d[i]!));
  }
  return worst;
}

describe('tridiagonal solvers', () => {
  it('solves a diagonally dominant system to round-off', () => {
    const s = system(1);
    const x = s.d.slice();
    expect(solveTridiagonal(N, s.a, s.b, s.c, x, new Float64Array(N))).toBe(TRIDIAGONAL_OK);
    expect(residual(s, x)).toBeLessThan(1e-12);
  });

  it('gives the same answers for two systems solved together', () => {
    const s1 = system(2);
    const s2 = system(3);
    const x1 = s1.d.slice();
    const x2 = s2.d.slice();
    solveTridiagonalPair(N, s1.a, s1.b, s1.c, x1, new Float64Array(N), s2.a, s2.b, s2.c, x2, new Float64Array(N));
    expect(residual(s1, x1)).toBeLessThan(1e-12);
    expect(residual(s2, x2)).toBeLessThan(1e-12);
  });

  it('gives the same answers for three right-hand sides solved together', () => {
    const s = system(4);
    const d2 = system(5).d;
    const d3 = system(6).d;
    const x1 = s.d.slice();
    const x2 = d2.slice();
    const x3 = d3.slice();
    solveTridiagonal3(N, s.a, s.b, s.c, x1, x2, x3, new Float64Array(N));
    expect(residual(s, x1)).toBeLessThan(1e-12);
    expect(residual({ ...s, d: d2 }, x2)).toBeLessThan(1e-12);
    expect(residual({ ...s, d: d3 }, x3)).toBeLessThan(1e-12);
  });

  it('reports a zero pivot instead of dividing by zero', () => {
    const s = system(7);
    s.b[0] = 0;
    expect(solveTridiagonal(N, s.a, s.b, s.c, s.d.slice(), new Float64Array(N))).not.toBe(TRIDIAGONAL_OK);
  });
});
