import { describe, expect, it } from 'vitest';
import { censoredLog10, skill, sumSquaredLogError } from '../../shared/lab/skill.ts';

// Hand-computed values [CALC]: bias = mean(log10 F − log10 O), RMSE = √mean(d²), Pearson's r of the
// log values (definitions as in Wilks, Statistical Methods in the Atmospheric Sciences, 3rd ed., §3.5
// and §8.3 [from memory]). Values under the detection limit count as half the limit (common practice).
const FOUR = [
  { forecast: 1000, observed: 100, detectionLimit: 40 }, // logs 3, 2: d = +1
  { forecast: 100, observed: 1000, detectionLimit: 40 }, // logs 2, 3: d = −1
  { forecast: 10_000, observed: 10_000, detectionLimit: 40 }, // logs 4, 4: d = 0
  { forecast: 10, observed: 0, detectionLimit: 40 }, // both under 40: log10 20 each, d = 0
];

describe('skill on log10 cells per litre', () => {
  it('gives zero bias when over- and under-forecasts cancel', () => {
    expect(skill(FOUR).bias).toBeCloseTo(0, 12);
  });

  it('gives the RMSE of the log differences, √(2/4) for differences of +1, −1, 0, 0', () => {
    expect(skill(FOUR).rmse).toBeCloseTo(Math.SQRT1_2, 12);
  });

  it('gives Pearson\'s r of the log values, 3.164875 / 4.164874 = 0.759897 for the four pairs', () => {
    // [CALC] means 2.5752575; Σ dF dO = 3.164875; Σ dF² = Σ dO² = 4.164874.
    expect(skill(FOUR).correlation).toBeCloseTo(0.7598967, 6);
  });

  it('reads a forecast twice the count everywhere as a bias and RMSE of log10 2 with perfect correlation', () => {
    const pairs = [100, 1000, 5000, 20_000].map((o) => ({ forecast: 2 * o, observed: o, detectionLimit: 40 }));
    const s = skill(pairs);
    expect(s.bias).toBeCloseTo(Math.log10(2), 12);
    expect(s.rmse).toBeCloseTo(Math.log10(2), 12);
    expect(s.correlation).toBeCloseTo(1, 12);
  });

  it('replaces a value under the detection limit by half the limit', () => {
    expect(censoredLog10(0, 40)).toBeCloseTo(Math.log10(20), 12);
    expect(censoredLog10(39, 40)).toBeCloseTo(Math.log10(20), 12);
    expect(censoredLog10(40, 40)).toBeCloseTo(Math.log10(40), 12);
  });

  it('gives no correlation for a single pair, and no metrics without pairs', () => {
    expect(skill([{ forecast: 10, observed: 100, detectionLimit: 1 }])).toEqual({ n: 1, bias: -1, rmse: 1, correlation: null });
    expect(skill([])).toEqual({ n: 0, bias: null, rmse: null, correlation: null });
  });

  it('gives the calibration objective as n times the squared RMSE', () => {
    expect(sumSquaredLogError(FOUR)).toBeCloseTo(4 * skill(FOUR).rmse! ** 2, 12);
  });
});
