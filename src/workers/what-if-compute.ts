/**
 * The what-if recompute, as the scheduled forecast does it (buildForecastCase → engine →
 * gridFromModelResult → findWindows), but stepped in slices so that the worker can give up on a run
 * when a newer one is asked for. No DOM: it runs in a worker and in tests.
 */
import { buildForecastCase } from '../../shared/forecast/case-builder.ts';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { findWindows, type ForecastWindow } from '../../shared/forecast/windows.ts';
import { parseCase } from '../../shared/model/case-schema.ts';
import { advanceRun, createRun, finishRun, startRun } from '../../shared/model/run.ts';
import type { WhatIfInput } from './what-if-protocol.ts';

/** Outputs per slice: 48 × 15 min = half a day of model time, a few ms of work at 50 layers. */
const OUTPUTS_PER_SLICE = 48;

export type ComputeOutcome =
  | { ok: true; grid: ForecastGrid; windows: ForecastWindow[]; modelMs: number }
  | { ok: false; cancelled: boolean; message: string };

/**
 * Runs one what-if. `yieldNow` is awaited between slices and answers true when the run should stop
 * (a newer request arrived). `now` is the clock used to time the engine (performance.now in a worker).
 */
export async function computeWhatIf(input: WhatIfInput, yieldNow: () => Promise<boolean>, now: () => number): Promise<ComputeOutcome> {
  let caseInput;
  try {
    caseInput = buildForecastCase({
      site: input.site,
      organism: { name: input.organismName, params: input.params },
      current: input.current,
      startMs: input.startMs,
      horizonDays: input.horizonDays,
      layers: input.layers,
      timeStepS: input.timeStepS,
    });
  } catch (error) {
    return { ok: false, cancelled: false, message: error instanceof Error ? error.message : String(error) };
  }
  const parsed = parseCase(caseInput);
  if (!parsed.ok) return { ok: false, cancelled: false, message: `The case is not valid: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}` };

  let modelMs = 0;
  let t0 = now();
  const model = createRun(parsed.value);
  const cursor = startRun(model);
  let done = false;
  while (!done) {
    done = advanceRun(model, cursor, OUTPUTS_PER_SLICE);
    if (done) break;
    modelMs += now() - t0;
    if (await yieldNow()) return { ok: false, cancelled: true, message: 'A newer what-if replaced this one.' };
    t0 = now();
  }
  const result = finishRun(model, cursor);
  modelMs += now() - t0;
  if (result.status !== 'ok') return { ok: false, cancelled: false, message: `The model stopped: ${result.status}. Try less extreme values.` };

  const organism = parsed.value.organisms[0]!;
  const grid = gridFromModelResult(result, {
    startMs: input.startMs,
    waterDepthM: input.site.waterDepthM,
    organismIndex: 0,
    schmidtNumber: organism.schmidt_number,
    backgroundDiffusivityM2S: organism.background_diffusivity_m2_s,
  });
  const windows = findWindows(grid, input.windowSettings);
  return { ok: true, grid, windows, modelMs };
}
