import { parseCase, type CaseInput } from '../../shared/model/case-schema.ts';
import { createRun, runToEnd, type ModelResult, type ModelRun } from '../../shared/model/run.ts';

/** Validates and runs a case, failing loudly on invalid input; returns the run and its result. */
export function runValid(input: CaseInput): { run: ModelRun; result: ModelResult } {
  const parsed = parseCase(input);
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
  const run = createRun(parsed.value);
  const result = runToEnd(run);
  if (result.status !== 'ok') throw new Error(`run status ${result.status}`);
  return { run, result };
}

/** Profile of output k (surface first) from a flat outputs × layers array. */
export function profileAt(values: Float64Array, layers: number, k: number): Float64Array {
  return values.subarray(k * layers, (k + 1) * layers);
}

/** Mulberry32: a small seeded PRNG, so random tests are reproducible. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
