/**
 * Runs one water-column case from a JSON file.
 *   npm run -s model -- CASE.json [--csv PROFILES.csv] [--series SERIES.csv] [--summary]
 * Invalid cases print one line per problem (naming the field) and exit with 1.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { parseCase } from '../shared/model/case-schema.ts';
import { createRun, runToEnd, type ModelResult } from '../shared/model/run.ts';

interface CliArgs {
  casePath: string;
  csv?: string;
  series?: string;
  summary: boolean;
}

function usage(): never {
  process.stderr.write('usage: model CASE.json [--csv PROFILES.csv] [--series SERIES.csv] [--summary]\n');
  process.exit(2);
}

function parseArgs(argv: string[]): CliArgs {
  let casePath: string | undefined;
  let csv: string | undefined;
  let series: string | undefined;
  let summary = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg === '--csv') csv = argv[++i] ?? usage();
    else if (arg === '--series') series = argv[++i] ?? usage();
    else if (arg === '--summary') summary = true;
    else if (arg.startsWith('--')) usage();
    else if (casePath === undefined) casePath = arg;
    else usage();
  }
  if (casePath === undefined) usage();
  return { casePath, csv, series, summary };
}

/** Nine significant digits, written without trailing zeros. */
function num(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(9))) : 'NaN';
}

function profilesCsv(r: ModelResult): string {
  const names = r.organisms.map((o) => o.name);
  const lines = [['time_s', 'depth_m', 'u_m_s', 'v_m_s', 'eddy_viscosity_m2_s', ...names].join(',')];
  const n = r.layers;
  for (let k = 0; k < r.outputs; k++) {
    for (let i = 0; i < n; i++) {
      const idx = k * n + i;
      const row = [num(r.timeS[k]!), num(r.depthM[i]!), num(r.u[idx]!), num(r.v[idx]!), num(r.eddyViscosity[idx]!)];
      for (const o of r.organisms) row.push(num(o.concentration[idx]!));
      lines.push(row.join(','));
    }
  }
  return lines.join('\n') + '\n';
}

function seriesCsv(r: ModelResult): string {
  const header = ['time_s', 'bed_stress_pa', 'friction_velocity_m_s', 'depth_mean_u_m_s', 'depth_mean_v_m_s'];
  for (const o of r.organisms) header.push(`${o.name}_total`);
  const lines = [header.join(',')];
  for (let k = 0; k < r.outputs; k++) {
    const row = [
      num(r.timeS[k]!),
      num(r.bedStressPa[k]!),
      num(r.frictionVelocity[k]!),
      num(r.depthMeanU[k]!),
      num(r.depthMeanV[k]!),
    ];
    for (const o of r.organisms) row.push(num(o.total[k]!));
    lines.push(row.join(','));
  }
  return lines.join('\n') + '\n';
}

function main(): void {
  const args = parseArgs(process.argv.slice(2));
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(args.casePath, 'utf8'));
  } catch (error) {
    process.stderr.write(`cannot read ${args.casePath}: ${(error as Error).message}\n`);
    process.exit(1);
  }
  const parsed = parseCase(input);
  if (!parsed.ok) {
    for (const issue of parsed.issues) process.stderr.write(`${issue.message}\n`);
    process.exit(1);
  }
  const run = createRun(parsed.value);
  const t0 = performance.now();
  const result = runToEnd(run);
  const elapsedMs = performance.now() - t0;

  if (args.csv) writeFileSync(args.csv, profilesCsv(result));
  if (args.series) writeFileSync(args.series, seriesCsv(result));
  if (args.summary) {
    const s = result.summary;
    const summary = {
      status: result.status,
      steps: s.steps,
      elapsed_ms: Number(elapsedMs.toFixed(3)),
      layers: result.layers,
      outputs: result.outputs,
      bed_stress_max_pa: s.bedStressMaxPa,
      depth_mean_speed_max_m_s: s.depthMeanSpeedMaxMS,
      surface_speed_max_m_s: s.surfaceSpeedMaxMS,
      eddy_viscosity_max_m2_s: s.eddyViscosityMaxM2S,
      organisms: s.organisms.map((o) => ({
        name: o.name,
        total_initial: o.totalInitial,
        total_final: o.totalFinal,
        bed_initial: o.bedInitial,
        bed_final: o.bedFinal,
      })),
    };
    process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
  }
  if (result.status !== 'ok') {
    process.stderr.write(`run ended early: ${result.status}\n`);
    process.exit(1);
  }
}

main();
