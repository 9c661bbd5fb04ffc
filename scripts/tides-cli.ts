/**
 * Tide command line (see docs/tides.md).
 *   npm run -s tides -- nodal --date ISO-8601
 *   npm run -s tides -- predict --constituents FILE.json --start ISO --end ISO [--step-min 10] [--component along]
 * Bad arguments or a bad constituent file print the reason and exit with 2.
 */
import { readFileSync } from 'node:fs';
import { parseConstituentFile } from '../shared/tides/constituent-file.schema.ts';
import { nodalTable } from '../shared/tides/nodal.ts';
import { predictCurrent, predictLevel, regularTimes } from '../shared/tides/predict.ts';

const USAGE = [
  'usage: tides nodal --date ISO-8601',
  '       tides predict --constituents FILE.json --start ISO-8601 --end ISO-8601 [--step-min MINUTES] [--component along|across|east|north|speed]',
].join('\n');

const MAX_ROWS = 1_000_000;
const COMPONENTS = ['along', 'across', 'east', 'north', 'speed'] as const;
type Component = (typeof COMPONENTS)[number];

class UsageError extends Error {}

function usageError(message: string): never {
  throw new UsageError(message);
}

const ISO = /^\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/;

/** ISO-8601 date or date-time; without a zone it is read as UTC. */
function parseIsoMs(flag: string, value: string): number {
  if (!ISO.test(value)) usageError(`${flag} must be an ISO-8601 date or date-time, e.g. 2025-01-01T00:00:00Z (got ${JSON.stringify(value)})`);
  const hasZone = /T.*(Z|[+-]\d{2}:?\d{2})$/.test(value);
  const text = value.includes('T') && !hasZone ? `${value}Z` : value;
  const ms = Date.parse(text);
  if (!Number.isFinite(ms)) usageError(`${flag} is not a valid date: ${JSON.stringify(value)}`);
  return ms;
}

function parseFlags(argv: string[], allowed: readonly string[]): Map<string, string> {
  const flags = new Map<string, string>();
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (!arg.startsWith('--')) usageError(`unexpected argument ${JSON.stringify(arg)}`);
    const [name, inline] = arg.includes('=') ? [arg.slice(0, arg.indexOf('=')), arg.slice(arg.indexOf('=') + 1)] : [arg, undefined];
    if (!allowed.includes(name)) usageError(`unknown option ${name}`);
    const value = inline ?? argv[++i];
    if (value === undefined) usageError(`${name} needs a value`);
    if (flags.has(name)) usageError(`${name} given twice`);
    flags.set(name, value);
  }
  return flags;
}

function required(flags: Map<string, string>, name: string): string {
  const value = flags.get(name);
  if (value === undefined) usageError(`${name} is required`);
  return value;
}

/** Nine significant digits, without trailing zeros. */
function num(x: number): string {
  return String(Number(x.toPrecision(9)));
}

function isoSeconds(ms: number): string {
  const iso = new Date(ms).toISOString();
  return iso.endsWith('.000Z') ? `${iso.slice(0, -5)}Z` : iso;
}

function nodal(argv: string[]): string {
  const flags = parseFlags(argv, ['--date']);
  const ms = parseIsoMs('--date', required(flags, '--date'));
  const table = nodalTable(ms);
  const out: Record<string, { f: number; u_deg: number }> = {};
  for (const [name, { f, u }] of Object.entries(table)) {
    out[name] = { f: Number(f.toFixed(6)), u_deg: Number(u.toFixed(4)) };
  }
  return `${JSON.stringify(out, null, 2)}\n`;
}

function predict(argv: string[]): string {
  const flags = parseFlags(argv, ['--constituents', '--start', '--end', '--step-min', '--component']);
  const path = required(flags, '--constituents');
  const startMs = parseIsoMs('--start', required(flags, '--start'));
  const endMs = parseIsoMs('--end', required(flags, '--end'));
  if (endMs < startMs) usageError('--end must not be before --start');
  const stepText = flags.get('--step-min') ?? '10';
  const stepMin = Number(stepText);
  if (!/^\d+(\.\d+)?$/.test(stepText) || !(stepMin > 0)) usageError(`--step-min must be a positive number of minutes (got ${JSON.stringify(stepText)})`);
  const rows = Math.floor((endMs - startMs) / (stepMin * 60_000)) + 1;
  if (rows > MAX_ROWS) usageError(`that would be ${rows} rows; at most ${MAX_ROWS} are allowed (widen --step-min)`);
  const componentText = flags.get('--component') ?? 'along';
  if (!COMPONENTS.includes(componentText as Component)) usageError(`--component must be one of ${COMPONENTS.join(', ')}`);
  const component = componentText as Component;

  let raw: string;
  try {
    raw = readFileSync(path, 'utf8');
  } catch (e) {
    usageError(`cannot read ${path}: ${(e as Error).message}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(raw);
  } catch (e) {
    usageError(`${path} is not valid JSON: ${(e as Error).message}`);
  }
  const parsed = parseConstituentFile(json);
  if (!parsed.ok) usageError(`${path} is not a valid constituent file:\n  ${parsed.problems.join('\n  ')}`);
  const file = parsed.file;
  const times = regularTimes(startMs, endMs, stepMin * 60_000);

  let values: Float64Array;
  if (file.kind === 'level') {
    if (flags.has('--component')) usageError('--component applies to a current file only');
    const result = predictLevel(file.constituents, times, { datum: file.datum });
    if (!result.ok) usageError(`${path}: ${result.message}`);
    values = result.values;
  } else {
    const result = predictCurrent(file.constituents, times, file.axisDeg !== undefined ? { axisDeg: file.axisDeg } : {});
    if (!result.ok) usageError(`${path}: ${result.message}`);
    const picked = component === 'east' ? result.east : component === 'north' ? result.north : result[component];
    if (!picked) usageError(`--component ${component} needs inclination_deg on every constituent`);
    values = picked;
  }
  const lines = ['time_utc,value'];
  for (let i = 0; i < times.length; i++) lines.push(`${isoSeconds(times[i]!)},${num(values[i]!)}`);
  return `${lines.join('\n')}\n`;
}

function main(argv: string[]): number {
  const [command, ...rest] = argv;
  try {
    if (command === 'nodal') process.stdout.write(nodal(rest));
    else if (command === 'predict') process.stdout.write(predict(rest));
    else if (command === undefined || command === '--help' || command === '-h') {
      process.stderr.write(`${USAGE}\n`);
      return 2;
    } else usageError(`unknown command ${JSON.stringify(command)}`);
  } catch (e) {
    if (e instanceof UsageError) {
      process.stderr.write(`tides: ${e.message}\n${USAGE}\n`);
      return 2;
    }
    throw e;
  }
  return 0;
}

process.exitCode = main(process.argv.slice(2));
