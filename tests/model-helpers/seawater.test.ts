import { describe, expect, it } from 'vitest';
import {
  seawaterDensity,
  seawaterDynamicViscosity,
  seawaterKinematicViscosity,
} from '../../shared/model/seawater.ts';

describe('seawater density (UNESCO EOS-80, one atmosphere)', () => {
  it.each([
    // Published check values of EOS-80 (UNESCO Tech. Pap. Mar. Sci. 44, Fofonoff & Millard 1983).
    { s: 0, t: 5, rho: 999.96675 },
    { s: 35, t: 5, rho: 1027.67547 },
    { s: 35, t: 25, rho: 1023.34306 },
  ])('reproduces the published check value at S=$s, T=$t °C to 1e-4 kg/m³', ({ s, t, rho }) => {
    expect(Math.abs(seawaterDensity(s, t) - rho)).toBeLessThan(1e-4);
  });

  it.each([
    // REFERENCES §5 table [CALC] from the EOS-80 formula.
    { s: 0, t: 10, rho: 999.702 },
    { s: 35, t: 10, rho: 1026.952 },
    { s: 35, t: 12, rho: 1026.59 },
    { s: 0, t: 15, rho: 999.102 },
    { s: 35, t: 15, rho: 1025.973 },
    { s: 35, t: 20, rho: 1024.763 },
  ])('matches the tabulated density at S=$s, T=$t °C to 1e-3 kg/m³', ({ s, t, rho }) => {
    expect(Math.abs(seawaterDensity(s, t) - rho)).toBeLessThan(1e-3);
  });

  it('has pure water densest near 4 °C', () => {
    // Maximum density of fresh water at 3.98 °C (common practice / any handbook).
    expect(seawaterDensity(0, 4)).toBeGreaterThan(seawaterDensity(0, 2));
    expect(seawaterDensity(0, 4)).toBeGreaterThan(seawaterDensity(0, 6));
  });
});

describe('seawater viscosity (Sharqawy, Lienhard & Zubair 2010, eq. 22)', () => {
  it.each([
    // REFERENCES §5 table [CALC] from Sharqawy et al. (2010) eq. 22 (coefficients [MEM]), salinity
    // converted to reference salinity ×35.16504/35 as the paper's S is in kg/kg.
    { s: 0, t: 10, mu: 1.306e-3, nu: 1.3064e-6 },
    { s: 35, t: 10, mu: 1.3972e-3, nu: 1.3606e-6 },
    { s: 35, t: 12, mu: 1.3218e-3, nu: 1.2875e-6 },
    { s: 0, t: 15, mu: 1.1377e-3, nu: 1.1388e-6 },
    { s: 35, t: 15, mu: 1.2203e-3, nu: 1.1894e-6 },
    { s: 35, t: 20, mu: 1.077e-3, nu: 1.051e-6 },
  ])('matches the tabulated dynamic and kinematic viscosity at S=$s, T=$t °C to 1e-4 relative', ({ s, t, mu, nu }) => {
    expect(Math.abs(seawaterDynamicViscosity(s, t) / mu - 1)).toBeLessThan(1e-4);
    expect(Math.abs(seawaterKinematicViscosity(s, t) / nu - 1)).toBeLessThan(1e-4);
  });

  it('agrees with a Dorsey (1940) regression at S=30, T=10 °C within 0.2 %', () => {
    // Dorsey (1940) Table 87 regression value 1.383779e-3 Pa s [READ: example of a public seawater
    // library]; REFERENCES §5 says eq. 22 gives 0.07 % less [CALC].
    expect(Math.abs(seawaterDynamicViscosity(30, 10) / 1.383779e-3 - 1)).toBeLessThan(2e-3);
  });

  it('agrees with the kinematic viscosities of Soulsby (1997) Table 1 at S=35', () => {
    // Soulsby (1997) Table 1: 1.36e-6 at 10 °C and 1.19e-6 m²/s at 15 °C [MEM] — loose 1 %.
    expect(Math.abs(seawaterKinematicViscosity(35, 10) / 1.36e-6 - 1)).toBeLessThan(0.01);
    expect(Math.abs(seawaterKinematicViscosity(35, 15) / 1.19e-6 - 1)).toBeLessThan(0.01);
  });
});
