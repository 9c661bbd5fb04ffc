import { describe, expect, it } from 'vitest';
import * as SunCalc from 'suncalc';
import {
  apparentSunElevationDeg,
  atmosphericRefractionDeg,
  solarDeclinationDeg,
  solarNoonUtcMs,
  sunElevationDeg,
} from '../../shared/model/sun.ts';

const RAD = Math.PI / 180;

/** Mulberry32, a small seeded PRNG, so the random cases are the same on every run. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Case {
  timeMs: number;
  lat: number;
  lon: number;
}

function randomCases(count: number, seed: number): Case[] {
  const next = mulberry32(seed);
  const start = Date.UTC(1990, 0, 1);
  const end = Date.UTC(2060, 0, 1);
  const cases: Case[] = [];
  for (let i = 0; i < count; i++) {
    cases.push({
      timeMs: start + next() * (end - start),
      lat: -60 + next() * 130,
      lon: -180 + next() * 360,
    });
  }
  return cases;
}

/**
 * suncalc 2.x returns the apparent altitude in degrees, with refraction by
 * Meeus (1998) eq. 16.4 as coded in that library:
 * R = 1.02′/tan(h + 10.26/(h + 5.10)), h the true altitude in degrees, clamped at 0.
 * Undoing it gives the library's geometric altitude, to compare like with like.
 */
function suncalcRefractionDeg(trueAltitudeDeg: number): number {
  const h = Math.max(0, trueAltitudeDeg);
  return 1.02 / Math.tan((h + 10.26 / (h + 5.1)) * RAD) / 60;
}

describe('sun position (NOAA solar calculator / Meeus)', () => {
  it('matches the geometric elevation of the suncalc library within 0.5° at 2000 random times and places', () => {
    // Reference: npm suncalc 2.0.2 (general-purpose reference library), refraction removed.
    let worst = 0;
    for (const c of randomCases(2000, 20240601)) {
      const ours = sunElevationDeg(c.timeMs, c.lat, c.lon);
      const apparent = SunCalc.getPosition(new Date(c.timeMs), c.lat, c.lon).altitude;
      const geometric = apparent - suncalcRefractionDeg(ours);
      worst = Math.max(worst, Math.abs(ours - geometric));
    }
    expect(worst).toBeLessThan(0.5);
  });

  it('matches the apparent elevation of the suncalc library within 0.5° when the sun is up', () => {
    // Reference: npm suncalc 2.0.2 apparent altitude; ours adds Sæmundsson (1986) refraction.
    let compared = 0;
    let worst = 0;
    for (const c of randomCases(2000, 7)) {
      const ours = apparentSunElevationDeg(c.timeMs, c.lat, c.lon);
      if (ours <= 0) continue;
      compared++;
      const theirs = SunCalc.getPosition(new Date(c.timeMs), c.lat, c.lon).altitude;
      worst = Math.max(worst, Math.abs(ours - theirs));
    }
    expect(compared).toBeGreaterThan(500);
    expect(worst).toBeLessThan(0.5);
  });

  it('puts the sun at 90° − |latitude| at solar noon on the March 2024 equinox', () => {
    // Equinox 2024-03-20 03:06 UTC [from memory]; declination moves < 0.2° by noon, so allow 0.3°.
    const day = Date.UTC(2024, 2, 20);
    for (const lat of [-45, 0, 30, 57]) {
      const noon = solarNoonUtcMs(day, 0);
      expect(Math.abs(sunElevationDeg(noon, lat, 0) - (90 - Math.abs(lat)))).toBeLessThan(0.3);
    }
  });

  it('gives a declination of about 23.44° at the June 2024 solstice', () => {
    // Solstice 2024-06-20 20:51 UTC and obliquity ≈ 23.44° [from memory]; loose tolerance 0.02°.
    expect(Math.abs(solarDeclinationDeg(Date.UTC(2024, 5, 20, 20, 51)) - 23.44)).toBeLessThan(0.02);
  });

  it('gives a declination near zero at the March 2024 equinox instant', () => {
    // Equinox 2024-03-20 03:06 UTC [from memory]; the sun's declination moves 0.016° per hour then.
    expect(Math.abs(solarDeclinationDeg(Date.UTC(2024, 2, 20, 3, 6)))).toBeLessThan(0.02);
  });

  it('places solar noon within 30 s of the suncalc library at several longitudes', () => {
    // Reference: npm suncalc 2.0.2 getTimes().solarNoon (asked with the UTC noon of the same day).
    for (const lon of [-150, -60, 0, 10, 120]) {
      for (const day of [Date.UTC(2024, 1, 11), Date.UTC(2024, 10, 3)]) {
        const theirs = SunCalc.getTimes(new Date(solarNoonUtcMs(day, lon)), 45, lon).solarNoon.valueOf();
        expect(Math.abs(solarNoonUtcMs(day, lon) - theirs)).toBeLessThan(30_000);
      }
    }
  });

  it('puts solar noon at Greenwich near 11:44 UTC in early November, when the equation of time peaks', () => {
    // Equation of time ≈ +16.4 min around 3 November [from memory]; tolerance 1 min.
    const noon = solarNoonUtcMs(Date.UTC(2024, 10, 3), 0);
    const expected = Date.UTC(2024, 10, 3, 12) - 16.4 * 60_000;
    expect(Math.abs(noon - expected)).toBeLessThan(60_000);
  });

  it('gives a highest elevation at solar noon', () => {
    const noon = solarNoonUtcMs(Date.UTC(2025, 6, 1), -5);
    const atNoon = sunElevationDeg(noon, 52, -5);
    expect(atNoon).toBeGreaterThan(sunElevationDeg(noon - 600_000, 52, -5));
    expect(atNoon).toBeGreaterThan(sunElevationDeg(noon + 600_000, 52, -5));
  });

  it('gives about 29′ of refraction at the horizon and none at the zenith', () => {
    // Sæmundsson (1986) via Meeus (1998) eq. 16.4: R(0°) ≈ 28.9′ [from memory]; 34′ is the
    // standard horizon refraction for apparent altitude 0 (common practice), so allow 28–30′.
    expect(atmosphericRefractionDeg(0) * 60).toBeGreaterThan(28);
    expect(atmosphericRefractionDeg(0) * 60).toBeLessThan(30);
    expect(atmosphericRefractionDeg(90)).toBeLessThan(1e-9);
  });
});
