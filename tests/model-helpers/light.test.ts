import { describe, expect, it } from 'vitest';
import {
  clearSkyParAtSurface,
  euphoticDepth,
  fresnelReflectance,
  jassbyPlatt,
  lightAtDepth,
  relativeAirMass,
} from '../../shared/model/light.ts';

const RAD = Math.PI / 180;

describe('photosynthesis–light curve (Jassby & Platt 1976)', () => {
  it('reaches tanh 1 = 0.76159 of Pmax at the saturation light Ik = Pmax/α', () => {
    // Jassby & Platt (1976) [READ formula]; P(Ik)/Pmax = tanh 1 = 0.76159 [CALC] (REFERENCES §6).
    const pmax = 2.5;
    const alpha = 0.02;
    expect(jassbyPlatt(pmax / alpha, alpha, pmax) / pmax).toBeCloseTo(0.76159, 5);
  });

  it('has initial slope α in dim light', () => {
    // Jassby & Platt (1976): dP/dI → α as I → 0.
    expect(jassbyPlatt(0.01, 0.03, 2) / 0.01).toBeCloseTo(0.03, 7);
  });

  it('saturates at Pmax in bright light', () => {
    expect(jassbyPlatt(1e5, 0.03, 2)).toBeCloseTo(2, 12);
  });
});

describe('Beer–Lambert attenuation', () => {
  it('puts the 1 % light depth at 15.35 m for Kd = 0.3 m⁻¹', () => {
    // REFERENCES §6 [CALC]: ln(100)/0.3 = 15.35 m.
    expect(euphoticDepth(0.3)).toBeCloseTo(15.3506, 4);
  });

  it('leaves 1 % of the surface light at the euphotic depth', () => {
    // Beer–Lambert I(d) = I0 exp(−Kd d) (Kirk 2011) [MEM source, formula standard].
    expect(lightAtDepth(1500, 0.3, euphoticDepth(0.3))).toBeCloseTo(15, 10);
  });

  it('attenuates by e per 1/Kd metres', () => {
    expect(lightAtDepth(1000, 0.2, 5)).toBeCloseTo(1000 / Math.E, 10);
  });
});

describe('clear-sky surface PAR', () => {
  it('is zero with the sun at or below the horizon', () => {
    expect(clearSkyParAtSurface(0)).toBe(0);
    expect(clearSkyParAtSurface(-10)).toBe(0);
  });

  it('is near 2000 µmol m⁻² s⁻¹ with the sun overhead', () => {
    // Clear-sky noon PAR in the tropics is about 2000–2300 µmol m⁻² s⁻¹ [from memory, common practice].
    const par = clearSkyParAtSurface(90);
    expect(par).toBeGreaterThan(1800);
    expect(par).toBeLessThan(2400);
  });

  it('rises steadily with solar elevation', () => {
    let previous = 0;
    for (let e = 1; e <= 90; e++) {
      const par = clearSkyParAtSurface(e);
      expect(par).toBeGreaterThan(previous);
      previous = par;
    }
  });

  it('agrees within 15 % with the Haurwitz clear-sky model for elevations of 30° to 90°', () => {
    // Independent published clear-sky model: Haurwitz (1945), J. Meteor. 2:154–166,
    // GHI = 1098 cos z exp(−0.057/cos z) W m⁻² [from memory]; then ×0.45 PAR fraction,
    // ×4.57 µmol/J (McCree 1981 [MEM]) and ×(1 − Fresnel reflectance). Loose because both are [MEM].
    for (const e of [30, 45, 60, 75, 90]) {
      const cosZ = Math.sin(e * RAD);
      const ghi = 1098 * cosZ * Math.exp(-0.057 / cosZ);
      const haurwitzPar = ghi * 0.45 * 4.57 * (1 - fresnelReflectance(90 - e));
      expect(Math.abs(clearSkyParAtSurface(e) / haurwitzPar - 1)).toBeLessThan(0.15);
    }
  });
});

describe('air mass and surface reflectance', () => {
  it('gives air mass 1 overhead, about 2 at 30° and about 38 at the horizon', () => {
    // Kasten & Young (1989) [MEM]: AM ≈ 1/sin(h) away from the horizon, ≈ 38 at the horizon.
    expect(relativeAirMass(90)).toBeCloseTo(1, 3);
    expect(Math.abs(relativeAirMass(30) - 2)).toBeLessThan(0.01);
    expect(Math.abs(relativeAirMass(0) - 38)).toBeLessThan(0.5);
  });

  it('reflects ((n − 1)/(n + 1))² = 2.11 % at normal incidence for n = 1.34', () => {
    // Fresnel equations [CALC]: (0.34/2.34)² = 0.021112.
    expect(fresnelReflectance(0)).toBeCloseTo(0.021112, 6);
    // Continuity of the oblique formula with the normal-incidence limit.
    expect(fresnelReflectance(1e-3)).toBeCloseTo(0.021112, 6);
  });

  it('reflects about 6 % at 60° incidence and everything at grazing incidence', () => {
    // Kirk (2011) ch. 2: about 6 % at 60° from the vertical for a flat water surface [from memory].
    expect(Math.abs(fresnelReflectance(60) - 0.06)).toBeLessThan(0.006);
    expect(fresnelReflectance(90)).toBe(1);
  });
});
