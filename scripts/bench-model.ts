/**
 * Benchmark of the water-column model: the standard case (7 days, 10 s steps,
 * k-epsilon, one settling organism, output every 10 minutes) at 100 layers,
 * and the same at 50 and 200 layers. Prints the median of 5 runs of the time
 * loop in ms and in ns per layer per step.
 */
import { parseCase, type CaseInput } from '../shared/model/case-schema.ts';
import { createRun, runToEnd } from '../shared/model/run.ts';

const RUNS = 5;

function standardCase(layers: number): CaseInput {
  return {
    depth_m: 20,
    layers,
    time_step_s: 10,
    duration_s: 7 * 86400,
    output_interval_s: 600,
    latitude_deg: 56.5,
    longitude_deg: -5.5,
    bed_roughness_m: 0.01,
    closure: { type: 'k-epsilon' },
    forcing: {
      type: 'depth_mean_current',
      start: '2025-06-01T00:00:00Z',
      constituents: [
        { name: 'M2', amplitude_m_s: 0.5, phase_deg: 0 },
        { name: 'S2', amplitude_m_s: 0.15, phase_deg: 30 },
      ],
    },
    organisms: [{ name: 'cysts', settling_velocity_m_s: 1e-4, initial_concentration: 100 }],
  };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

function bench(layers: number): { ms: number; nsPerLayerStep: number; steps: number } {
  const parsed = parseCase(standardCase(layers));
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
  const times: number[] = [];
  let steps = 0;
  for (let r = 0; r < RUNS; r++) {
    const run = createRun(parsed.value);
    const t0 = performance.now();
    const result = runToEnd(run);
    times.push(performance.now() - t0);
    if (result.status !== 'ok') throw new Error(`run ended with status ${result.status}`);
    steps = result.summary.steps;
  }
  const ms = median(times);
  return { ms, nsPerLayerStep: (ms * 1e6) / (steps * layers), steps };
}

const target = 90;
for (const layers of [100, 50, 200]) {
  const b = bench(layers);
  const mark = layers === 100 ? (b.nsPerLayerStep <= target ? ' (target ≤ 90: met)' : ' (target ≤ 90: NOT met)') : '';
  console.log(
    `${String(layers).padStart(4)} layers, ${b.steps} steps: median ${b.ms.toFixed(1)} ms, ` +
      `${b.nsPerLayerStep.toFixed(1)} ns per layer per step${mark}`,
  );
}
