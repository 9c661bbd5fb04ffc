import { describe, expect, it } from 'vitest';
import { fitBounded } from '../../shared/lab/fit.ts';

// Golden-section search (Press et al., Numerical Recipes, 3rd ed., §10.2 [from memory]) brackets a
// unimodal minimum to the tolerance; checked on functions whose minima are known in closed form.
describe('bounded minimisation', () => {
  it('finds the minimum of (x − 3.7)² in [0, 50] to within the tolerance', async () => {
    const found = await fitBounded(async ([x]) => (x! - 3.7) ** 2, [{ lower: 0, upper: 50 }], [1], { tolerance: 0.01 });
    expect(Math.abs(found.x[0]! - 3.7)).toBeLessThan(0.01);
    expect(found.atBound).toEqual([false]);
  });

  it('stops at the bound when the minimum lies outside, and says so', async () => {
    const found = await fitBounded(async ([x]) => (x! + 2) ** 2, [{ lower: 0, upper: 10 }], [5], { tolerance: 0.01 });
    expect(found.x[0]).toBeLessThan(0.01);
    expect(found.atBound).toEqual([true]);
  });

  it('finds the minimum of a separable two-parameter bowl by coordinate search', async () => {
    const found = await fitBounded(async ([x, y]) => (x! - 6) ** 2 + 4 * (y! - 0.3) ** 2, [{ lower: 0, upper: 50 }, { lower: 0, upper: 2 }], [1, 1], { tolerance: [0.01, 0.001] });
    expect(Math.abs(found.x[0]! - 6)).toBeLessThan(0.01);
    expect(Math.abs(found.x[1]! - 0.3)).toBeLessThan(0.001);
  });

  it('finds the lower of two dips, which a search from the start alone would miss', async () => {
    // Dips at 2 (depth 1) and 40 (depth 2): the coarse scan sees the deeper one.
    const f = async ([x]: readonly number[]) => -Math.exp(-((x! - 2) ** 2)) - 2 * Math.exp(-(((x! - 40) / 3) ** 2));
    const found = await fitBounded(f, [{ lower: 0, upper: 50 }], [2], { tolerance: 0.01 });
    expect(Math.abs(found.x[0]! - 40)).toBeLessThan(0.05);
  });
});
