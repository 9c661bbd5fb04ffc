import { describe, expect, it } from 'vitest';
import { eppleyMaxDoublingsPerDay, eppleyMaxGrowthPerDay } from '../../shared/model/growth.ts';

describe('Eppley (1972) maximum growth rate', () => {
  it.each([
    // [CALC] here from log10 μ = 0.0275 T − 0.070 doublings/d (Eppley 1972 via Kremer & Nixon 1978,
    // REFERENCES §6 [READ]); specific rate = ln 2 × doublings. Values rounded to 4 decimals.
    { t: 0, doublings: 0.8511, perDay: 0.59 },
    { t: 10, doublings: 1.6032, perDay: 1.1113 },
    { t: 15, doublings: 2.2004, perDay: 1.5252 },
    { t: 20, doublings: 3.02, perDay: 2.0933 },
  ])('gives $doublings doublings/d and $perDay d⁻¹ at $t °C', ({ t, doublings, perDay }) => {
    expect(Math.abs(eppleyMaxDoublingsPerDay(t) - doublings)).toBeLessThan(1e-4);
    expect(Math.abs(eppleyMaxGrowthPerDay(t) - perDay)).toBeLessThan(1e-4);
  });

  it.each([
    // REFERENCES §6 table [CALC]: 0.851, 1.612, 2.220, 3.055 doublings/d. Those were computed with the
    // rounded exponential form 0.851 × 1.066^T, not with 10^0.0275 = 1.0654, so they run up to 1.2 %
    // above the log10 form at 20 °C; checked here within 1.5 %.
    { t: 0, doublings: 0.851 },
    { t: 10, doublings: 1.612 },
    { t: 15, doublings: 2.22 },
    { t: 20, doublings: 3.055 },
  ])('agrees within 1.5 % with the exponential-form value $doublings doublings/d at $t °C', ({ t, doublings }) => {
    expect(Math.abs(eppleyMaxDoublingsPerDay(t) / doublings - 1)).toBeLessThan(0.015);
  });

  it('has a Q10 of 1.88', () => {
    // REFERENCES §6 gives Q10 = 1.89; [CALC] 10^0.275 = 1.8836 for the log10 form.
    expect(Math.abs(eppleyMaxGrowthPerDay(20) / eppleyMaxGrowthPerDay(10) - 1.8836)).toBeLessThan(1e-3);
  });

  it('doubles a population once per 1/doublings days at the specific rate', () => {
    // Definition: e^(μ/d) = 2 with μ the specific rate and d doublings per day.
    const t = 12;
    expect(Math.exp(eppleyMaxGrowthPerDay(t) / eppleyMaxDoublingsPerDay(t))).toBeCloseTo(2, 12);
  });
});
