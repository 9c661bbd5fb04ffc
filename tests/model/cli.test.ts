/**
 * The command line on an example case: CSV headers and columns, and the
 * summary keys asked for in the issue.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const dir = mkdtempSync(join(tmpdir(), 'model-cli-'));
const profiles = join(dir, 'profiles.csv');
const series = join(dir, 'series.csv');
let summary: Record<string, unknown>;

function cli(args: string[]): string {
  return execFileSync(process.execPath, ['--import', 'tsx', 'scripts/model-cli.ts', ...args], {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'pipe'],
  });
}

beforeAll(() => {
  const out = cli(['docs/examples/windy-inlet.json', '--csv', profiles, '--series', series, '--summary']);
  summary = JSON.parse(out) as Record<string, unknown>;
}, 60_000);

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('model command line', () => {
  it('writes one profile row per output time per layer with the named columns', () => {
    const lines = readFileSync(profiles, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('time_s,depth_m,u_m_s,v_m_s,eddy_viscosity_m2_s,diatoms,clock_swimmer');
    // 2 days every 15 min: 193 outputs × 40 layers.
    expect(lines.length - 1).toBe(193 * 40);
    for (const line of lines.slice(1, 50)) expect(line.split(',')).toHaveLength(7);
    const firstDepth = Number(lines[1]!.split(',')[1]);
    const lastDepth = Number(lines[40]!.split(',')[1]);
    expect(firstDepth).toBeGreaterThan(0);
    expect(lastDepth).toBeLessThan(9);
    expect(lastDepth).toBeGreaterThan(firstDepth);
  });

  it('writes one series row per output time with the named columns', () => {
    const lines = readFileSync(series, 'utf8').trim().split('\n');
    expect(lines[0]).toBe(
      'time_s,bed_stress_pa,friction_velocity_m_s,depth_mean_u_m_s,depth_mean_v_m_s,diatoms_total,clock_swimmer_total',
    );
    expect(lines.length - 1).toBe(193);
    expect(Number(lines[lines.length - 1]!.split(',')[0])).toBe(172800);
  });

  it('prints a summary with the required keys', () => {
    for (const key of [
      'steps',
      'elapsed_ms',
      'bed_stress_max_pa',
      'depth_mean_speed_max_m_s',
      'surface_speed_max_m_s',
      'eddy_viscosity_max_m2_s',
    ]) {
      expect(typeof summary[key]).toBe('number');
    }
    expect(summary.steps).toBe(5760);
    const organisms = summary.organisms as { name: string; total_initial: number; total_final: number }[];
    expect(organisms.map((o) => o.name)).toEqual(['diatoms', 'clock_swimmer']);
    for (const o of organisms) {
      expect(Number.isFinite(o.total_initial)).toBe(true);
      expect(Number.isFinite(o.total_final)).toBe(true);
    }
  });

  it('refuses an invalid case with a message naming the field', () => {
    const bad = JSON.parse(readFileSync('docs/examples/windy-inlet.json', 'utf8')) as Record<string, unknown>;
    bad.layers = 2;
    const badPath = join(dir, 'bad.json');
    writeFileSync(badPath, JSON.stringify(bad));
    let stderr = '';
    let status = 0;
    try {
      cli([badPath]);
    } catch (error) {
      stderr = String((error as { stderr?: string }).stderr);
      status = (error as { status?: number }).status ?? -1;
    }
    expect(status).toBe(1);
    expect(stderr).toContain('layers:');
  });
});
