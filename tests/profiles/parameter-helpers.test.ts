import { describe, expect, it } from 'vitest';
import { growthFromTemperature, settlingFromCell } from '../../shared/schemas/organism-helpers.ts';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('settling velocity helper (Stokes)', () => {
  it.each([
    // REFERENCES §5 "Stokes speeds for algal cells", seawater at 15 °C, S = 35 [CALC] from
    // ws = (ρp − ρw) g d²/(18 μ) (Stokes 1851); the table gives 2–3 significant figures.
    { d: 20, rho: 1100, mPerDay: 1.14 },
    { d: 10, rho: 1100, mPerDay: 0.29 },
    { d: 10, rho: 1050, mPerDay: 0.093 },
    { d: 50, rho: 1050, mPerDay: 2.32 },
    { d: 50, rho: 1100, mPerDay: 7.14 },
    { d: 100, rho: 1100, mPerDay: 28.6 },
    { d: 40, rho: 1200, mPerDay: 10.7 },
  ])('gives $mPerDay m/day for $d µm at $rho kg/m³ (15 °C, S = 35)', ({ d, rho, mPerDay }) => {
    const result = settlingFromCell({ diameterUm: d, cellDensity: rho, temperatureC: 15, salinity: 35 });
    if (!result.ok) throw new Error(JSON.stringify(result.issues));
    // Within the rounding of the table's last figure.
    expect(rel(result.value.settlingVelocityMPerDay, mPerDay)).toBeLessThan(0.02);
  });

  it('halves the velocity when the form resistance is 2', () => {
    // ws = g d² (ρp − ρw)/(18 μ φr): Reynolds (2006), REFERENCES §5 [formula from memory].
    const sphere = settlingFromCell({ diameterUm: 20, cellDensity: 1100, temperatureC: 15, salinity: 35 });
    const chain = settlingFromCell({ diameterUm: 20, cellDensity: 1100, temperatureC: 15, salinity: 35, formResistance: 2 });
    if (!sphere.ok || !chain.ok) throw new Error('helper refused valid input');
    expect(chain.value.settlingVelocityMPerDay / sphere.value.settlingVelocityMPerDay).toBeCloseTo(0.5, 12);
  });

  it('sinks faster in warmer water, where seawater is less viscous', () => {
    // REFERENCES §5 viscosity table [CALC]: μ = 1.3972 mPa s at 10 °C and 1.2203 at 15 °C (S = 35).
    const cold = settlingFromCell({ diameterUm: 20, cellDensity: 1100, temperatureC: 10, salinity: 35 });
    const warm = settlingFromCell({ diameterUm: 20, cellDensity: 1100, temperatureC: 15, salinity: 35 });
    if (!cold.ok || !warm.ok) throw new Error('helper refused valid input');
    // (ρp − ρw) changes too: (1100 − 1026.952)/(1100 − 1025.973) from the density table.
    const expected = (1.3972 / 1.2203) * ((1100 - 1025.973) / (1100 - 1026.952));
    expect(rel(warm.value.settlingVelocityMPerDay / cold.value.settlingVelocityMPerDay, expected)).toBeLessThan(1e-3);
  });

  it('flags a particle Reynolds number above 0.5, where Stokes no longer holds', () => {
    // Validity Re = ws d/ν ≲ 0.5: REFERENCES §5.
    const result = settlingFromCell({ diameterUm: 500, cellDensity: 2650, temperatureC: 10, salinity: 35 });
    if (!result.ok) throw new Error('helper refused valid input');
    expect(result.value.reynolds).toBeGreaterThan(0.5);
    expect(result.value.stokesValid).toBe(false);
  });

  it('names the field and its unit when an input is missing', () => {
    const result = settlingFromCell({ diameterUm: Number.NaN, cellDensity: 1100, temperatureC: 15, salinity: 35 });
    expect(result).toEqual({ ok: false, issues: [{ path: 'diameterUm', message: 'cell diameter must be a number of µm' }] });
  });
});

describe('maximum growth rate helper (Eppley 1972)', () => {
  it.each([
    // [CALC] from log10 μ = 0.0275 T − 0.070 doublings/d (Eppley 1972 as quoted by Kremer & Nixon 1978,
    // REFERENCES §6 [READ]); specific rate = ln 2 × doublings.
    { t: 10, perDay: 1.1113, doublings: 1.6032 },
    { t: 15, perDay: 1.5252, doublings: 2.2004 },
    { t: 20, perDay: 2.0933, doublings: 3.02 },
  ])('gives $perDay per day at $t °C', ({ t, perDay, doublings }) => {
    const result = growthFromTemperature({ temperatureC: t });
    if (!result.ok) throw new Error('helper refused valid input');
    expect(Math.abs(result.value.maxRatePerDay - perDay)).toBeLessThan(1e-4);
    expect(Math.abs(result.value.doublingsPerDay - doublings)).toBeLessThan(1e-4);
  });

  it.each([
    // REFERENCES §6 [CALC] 1.118, 1.539, 2.118 per day, computed with the rounded form 0.851 × 1.066^T;
    // the log10 form runs up to 1.2 % lower at 20 °C, so the check is within 1.5 %.
    { t: 10, perDay: 1.118 },
    { t: 15, perDay: 1.539 },
    { t: 20, perDay: 2.118 },
  ])('agrees within 1.5 % with the reference value $perDay per day at $t °C', ({ t, perDay }) => {
    const result = growthFromTemperature({ temperatureC: t });
    if (!result.ok) throw new Error('helper refused valid input');
    expect(rel(result.value.maxRatePerDay, perDay)).toBeLessThan(0.015);
  });

  it('refuses a temperature outside seawater with a message naming it in °C', () => {
    expect(growthFromTemperature({ temperatureC: 60 })).toEqual({ ok: false, issues: [{ path: 'temperatureC', message: 'temperature must be at most 40 °C' }] });
  });
});
