import { describe, expect, it } from 'vitest';
import { seawaterDensity, seawaterDynamicViscosity, seawaterKinematicViscosity } from '../../shared/model/seawater.ts';
import {
  cellSettlingVelocity,
  dimensionlessGrainSize,
  fergusonChurchSettlingVelocity,
  soulsbySettlingVelocity,
  stokesSettlingVelocity,
} from '../../shared/model/settling.ts';

const QUARTZ = 2650;

function quartzInSeawater(dMm: number, tempC: number) {
  return {
    diameterM: dMm * 1e-3,
    particleDensity: QUARTZ,
    waterDensity: seawaterDensity(35, tempC),
    kinematicViscosity: seawaterKinematicViscosity(35, tempC),
    dynamicViscosity: seawaterDynamicViscosity(35, tempC),
  };
}

// REFERENCES §5 quartz table [CALC]: ρs = 2650 kg/m³ in seawater S = 35 (EOS-80, Sharqawy 2010);
// velocities in mm/s. Tabulated to 4 significant figures, so relative tolerance 1e-3.
const QUARTZ_TABLE = [
  { d: 0.03, t: 10, dStar: 0.6092, stokes: 0.5698, soulsby: 0.5189, fcNatural: 0.557, fcSphere: 0.5616 },
  { d: 0.1, t: 10, dStar: 2.0308, stokes: 6.331, soulsby: 5.656, fcNatural: 5.557, fcSphere: 5.818 },
  { d: 0.2, t: 10, dStar: 4.0616, stokes: 25.32, soulsby: 20.19, fcNatural: 18.17, fcSphere: 20.27 },
  { d: 0.5, t: 10, dStar: 10.154, stokes: 158.3, soulsby: 66.29, fcNatural: 61.9, fcSphere: 79.75 },
  { d: 0.03, t: 15, dStar: 0.6667, stokes: 0.6528, soulsby: 0.5944, fcNatural: 0.6361, fcSphere: 0.6421 },
  { d: 0.1, t: 15, dStar: 2.2224, stokes: 7.253, soulsby: 6.441, fcNatural: 6.256, fcSphere: 6.589 },
  { d: 0.2, t: 15, dStar: 4.4448, stokes: 29.01, soulsby: 22.38, fcNatural: 20.0, fcSphere: 22.58 },
  { d: 0.5, t: 15, dStar: 11.112, stokes: 181.3, soulsby: 68.91, fcNatural: 65.18, fcSphere: 85.24 },
];

function rel(a: number, b: number): number {
  return Math.abs(a / b - 1);
}

describe('grain settling velocities', () => {
  it.each(QUARTZ_TABLE)('gives D* = $dStar for $d mm quartz at $t °C', ({ d, t, dStar }) => {
    // Soulsby (1997) D* definition [READ: CIRP wiki and public code].
    expect(rel(dimensionlessGrainSize(quartzInSeawater(d, t)), dStar)).toBeLessThan(1e-4);
  });

  it.each(QUARTZ_TABLE)('gives the Stokes velocity $stokes mm/s for $d mm quartz at $t °C', ({ d, t, stokes }) => {
    // Stokes' law (REFERENCES §5 [CALC]).
    expect(rel(stokesSettlingVelocity(quartzInSeawater(d, t)) * 1e3, stokes)).toBeLessThan(1e-3);
  });

  it.each(QUARTZ_TABLE)('gives the Soulsby (1997) velocity $soulsby mm/s for $d mm quartz at $t °C', ({ d, t, soulsby }) => {
    // Soulsby (1997) eq. 102 [READ formula; CALC values].
    expect(rel(soulsbySettlingVelocity(quartzInSeawater(d, t)) * 1e3, soulsby)).toBeLessThan(1e-3);
  });

  it.each(QUARTZ_TABLE)(
    'gives the Ferguson-Church velocities $fcNatural (natural) and $fcSphere (sphere) mm/s for $d mm quartz at $t °C',
    ({ d, t, fcNatural, fcSphere }) => {
      // Ferguson & Church (2004) [READ formula]; C1 = 18, C2 = 1.0 and C2 = 0.4 [MEM constants, CALC values].
      const grain = quartzInSeawater(d, t);
      expect(rel(fergusonChurchSettlingVelocity(grain, 18, 1.0) * 1e3, fcNatural)).toBeLessThan(1e-3);
      expect(rel(fergusonChurchSettlingVelocity(grain, 18, 0.4) * 1e3, fcSphere)).toBeLessThan(1e-3);
    },
  );

  it('gives 5.656 mm/s for 0.1 mm quartz at 10 °C with the Soulsby formula', () => {
    // REFERENCES §0 quick table [CALC].
    expect(soulsbySettlingVelocity(quartzInSeawater(0.1, 10))).toBeCloseTo(5.656e-3, 6);
  });

  it('approaches Stokes for fine grains with the Ferguson-Church form and C1 = 18', () => {
    // Ferguson & Church (2004): C1 = 18 is the Stokes limit [READ].
    const grain = quartzInSeawater(0.002, 10);
    expect(rel(fergusonChurchSettlingVelocity(grain, 18, 0.4), stokesSettlingVelocity(grain))).toBeLessThan(0.01);
  });
});

describe('Stokes settling of algal cells (cellSettlingVelocity)', () => {
  it.each([
    // REFERENCES §5 algal-cell table [CALC], seawater at 15 °C (S = 35), m/d, 2–3 significant figures.
    // `half` is half a unit in the last printed digit, the rounding of the table.
    { d: 10, rho: 1050, mPerDay: 0.093, half: 5e-4 },
    { d: 10, rho: 1100, mPerDay: 0.29, half: 5e-3 },
    { d: 20, rho: 1050, mPerDay: 0.37, half: 5e-3 },
    { d: 20, rho: 1100, mPerDay: 1.14, half: 5e-3 },
    { d: 40, rho: 1100, mPerDay: 4.6, half: 5e-2 },
    { d: 40, rho: 1200, mPerDay: 10.7, half: 5e-2 },
    { d: 50, rho: 1050, mPerDay: 2.32, half: 5e-3 },
    { d: 50, rho: 1100, mPerDay: 7.14, half: 5e-3 },
    { d: 100, rho: 1050, mPerDay: 9.27, half: 5e-3 },
    { d: 100, rho: 1100, mPerDay: 28.6, half: 5e-2 },
  ])('sinks a $d µm cell of density $rho at $mPerDay m/d', ({ d, rho, mPerDay, half }) => {
    const v = cellSettlingVelocity({ diameterUm: d, cellDensity: rho, salinity: 35, tempC: 15 });
    expect(Math.abs(v.mPerDay - mPerDay)).toBeLessThanOrEqual(half);
    expect(v.mPerS * 86_400).toBeCloseTo(v.mPerDay, 12);
  });

  it('divides the speed by the form resistance', () => {
    // ws = g d² (ρp − ρw)/(18 μ φ_r) (Reynolds 2006 [MEM formula]).
    const sphere = cellSettlingVelocity({ diameterUm: 30, cellDensity: 1100, salinity: 34, tempC: 12 });
    const shaped = cellSettlingVelocity({ diameterUm: 30, cellDensity: 1100, salinity: 34, tempC: 12, formResistance: 2.5 });
    expect(shaped.mPerS).toBeCloseTo(sphere.mPerS / 2.5, 15);
  });

  it('lets a cell lighter than the water rise', () => {
    const v = cellSettlingVelocity({ diameterUm: 20, cellDensity: 1010, salinity: 35, tempC: 15 });
    expect(v.mPerS).toBeLessThan(0);
  });

  it('reports a particle Reynolds number well inside the Stokes range for a large cyst', () => {
    // Stokes' law holds for Re ≲ 0.5 (REFERENCES §5).
    const v = cellSettlingVelocity({ diameterUm: 100, cellDensity: 1200, salinity: 35, tempC: 15 });
    expect(v.reynolds).toBeGreaterThan(0);
    expect(v.reynolds).toBeLessThan(0.5);
  });
});
