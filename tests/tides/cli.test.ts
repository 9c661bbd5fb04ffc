import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, it } from 'vitest';
import { STANDARD_CONSTITUENT_NAMES } from '../../shared/tides/constituents.ts';
import { nodalTable } from '../../shared/tides/nodal.ts';
import { predictLevel, regularTimes } from '../../shared/tides/predict.ts';

const ROOT = path.resolve(import.meta.dirname, '../..');
const LEVEL_FILE = path.join(ROOT, 'docs/examples/tides/harbour-level.json');
const CURRENT_FILE = path.join(ROOT, 'docs/examples/tides/sound-current.json');
const scratch = mkdtempSync(path.join(os.tmpdir(), 'tides-cli-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** Runs the command line as the npm script does; the tests run concurrently to keep the suite quick. */
function cli(...args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/tides-cli.ts', ...args], { cwd: ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (stdout += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe.concurrent('tides command line', () => {
  it('prints f and u of every standard constituent as JSON for a date', async ({ expect }) => {
    const r = await cli('nodal', '--date', '2025-01-01T00:00:00Z');
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout) as Record<string, { f: number; u_deg: number }>;
    expect(Object.keys(json)).toEqual([...STANDARD_CONSTITUENT_NAMES]);
    const table = nodalTable(Date.parse('2025-01-01T00:00:00Z'));
    for (const [name, v] of Object.entries(json)) {
      expect(v.f).toBeCloseTo(table[name]!.f, 6);
      expect(v.u_deg).toBeCloseTo(table[name]!.u, 4);
    }
    // N ≈ 1.5° on 2025-01-01: close to the N = 0 values of REFERENCES §8 [CALC].
    expect(Math.abs(json.M2!.f - 0.9632)).toBeLessThan(5e-4);
    expect(Math.abs(json.K1!.f - 1.1128)).toBeLessThan(5e-4);
    expect(Math.abs(json.O1!.f - 1.1828)).toBeLessThan(5e-4);
  });

  it('prints a CSV of predicted level with one row per step, start and end included', async ({ expect }) => {
    const r = await cli('predict', '--constituents', LEVEL_FILE, '--start', '2025-03-01T00:00:00Z', '--end', '2025-03-02T00:00:00Z', '--step-min', '10');
    expect(r.code).toBe(0);
    const lines = r.stdout.trimEnd().split('\n');
    expect(lines[0]).toBe('time_utc,value');
    expect(lines).toHaveLength(1 + 145);
    expect(lines[1]!.startsWith('2025-03-01T00:00:00Z,')).toBe(true);
    expect(lines[145]!.startsWith('2025-03-02T00:00:00Z,')).toBe(true);
    // The values are those of the library with the file's datum (2.35 m).
    const start = Date.parse('2025-03-01T00:00:00Z');
    const lib = predictLevel(
      [
        { name: 'M2', amplitude: 1.42, phaseDeg: 118 },
        { name: 'S2', amplitude: 0.47, phaseDeg: 152 },
        { name: 'N2', amplitude: 0.28, phaseDeg: 99 },
        { name: 'K2', amplitude: 0.13, phaseDeg: 149 },
        { name: 'K1', amplitude: 0.11, phaseDeg: 201 },
        { name: 'O1', amplitude: 0.09, phaseDeg: 47 },
        { name: 'M4', amplitude: 0.04, phaseDeg: 310 },
      ],
      regularTimes(start, start + 24 * 3_600_000, 600_000),
      { datum: 2.35 },
    );
    if (!lib.ok) throw new Error(lib.message);
    lines.slice(1).forEach((line, i) => expect(Number(line.split(',')[1])).toBeCloseTo(lib.values[i]!, 6));
  });

  it('prints a current component from a file of tidal ellipses', async ({ expect }) => {
    const r = await cli('predict', '--constituents', CURRENT_FILE, '--start', '2025-03-01', '--end', '2025-03-01T06:00', '--step-min', '30', '--component', 'speed');
    expect(r.code).toBe(0);
    const rows = r.stdout.trimEnd().split('\n').slice(1);
    expect(rows).toHaveLength(13);
    for (const row of rows) expect(Number(row.split(',')[1])).toBeGreaterThanOrEqual(0);
  });

  it('exits with 2 and says why for a step that is not a number', async ({ expect }) => {
    const r = await cli('predict', '--constituents', LEVEL_FILE, '--start', '2025-03-01', '--end', '2025-03-02', '--step-min', 'ten');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--step-min must be a positive number');
    expect(r.stdout).toBe('');
  });

  it('exits with 2 for an unknown command, a bad date and a missing option', async ({ expect }) => {
    expect((await cli('tabulate')).code).toBe(2);
    const bad = await cli('nodal', '--date', 'yesterday');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain('--date must be an ISO-8601 date');
    const missing = await cli('predict', '--start', '2025-03-01', '--end', '2025-03-02');
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('--constituents is required');
  });

  it('exits with 2 and names an unknown constituent in the file', async ({ expect }) => {
    const file = path.join(scratch, 'unknown.json');
    writeFileSync(file, JSON.stringify([{ name: 'M2', amplitude: 1, phase_deg: 0 }, { name: 'XX3', amplitude: 0.1, phase_deg: 0 }]));
    const r = await cli('predict', '--constituents', file, '--start', '2025-03-01', '--end', '2025-03-02');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('[1].name');
    expect(r.stderr).toContain('"XX3"');
  });
});
