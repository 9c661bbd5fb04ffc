import { describe, expect, it } from 'vitest';
import {
  criticalBedStress,
  kroneDeposition,
  partheniadesErosion,
  soulsbyWhitehouseCriticalShields,
} from '../../shared/model/bed-threshold.ts';
import { seawaterDensity, seawaterKinematicViscosity } from '../../shared/model/seawater.ts';
import { dimensionlessGrainSize } from '../../shared/model/settling.ts';

function quartz(dMm: number, tempC: number) {
  return {
    diameterM: dMm * 1e-3,
    particleDensity: 2650,
    waterDensity: seawaterDensity(35, tempC),
    kinematicViscosity: seawaterKinematicViscosity(35, tempC),
  };
}

describe('threshold of motion (Soulsby & Whitehouse 1997)', () => {
  it.each([
    // REFERENCES §9 table [CALC] from Soulsby (1997) eq. 77 [READ in public code], quartz, S = 35.
    { d: 0.03, t: 10, theta: 0.17397, tau: 0.0831 },
    { d: 0.1, t: 10, theta: 0.08948, tau: 0.1425 },
    { d: 0.2, t: 10, theta: 0.05536, tau: 0.1763 },
    { d: 0.5, t: 10, theta: 0.03286, tau: 0.2616 },
    { d: 0.2, t: 15, theta: 0.05204, tau: 0.1658 },
  ])('gives θcr = $theta and τcr = $tau Pa for $d mm quartz at $t °C', ({ d, t, theta, tau }) => {
    const grain = quartz(d, t);
    expect(Math.abs(soulsbyWhitehouseCriticalShields(dimensionlessGrainSize(grain)) - theta)).toBeLessThan(1e-5);
    // τ tabulated to 4 decimals.
    expect(Math.abs(criticalBedStress(grain) - tau)).toBeLessThan(6e-5);
  });

  it('tends to the Shields plateau 0.055 for coarse grains', () => {
    // Soulsby (1997) eq. 77: θcr → 0.055 as D* → ∞ (the exp(−0.020 D*) term decays, not grows).
    expect(soulsbyWhitehouseCriticalShields(1e4)).toBeCloseTo(0.055, 4);
  });
});

describe('bed erosion (Partheniades 1965) and deposition (Krone 1962)', () => {
  it('erodes 1.5e-4 kg m⁻² s⁻¹ with M = 1e-4, τce = 0.2 Pa and τb = 0.5 Pa', () => {
    // REFERENCES §9 worked example [CALC]; formula [MEM].
    expect(partheniadesErosion(0.5, 0.2, 1e-4)).toBeCloseTo(1.5e-4, 12);
  });

  it('does not erode below the critical stress', () => {
    expect(partheniadesErosion(0.15, 0.2, 1e-4)).toBe(0);
    expect(partheniadesErosion(0.2, 0.2, 1e-4)).toBe(0);
  });

  it('deposits 2.5e-5 kg m⁻² s⁻¹ with ws = 5e-4 m/s, Cb = 0.1 kg/m³, τb = 0.05 Pa and τcd = 0.1 Pa', () => {
    // REFERENCES §9 worked example [CALC]; formula [MEM].
    expect(kroneDeposition(5e-4, 0.1, 0.05, 0.1)).toBeCloseTo(2.5e-5, 12);
  });

  it('does not deposit at or above the critical stress for deposition', () => {
    expect(kroneDeposition(5e-4, 0.1, 0.1, 0.1)).toBe(0);
    expect(kroneDeposition(5e-4, 0.1, 0.3, 0.1)).toBe(0);
  });

  it('deposits ws Cb when there is no critical stress for deposition', () => {
    // Deposition without a critical stress (Sanford & Halka 1993 [MEM]), selected by τcd = ∞.
    expect(kroneDeposition(5e-4, 0.1, 0.3, Number.POSITIVE_INFINITY)).toBeCloseTo(5e-5, 15);
  });
});
