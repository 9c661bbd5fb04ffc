import { describe, expect, it } from 'vitest';
import { astro, constituents as referenceConstituents, createTidePredictor } from '@neaps/tide-predictor';
import { meanLongitudes, nodeAngles } from '../../shared/tides/astronomy.ts';
import { findConstituent } from '../../shared/tides/constituents.ts';
import { SCHUREMAN_MEANS, constituentNodalFactor, equilibriumArgumentDeg, fundamentalFactors, nodalTable } from '../../shared/tides/nodal.ts';

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

function angleDiff(a: number, b: number): number {
  return ((((a - b) % 360) + 540) % 360) - 180;
}

/**
 * Lunar node longitude, Meeus (1998) ch. 47 as quoted in REFERENCES §8 [MEM]:
 * N = 125.04452° − 1934.136261° T + 0.0020708° T², T in Julian centuries from J2000.0.
 */
function meeusNode(timeMs: number): number {
  const T = (timeMs / 86_400_000 + 2_440_587.5 - 2_451_545) / 36525;
  return 125.04452 - 1934.136261 * T + 0.0020708 * T * T;
}

/**
 * Schureman (1958) formulas written out as in REFERENCES §8, with ω = 23.452°, i = 5.145°.
 * Solved with plain arctangents of the tangent forms, for N in (−180°, 180°).
 */
function schuremanReference(Ndeg: number) {
  const N = (((Ndeg + 180) % 360) + 360) % 360 - 180;
  const w = 23.452 * RAD;
  const i = 5.145 * RAD;
  const n = N * RAD;
  const I = Math.acos(Math.cos(w) * Math.cos(i) - Math.sin(w) * Math.sin(i) * Math.cos(n));
  const A = Math.atan((Math.cos((w - i) / 2) / Math.cos((w + i) / 2)) * Math.tan(n / 2)); // ½(N − ξ + ν)
  const B = Math.atan((Math.sin((w - i) / 2) / Math.sin((w + i) / 2)) * Math.tan(n / 2)); // ½(N − ξ − ν)
  const nu = A - B;
  const xi = n - A - B;
  const nuP = Math.atan((Math.sin(2 * I) * Math.sin(nu)) / (Math.sin(2 * I) * Math.cos(nu) + 0.3347));
  const nuPP = Math.atan((Math.sin(I) ** 2 * Math.sin(2 * nu)) / (Math.sin(I) ** 2 * Math.cos(2 * nu) + 0.0727)) / 2;
  return {
    I: I * DEG,
    M2: { f: Math.cos(I / 2) ** 4 / 0.9154, u: (2 * xi - 2 * nu) * DEG },
    O1: { f: (Math.sin(I) * Math.cos(I / 2) ** 2) / 0.38, u: (2 * xi - nu) * DEG },
    K1: {
      f: Math.sqrt(0.8965 * Math.sin(2 * I) ** 2 + 0.6001 * Math.sin(2 * I) * Math.cos(nu) + 0.1006),
      u: -nuP * DEG,
    },
    K2: {
      f: Math.sqrt(19.0444 * Math.sin(I) ** 4 + 2.7702 * Math.sin(I) ** 2 * Math.cos(2 * nu) + 0.0981),
      u: -2 * nuPP * DEG,
    },
  };
}

// Dates spread over more than one 18.61-year node cycle.
const DATES = [
  '1997-03-01',
  '2000-01-01',
  '2002-08-15',
  '2004-11-20',
  '2006-06-01',
  '2009-02-10',
  '2011-07-04',
  '2015-12-31',
  '2018-05-05',
  '2021-09-09',
  '2024-01-01',
  '2025-01-01',
].map((d) => Date.parse(`${d}T00:00:00Z`));

describe('lunar node longitude', () => {
  it('matches the Meeus check values of REFERENCES §8', () => {
    // Source: REFERENCES §8 [CALC from Meeus 1998 ch. 47]: N = 125.07° (2000-01-01),
    // 1.00° (2006-06-01), 20.88° (2024-01-01), 1.50° (2025-01-01).
    const cases: [string, number][] = [
      ['2000-01-01', 125.07],
      ['2006-06-01', 1.0],
      ['2024-01-01', 20.88],
      ['2025-01-01', 1.5],
    ];
    for (const [date, N] of cases) {
      expect(Math.abs(angleDiff(meanLongitudes(Date.parse(`${date}T00:00:00Z`)).N, N)), date).toBeLessThan(0.01);
    }
  });
});

describe('nodal corrections (Schureman 1958)', () => {
  it('agree with the Schureman formulas for M2, K1, O1 and K2 across the node cycle (f within 0.002, u within 0.2°)', () => {
    // Reference: Schureman (1958) eqs. 75, 78, 227, 235 as written in REFERENCES §8 [READ title;
    // formulas MEM, confirmed numerically there], computed independently above with N from Meeus.
    for (const t of DATES) {
      const mine = nodalTable(t);
      const ref = schuremanReference(meeusNode(t));
      for (const name of ['M2', 'K1', 'O1', 'K2'] as const) {
        const label = `${name} at ${new Date(t).toISOString().slice(0, 10)}`;
        expect(Math.abs(mine[name]!.f - ref[name].f), label).toBeLessThan(0.002);
        expect(Math.abs(angleDiff(mine[name]!.u, ref[name].u)), label).toBeLessThan(0.2);
      }
    }
  });

  it('give the N = 0 table values f_M2 0.9632, f_K1 1.1128, f_O1 1.1828, f_K2 1.3162 and u = 0', () => {
    // Source: REFERENCES §8 check-value table, Schureman exact at N = 0 [CALC]; I = 28.597°.
    const angles = nodeAngles(0);
    expect(angles.I).toBeCloseTo(28.597, 3);
    const f = fundamentalFactors(angles, 0);
    expect(f.M2.f).toBeCloseTo(0.9632, 4);
    expect(f.K1.f).toBeCloseTo(1.1128, 4);
    expect(f.O1.f).toBeCloseTo(1.1828, 4);
    expect(f.K2.f).toBeCloseTo(1.3162, 4);
    for (const key of ['M2', 'K1', 'O1', 'K2'] as const) expect(Math.abs(f[key].u)).toBeLessThan(1e-9);
  });

  it('stay within the accuracy of the IHO / Pugh series approximations at every degree of N', () => {
    // Source: IHO list Annex A [READ] and Pugh (1987) Table 4.3 [MEM], constants as corrected in
    // REFERENCES §8 (1.0004 for M2, 1.0089 for O1, 1.0241 for K2). The series are quoted to four
    // decimals in f and 0.01–0.1° in u; allowed here: f within 0.002, u within 0.2°.
    let worstF = 0;
    let worstU = 0;
    for (let N = 0; N < 360; N += 1) {
      const n = N * RAD;
      const f = fundamentalFactors(nodeAngles(N), 0);
      const series = {
        M2: { f: 1.0004 - 0.0373 * Math.cos(n) + 0.0002 * Math.cos(2 * n), u: -2.14 * Math.sin(n) },
        K1: {
          f: 1.006 + 0.115 * Math.cos(n) - 0.0088 * Math.cos(2 * n) + 0.0006 * Math.cos(3 * n),
          u: -8.86 * Math.sin(n) + 0.68 * Math.sin(2 * n) - 0.07 * Math.sin(3 * n),
        },
        O1: {
          f: 1.0089 + 0.1871 * Math.cos(n) - 0.0147 * Math.cos(2 * n) + 0.0014 * Math.cos(3 * n),
          u: 10.8 * Math.sin(n) - 1.34 * Math.sin(2 * n) + 0.19 * Math.sin(3 * n),
        },
        K2: {
          f: 1.0241 + 0.2863 * Math.cos(n) + 0.0083 * Math.cos(2 * n) - 0.0015 * Math.cos(3 * n),
          u: -17.74 * Math.sin(n) + 0.68 * Math.sin(2 * n) - 0.04 * Math.sin(3 * n),
        },
      };
      for (const key of ['M2', 'K1', 'O1', 'K2'] as const) {
        worstF = Math.max(worstF, Math.abs(f[key].f - series[key].f));
        worstU = Math.max(worstU, Math.abs(angleDiff(f[key].u, series[key].u)));
      }
    }
    expect(worstF).toBeLessThan(0.002);
    expect(worstU).toBeLessThan(0.2);
  });

  it('average 1.0003 (M2), 1.0061 (K1) and 1.0090 (O1) over a full node cycle', () => {
    // Source: REFERENCES §8, node-cycle means of the exact f [CALC].
    const sum = { M2: 0, K1: 0, O1: 0 };
    const steps = 3600;
    for (let k = 0; k < steps; k++) {
      const f = fundamentalFactors(nodeAngles((360 * (k + 0.5)) / steps), 0);
      sum.M2 += f.M2.f;
      sum.K1 += f.K1.f;
      sum.O1 += f.O1.f;
    }
    expect(sum.M2 / steps).toBeCloseTo(1.0003, 4);
    expect(sum.K1 / steps).toBeCloseTo(1.0061, 4);
    expect(sum.O1 / steps).toBeCloseTo(1.009, 4);
  });

  it('follow the IHO Annex B rule for compound constituents', () => {
    // Source: IHO list Annex B [READ] via REFERENCES §8: M4 = f_M2², 2u_M2; MS4 = f_M2, u_M2;
    // M6 = f_M2³, 3u_M2.
    const t = Date.parse('2019-06-01T00:00:00Z');
    const table = nodalTable(t);
    const m2 = table.M2!;
    expect(table.M4!.f).toBeCloseTo(m2.f ** 2, 12);
    expect(table.M4!.u).toBeCloseTo(2 * m2.u, 9);
    expect(table.MS4!.f).toBeCloseTo(m2.f, 12);
    expect(table.MS4!.u).toBeCloseTo(m2.u, 9);
    expect(table.M6!.f).toBeCloseTo(m2.f ** 3, 12);
    expect(table.M6!.u).toBeCloseTo(3 * m2.u, 9);
    expect(table.S2).toEqual({ f: 1, u: 0 });
  });

  it('agree with the Schureman option of @neaps/tide-predictor for every listed constituent', () => {
    // Reference: npm @neaps/tide-predictor 0.11.0, fundamentals "schureman" (general-purpose
    // reference library). It evaluates I with the obliquity of date (23.44°) rather than
    // Schureman's 23.452°, so allow f within 0.2 % (relative: OO1, whose f swings from 0.4 to
    // 1.9, is the most sensitive to the obliquity) and u within 0.2°.
    for (const t of DATES) {
      const mine = nodalTable(t);
      for (const [name, nf] of Object.entries(mine)) {
        const def = findConstituent(name)!;
        const ref = referenceConstituents[def.name] ?? def.aliases.map((x) => referenceConstituents[x]).find(Boolean);
        expect(ref, name).toBeDefined();
        const corr = referenceNodal(ref!.name, t);
        expect(Math.abs(nf.f - corr.f) / corr.f, `${name} f`).toBeLessThan(0.002);
        expect(Math.abs(angleDiff(nf.u, corr.u)), `${name} u`).toBeLessThan(0.2);
      }
    }
  });
});

describe('equilibrium argument V0', () => {
  it('matches the V0 of @neaps/tide-predictor within 0.01° for every listed constituent', () => {
    // Reference: @neaps/tide-predictor 0.11.0 (Meeus mean longitudes, Doodson multipliers).
    for (const t of DATES) {
      const longitudes = meanLongitudes(t + 7 * 3_600_000);
      const a = astro(new Date(t + 7 * 3_600_000));
      for (const name of Object.keys(nodalTable(t))) {
        const def = findConstituent(name)!;
        const ref = referenceConstituents[def.name] ?? def.aliases.map((x) => referenceConstituents[x]).find(Boolean);
        expect(Math.abs(angleDiff(equilibriumArgumentDeg(def, longitudes), ref!.value(a))), name).toBeLessThan(0.01);
      }
    }
  });

  it('puts S2 at 0° and K1 at h − 90° at midnight UTC (Schureman: V = 2T, T + h − 90°)', () => {
    // Source: Schureman (1958) Table 2 arguments [MEM]; T = 180° at 00:00 UTC.
    const t = Date.parse('2023-03-14T00:00:00Z');
    const L = meanLongitudes(t);
    expect(Math.abs(angleDiff(equilibriumArgumentDeg(findConstituent('S2')!, L), 0))).toBeLessThan(1e-6);
    expect(Math.abs(angleDiff(equilibriumArgumentDeg(findConstituent('K1')!, L), L.h + 180 - 90))).toBeLessThan(1e-6);
  });
});

describe('nodal factor of a single constituent', () => {
  it('takes f = 1 and u = 0 for the solar constituents P1, S2, T2 and R2', () => {
    const f = fundamentalFactors(nodeAngles(73), 120);
    for (const name of ['P1', 'S2', 'T2', 'R2']) expect(constituentNodalFactor(findConstituent(name)!, f)).toEqual({ f: 1, u: 0 });
  });
});

/**
 * f and u of one constituent from @neaps/tide-predictor with its Schureman option, read off
 * two predictions at one instant: amplitude 1 with phase 0 gives f cos(V0 + u), phase 90°
 * gives f sin(V0 + u); V0 comes from the library's constituent model.
 */
function referenceNodal(name: string, t: number): { f: number; u: number } {
  const at = (phase: number): number =>
    createTidePredictor([{ name, amplitude: 1, phase }], { nodeCorrections: 'schureman' }).getWaterLevelAtTime({
      time: new Date(t),
    }).level;
  const c = at(0);
  const s = at(90);
  const v0 = referenceConstituents[name]!.value(astro(new Date(t)));
  return { f: Math.hypot(c, s), u: Math.atan2(s, c) * DEG - v0 };
}

describe('node-cycle means', () => {
  it('reproduce the denominators printed by Schureman (0.9154, 0.3800, 0.5021, 0.1578, 0.7214, 0.0164)', () => {
    // Source: Schureman (1958) Table 2 / eqs. 65–73 [MEM], as quoted in REFERENCES §8 for M2 and O1.
    expect(SCHUREMAN_MEANS.M2).toBeCloseTo(0.9154, 4);
    expect(SCHUREMAN_MEANS.O1).toBeCloseTo(0.38, 4);
    expect(SCHUREMAN_MEANS.Mm).toBeCloseTo(0.5021, 4);
    expect(SCHUREMAN_MEANS.Mf).toBeCloseTo(0.1578, 4);
    expect(SCHUREMAN_MEANS.J1).toBeCloseTo(0.7214, 4);
    expect(SCHUREMAN_MEANS.OO1).toBeCloseTo(0.0164, 4);
  });
});
