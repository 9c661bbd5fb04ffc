import { describe, expect, it } from 'vitest';
import { buildForecastCase } from '../../shared/forecast/case-builder.ts';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import { DEFAULT_WINDOW_SETTINGS } from '../../shared/forecast/window-settings.ts';
import { runCase } from '../../shared/model/run.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';
import { computeWhatIf } from '../../src/workers/what-if-compute.ts';
import type { WhatIfInput } from '../../src/workers/what-if-protocol.ts';

// An invented site: 15 m deep with an M2 and S2 current of 0.3 and 0.1 m/s.
const input = (settlingVelocityMPerDay: number): WhatIfInput => ({
  site: { latitudeDeg: 57.1, longitudeDeg: -6.2, waterDepthM: 15, bedRoughnessM: 0.02 },
  organismName: 'Test cyst',
  params: organismParamsSchema.parse({ settlingVelocityMPerDay, initialCellsPerL: 1000, triggerCellsPerL: 500 }),
  current: { constituents: [{ name: 'M2', major: 0.3, phaseDeg: 100 }, { name: 'S2', major: 0.1, phaseDeg: 130 }], axisDeg: null },
  startMs: Date.UTC(2026, 5, 1),
  horizonDays: 3,
  layers: 50,
  windowSettings: DEFAULT_WINDOW_SETTINGS,
});

const never = async () => false;
const clock = () => performance.now();

function centreOfMassMean(grid: { nt: number; nz: number; concentration: Float32Array; thicknessM: Float64Array; depthM: Float64Array }) {
  let sum = 0;
  for (let i = 0; i < grid.nt; i++) {
    let total = 0;
    let moment = 0;
    for (let k = 0; k < grid.nz; k++) {
      const cells = grid.concentration[i * grid.nz + k]! * grid.thicknessM[k]!;
      total += cells;
      moment += cells * grid.depthM[k]!;
    }
    sum += moment / total;
  }
  return sum / grid.nt;
}

describe('what-if recompute', () => {
  it('gives the same grid in slices as the engine run in one go', async () => {
    const sliced = await computeWhatIf(input(5), never, clock);
    if (!sliced.ok) throw new Error(sliced.message);
    const w = input(5);
    const whole = runCase(buildForecastCase({ site: w.site, organism: { name: w.organismName, params: w.params }, current: w.current, startMs: w.startMs, horizonDays: 3, layers: 50 }));
    if (!whole.ok) throw new Error('case refused');
    const grid = gridFromModelResult(whole.result, { startMs: w.startMs, waterDepthM: 15, organismIndex: 0 });
    expect(sliced.grid.nt).toBe(3 * 96 + 1);
    expect(sliced.grid.nz).toBe(50);
    expect(Array.from(sliced.grid.concentration)).toEqual(Array.from(grid.concentration));
  });

  it('stops at the first slice boundary when a newer request is waiting', async () => {
    let asked = 0;
    const outcome = await computeWhatIf(input(5), async () => (++asked, true), clock);
    expect(outcome).toEqual({ ok: false, cancelled: true, message: 'A newer what-if replaced this one.' });
    expect(asked).toBe(1);
  });

  it('puts the cells deeper when they settle faster', async () => {
    // Rouse balance (REFERENCES §4): a larger ws/u* gives a profile weighted towards the bed.
    const slow = await computeWhatIf(input(0.5), never, clock);
    const fast = await computeWhatIf(input(20), never, clock);
    if (!slow.ok || !fast.ok) throw new Error('run failed');
    expect(centreOfMassMean(fast.grid)).toBeGreaterThan(centreOfMassMean(slow.grid) + 0.1);
  });

  it('explains a site without usable constituents instead of throwing', async () => {
    const bad = { ...input(1), current: { constituents: [{ name: 'M2', major: 0.3, phaseDeg: 100 }, { name: 'M2', major: 0.3, phaseDeg: 100 }], axisDeg: null } };
    const outcome = await computeWhatIf(bad, never, clock);
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.cancelled).toBe(false);
  });
});
