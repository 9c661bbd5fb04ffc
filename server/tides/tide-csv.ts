/**
 * Reading uploaded CSV files (RFC 4180, read with papaparse): a constituent table, and a current or
 * level record. Every problem names its row (as numbered in the file: the header is row 1) and its
 * column, and says how to fix it. All or nothing: one problem rejects the file.
 * Formats and examples: docs/tides.md, "Uploads".
 */
import { DateTime } from 'luxon';
import Papa from 'papaparse';
import type { CurrentPart, LevelPart, UploadProblem } from '../../shared/schemas/tides.schema.ts';
import { constituentIndex, resolveConstituentNames, STANDARD_CONSTITUENTS } from '../../shared/tides/constituents.ts';
import { AppError } from '../http/app-error.ts';

/** Rows beyond this are refused (a year of 2-minute samples). */
export const MAX_ROWS = 300_000;
const MAX_PROBLEMS = 50;

interface Table {
  /** Normalised header names, e.g. "Amplitude (m)" → "amplitude_m". */
  header: string[];
  /** Original header names, for messages. */
  original: string[];
  rows: { row: number; cells: string[] }[];
}

class Problems {
  readonly list: UploadProblem[] = [];
  add(row: number | null, column: string | null, message: string): void {
    if (this.list.length >= MAX_PROBLEMS) return;
    const where = [row !== null ? `row ${row}` : null, column !== null ? `column ${column}` : null].filter(Boolean).join(', ');
    this.list.push({ path: where || 'file', row, column, message });
  }
  get count(): number {
    return this.list.length;
  }
  /** Throws the one error an upload answers with, when anything was found. */
  throwIfAny(what: string): void {
    if (this.list.length === 0) return;
    const shown = this.list.slice(0, 5).map((p) => `${p.path}: ${p.message}`);
    const more = this.list.length > 5 ? ` (and ${this.list.length - 5} more${this.list.length >= MAX_PROBLEMS ? ', listing stops at 50' : ''})` : '';
    throw new AppError(
      'validation_failed',
      `The ${what} has ${this.list.length >= MAX_PROBLEMS ? 'at least ' : ''}${this.list.length} problem${this.list.length > 1 ? 's' : ''}: ${shown.join('; ')}${more}. Nothing was stored; correct the file and upload it again.`,
      this.list,
    );
  }
}

export function normaliseHeader(name: string): string {
  return name
    .trim()
    .toLowerCase()
    .replace(/[()[\]]/g, ' ')
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '');
}

/** Splits the text into a header and rows, keeping file row numbers; blank lines are skipped. */
function readTable(text: string, what: string, problems: Problems): Table {
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '') {
    problems.add(null, null, 'the file is empty; the first row must name the columns');
    problems.throwIfAny(what);
  }
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false, delimitersToGuess: [',', ';', '\t', '|'] });
  for (const error of parsed.errors) {
    if (error.code === 'UndetectableDelimiter') continue;
    problems.add(error.row !== undefined ? error.row + 1 : null, null, `${error.message}; check the quotes on this row`);
  }
  const [headerCells, ...body] = parsed.data;
  const original = (headerCells ?? []).map((h) => h.trim());
  const header = original.map(normaliseHeader);
  const seen = new Map<string, number>();
  header.forEach((h, i) => {
    if (h === '') problems.add(1, `${i + 1}`, 'this column has no name; name every column in the first row');
    else if (seen.has(h)) problems.add(1, original[i]!, `the column name is used twice (also column ${seen.get(h)! + 1})`);
    else seen.set(h, i);
  });
  const rows: Table['rows'] = [];
  body.forEach((cells, index) => {
    const row = index + 2;
    if (cells.every((c) => c.trim() === '')) return;
    if (cells.length !== header.length) {
      problems.add(row, null, `has ${cells.length} field${cells.length === 1 ? '' : 's'} but the header has ${header.length}; every row needs one value per column (leave a value empty, not out)`);
      return;
    }
    rows.push({ row, cells: cells.map((c) => c.trim()) });
  });
  if (rows.length === 0 && problems.count === 0) problems.add(null, null, 'the file has a header but no data rows');
  if (rows.length > MAX_ROWS) problems.add(null, null, `the file has ${rows.length} rows; at most ${MAX_ROWS} are accepted (split the record or thin it)`);
  // Header problems stop here; row problems are reported together with those found in the values.
  if (problems.list.some((p) => p.row === 1 || p.row === null)) problems.throwIfAny(what);
  return { header, original, rows };
}

interface ColumnSpec {
  /** Normalised names accepted, each with the factor to SI units. */
  names: Record<string, number>;
  label: string;
}

function findColumn(table: Table, spec: ColumnSpec): { index: number; factor: number; name: string } | null {
  for (const [name, factor] of Object.entries(spec.names)) {
    const index = table.header.indexOf(name);
    if (index >= 0) return { index, factor, name: table.original[index]! };
  }
  return null;
}

const accepted = (spec: ColumnSpec) => Object.keys(spec.names).join(', ');

/** A number cell: empty/NA/NaN give null (missing); anything else that is not a number is a problem. */
function readNumber(text: string, problems: Problems, row: number, column: string, hint: string): number | null | undefined {
  if (text === '' || /^(na|nan|n\/a|null)$/i.test(text)) return null;
  const value = Number(text);
  if (text.trim() !== '' && Number.isFinite(value)) return value;
  const comma = /^-?\d+,\d+$/.test(text) ? ' (write decimals with a point, e.g. 0.42, not a comma)' : '';
  problems.add(row, column, `${JSON.stringify(text)} is not a number${comma}; give ${hint}`);
  return undefined;
}

// ---- Constituent table ----

const TABLE_COLUMNS = {
  name: { label: 'name', names: { name: 1, constituent: 1 } },
  amplitude: {
    label: 'amplitude',
    names: { amplitude: 1, amplitude_m: 1, amplitude_m_s: 1, major: 1, major_m_s: 1, semi_major: 1, semi_major_m_s: 1, amplitude_cm: 0.01, amplitude_cm_s: 0.01, major_cm_s: 0.01 },
  },
  phase: { label: 'phase_deg', names: { phase_deg: 1, phase: 1, g: 1, g_deg: 1, greenwich_phase: 1, greenwich_phase_deg: 1 } },
  minor: { label: 'minor', names: { minor: 1, minor_m_s: 1, semi_minor: 1, semi_minor_m_s: 1, minor_cm_s: 0.01 } },
  inclination: { label: 'inclination_deg', names: { inclination_deg: 1, inclination: 1, inc_deg: 1 } },
  kind: { label: 'kind', names: { kind: 1 } },
} satisfies Record<string, ColumnSpec>;

export interface ConstituentTableFields {
  kind?: 'current' | 'level';
  datumM?: number;
  axisDeg?: number;
}

export interface ConstituentTable {
  current: CurrentPart | null;
  level: LevelPart | null;
}

/**
 * Reads a constituent table: columns name, amplitude, phase_deg; for currents optionally minor and
 * inclination_deg; optionally kind (current or level) per row, else the kind form field.
 */
export function parseConstituentTable(text: string, fields: ConstituentTableFields): ConstituentTable {
  const what = 'constituent table';
  const problems = new Problems();
  const table = readTable(text, what, problems);
  const col = {
    name: findColumn(table, TABLE_COLUMNS.name),
    amplitude: findColumn(table, TABLE_COLUMNS.amplitude),
    phase: findColumn(table, TABLE_COLUMNS.phase),
    minor: findColumn(table, TABLE_COLUMNS.minor),
    inclination: findColumn(table, TABLE_COLUMNS.inclination),
    kind: findColumn(table, TABLE_COLUMNS.kind),
  };
  for (const key of ['name', 'amplitude', 'phase'] as const) {
    if (!col[key]) problems.add(1, TABLE_COLUMNS[key].label, `the column is missing; add a column named one of: ${accepted(TABLE_COLUMNS[key])}`);
  }
  if (!col.kind && !fields.kind) problems.add(1, 'kind', 'say whether the table is of a current or a level: add a kind column (current or level) or send the form field kind');
  if (problems.list.some((p) => p.row === 1)) problems.throwIfAny(what);

  const current: CurrentPart['constituents'] = [];
  const level: LevelPart['constituents'] = [];
  const rowsOf = { current: [] as number[], level: [] as number[] };
  for (const { row, cells } of table.rows) {
    const cell = (c: { index: number } | null) => (c ? cells[c.index]! : '');
    let kind = fields.kind;
    if (col.kind) {
      const given = cell(col.kind).toLowerCase();
      if (given === 'current' || given === 'level') kind = given;
      else if (given !== '' || !fields.kind) {
        problems.add(row, col.kind.name, `${JSON.stringify(cell(col.kind))} is not a kind; write current or level`);
        continue;
      }
    }
    const name = cell(col.name);
    if (name === '') problems.add(row, col.name!.name, 'the constituent name is empty; give a name such as M2');
    else if (constituentIndex(name) < 0) {
      problems.add(row, col.name!.name, `${JSON.stringify(name)} is not a constituent of the standard list; use names such as ${STANDARD_CONSTITUENTS.slice(0, 8).map((d) => d.name).join(', ')}`);
    }
    const unit = kind === 'current' ? 'm/s' : 'm';
    const amplitude = readNumber(cell(col.amplitude), problems, row, col.amplitude!.name, `the amplitude in ${unit}`);
    const phase = readNumber(cell(col.phase), problems, row, col.phase!.name, 'the Greenwich phase lag in degrees');
    const minor = col.minor ? readNumber(cell(col.minor), problems, row, col.minor.name, 'the signed semi-minor axis in m/s') : null;
    const inclination = col.inclination ? readNumber(cell(col.inclination), problems, row, col.inclination.name, 'the inclination in degrees anticlockwise from east') : null;
    if (amplitude === null) problems.add(row, col.amplitude!.name, `the amplitude is empty; give it in ${unit}`);
    if (phase === null) problems.add(row, col.phase!.name, 'the phase is empty; give the Greenwich phase lag in degrees');
    if (typeof amplitude !== 'number' || typeof phase !== 'number' || name === '' || constituentIndex(name) < 0) continue;
    const amp = amplitude * col.amplitude!.factor;
    if (amp < 0) {
      problems.add(row, col.amplitude!.name, 'the amplitude is negative; amplitudes are ≥ 0 (add 180° to the phase instead)');
      continue;
    }
    if (amp > (kind === 'current' ? 10 : 20)) {
      problems.add(row, col.amplitude!.name, `${amp} ${unit} is implausibly large; check the unit (the column is read in ${col.amplitude!.factor === 1 ? unit : `c${unit}`})`);
      continue;
    }
    if (Math.abs(phase) > 360) {
      problems.add(row, col.phase!.name, `${phase}° is outside -360…360; give the phase in degrees`);
      continue;
    }
    if (kind === 'level') {
      if (typeof minor === 'number' || typeof inclination === 'number') {
        problems.add(row, col.minor?.name ?? col.inclination!.name, 'minor and inclination belong to a current; leave them empty on level rows');
        continue;
      }
      level.push({ name, amplitude: amp, phaseDeg: phase });
      rowsOf.level.push(row);
    } else {
      const m = typeof minor === 'number' ? minor * col.minor!.factor : undefined;
      if (m !== undefined && Math.abs(m) > amp) {
        problems.add(row, col.minor!.name, `the minor axis ${m} m/s is longer than the major axis ${amp} m/s; the minor axis is the smaller one`);
        continue;
      }
      current.push({
        name,
        major: amp,
        phaseDeg: phase,
        ...(m !== undefined ? { minor: m } : {}),
        ...(typeof inclination === 'number' ? { inclinationDeg: inclination } : {}),
      });
      rowsOf.current.push(row);
    }
  }
  for (const [kind, list] of [['current', current], ['level', level]] as const) {
    const names = list.map((c) => c.name);
    const seen = new Map<number, number>();
    names.forEach((n, i) => {
      const index = constituentIndex(n);
      const row = rowsOf[kind][i]!;
      if (seen.has(index)) problems.add(row, col.name!.name, `${n} is given twice for the ${kind} (also row ${seen.get(index)}); keep one row per constituent`);
      else seen.set(index, row);
    });
  }
  if (current.length > 0) {
    const withInc = current.filter((c) => c.inclinationDeg !== undefined).length;
    if (withInc !== 0 && withInc !== current.length) {
      problems.add(null, col.inclination?.name ?? 'inclination_deg', 'give an inclination on every current row or on none');
    }
  }
  problems.throwIfAny(what);
  if (current.length === 0 && level.length === 0) {
    problems.add(null, null, 'the table has no constituent rows');
    problems.throwIfAny(what);
  }
  // Names are checked above; resolving again keeps the canonical spelling for storage.
  const canonical = <T extends { name: string }>(list: T[]) => {
    const resolved = resolveConstituentNames(list.map((c) => c.name));
    return resolved.ok ? list.map((c, i) => ({ ...c, name: STANDARD_CONSTITUENTS[resolved.indices[i]!]!.name })) : list;
  };
  let axisDeg: number | null = fields.axisDeg ?? null;
  if (axisDeg === null && current.some((c) => c.inclinationDeg !== undefined)) {
    axisDeg = current.reduce((best, c) => (c.major > best.major ? c : best)).inclinationDeg ?? null;
  }
  return {
    current: current.length ? { axisDeg, constituents: canonical(current) } : null,
    level: level.length ? { datumM: fields.datumM ?? 0, constituents: canonical(level) } : null,
  };
}

// ---- Records ----

const RECORD_COLUMNS = {
  time: { label: 'time', names: { time: 1, time_utc: 1, datetime: 1, date_time: 1, timestamp: 1 } },
  zone: { label: 'zone', names: { zone: 1, time_zone: 1, timezone: 1, tz: 1 } },
  speed: { label: 'speed', names: { speed: 1, speed_m_s: 1, speed_cm_s: 0.01 } },
  direction: { label: 'direction_deg', names: { direction_deg: 1, direction: 1, dir: 1, dir_deg: 1, direction_to_deg: 1 } },
  u: { label: 'u', names: { u: 1, u_m_s: 1, east: 1, east_m_s: 1, u_cm_s: 0.01 } },
  v: { label: 'v', names: { v: 1, v_m_s: 1, north: 1, north_m_s: 1, v_cm_s: 0.01 } },
  level: { label: 'level', names: { level: 1, level_m: 1, height: 1, height_m: 1, water_level: 1, water_level_m: 1 } },
} satisfies Record<string, ColumnSpec>;

export interface ParsedRecord {
  kind: 'current' | 'level';
  /** Sorted, UTC ms. */
  timesMs: Float64Array;
  /** Level, m (NaN = missing); null for a current. */
  level: Float64Array | null;
  /** East and north components, m/s (NaN = missing); null for a level. */
  east: Float64Array | null;
  north: Float64Array | null;
  /** Which columns the values came from. */
  columns: string[];
}

const OFFSET = /(Z|[+-]\d{2}(:?\d{2})?)$/i;

function zoneOf(text: string): string | null {
  if (/^[+-]\d{2}(:?\d{2})?$/.test(text)) return `UTC${text}`;
  if (/^(utc|gmt|z)$/i.test(text)) return 'UTC';
  return text;
}

/**
 * Reads a current record (time with speed and direction, or u and v) or a level record (time and
 * level). Times are ISO-8601 with a zone offset (2025-03-01T10:20:00Z, …+01:00), or local times with
 * a zone column (an IANA name such as Europe/London, or an offset such as +01:00).
 * Direction is the direction the current flows toward, degrees clockwise from true north.
 * An empty value (or NA) is a missing sample; an empty time is a problem.
 */
export function parseRecord(text: string): ParsedRecord {
  const what = 'record';
  const problems = new Problems();
  const table = readTable(text, what, problems);
  const col = Object.fromEntries(Object.entries(RECORD_COLUMNS).map(([key, spec]) => [key, findColumn(table, spec)])) as Record<keyof typeof RECORD_COLUMNS, ReturnType<typeof findColumn>>;
  if (!col.time) problems.add(1, 'time', `the column is missing; add a time column named one of: ${accepted(RECORD_COLUMNS.time)}`);
  const hasCurrent = Boolean(col.speed || col.direction || col.u || col.v);
  if (col.level && hasCurrent) problems.add(1, null, 'the file has both level and current columns; upload a level record and a current record separately');
  if (!col.level && !hasCurrent) {
    problems.add(1, null, `no value column found; give level (m), or speed (m/s) with direction_deg, or u and v (m/s). Accepted names: ${accepted(RECORD_COLUMNS.level)}; ${accepted(RECORD_COLUMNS.speed)}; ${accepted(RECORD_COLUMNS.u)}; ${accepted(RECORD_COLUMNS.v)}`);
  }
  if (hasCurrent && !col.level) {
    const polar = Boolean(col.speed || col.direction);
    const cartesian = Boolean(col.u || col.v);
    if (polar && cartesian) problems.add(1, null, 'give either speed and direction or u and v, not both');
    else if (polar && !(col.speed && col.direction)) problems.add(1, col.speed ? 'direction_deg' : 'speed', `speed and direction go together; add the ${col.speed ? 'direction_deg' : 'speed'} column`);
    else if (cartesian && !(col.u && col.v)) problems.add(1, col.u ? 'v' : 'u', `u and v go together; add the ${col.u ? 'v (north, m/s)' : 'u (east, m/s)'} column`);
  }
  if (problems.list.some((p) => p.row === 1)) problems.throwIfAny(what);

  const kind = col.level ? 'level' : 'current';
  const times: number[] = [];
  const a: number[] = [];
  const b: number[] = [];
  const rowOf: number[] = [];
  for (const { row, cells } of table.rows) {
    const timeText = cells[col.time!.index]!;
    let ms: number | null = null;
    if (timeText === '') problems.add(row, col.time!.name, 'the time is empty; give an ISO-8601 time such as 2025-03-01T10:20:00Z');
    else {
      const zoneText = col.zone ? cells[col.zone.index]! : '';
      const iso = timeText.replace(' ', 'T');
      let parsed: DateTime;
      if (OFFSET.test(iso)) parsed = DateTime.fromISO(iso, { setZone: true });
      else if (zoneText !== '') parsed = DateTime.fromISO(iso, { zone: zoneOf(zoneText)! });
      else {
        problems.add(row, col.time!.name, `${JSON.stringify(timeText)} has no time zone; write it with an offset (2025-03-01T10:20:00Z or 2025-03-01T11:20:00+01:00) or add a zone column (e.g. Europe/London)`);
        parsed = DateTime.invalid('no zone');
      }
      if (parsed.isValid) ms = parsed.toMillis();
      else if (parsed.invalidReason === 'unsupported zone') problems.add(row, col.zone!.name, `${JSON.stringify(zoneText)} is not a time zone; give an IANA name such as Europe/London or an offset such as +01:00`);
      else if (parsed.invalidReason !== 'no zone') problems.add(row, col.time!.name, `${JSON.stringify(timeText)} is not an ISO-8601 time; write e.g. 2025-03-01T10:20:00Z`);
    }
    let x: number | null | undefined;
    let y: number | null | undefined = null;
    if (kind === 'level') {
      x = readNumber(cells[col.level!.index]!, problems, row, col.level!.name, 'the level in m');
      if (typeof x === 'number') x *= col.level!.factor;
    } else if (col.speed && col.direction) {
      const speed = readNumber(cells[col.speed.index]!, problems, row, col.speed.name, 'the speed in m/s');
      const direction = readNumber(cells[col.direction.index]!, problems, row, col.direction.name, 'the direction in degrees clockwise from north');
      if (typeof speed === 'number' && speed < 0) problems.add(row, col.speed.name, `${speed} is negative; a speed is ≥ 0 (the direction gives the way it flows)`);
      else if (typeof direction === 'number' && (direction < 0 || direction > 360)) problems.add(row, col.direction.name, `${direction}° is outside 0…360; give the direction toward which the current flows, clockwise from north`);
      else if (typeof speed === 'number' && typeof direction === 'number') {
        const s = speed * col.speed.factor;
        const rad = (direction * Math.PI) / 180;
        x = s * Math.sin(rad);
        y = s * Math.cos(rad);
      } else if (speed === null || direction === null) {
        x = null;
      }
    } else {
      const u = readNumber(cells[col.u!.index]!, problems, row, col.u!.name, 'the east component in m/s');
      const v = readNumber(cells[col.v!.index]!, problems, row, col.v!.name, 'the north component in m/s');
      if (typeof u === 'number' && typeof v === 'number') {
        x = u * col.u!.factor;
        y = v * col.v!.factor;
      } else if (u === null || v === null) x = null;
    }
    if (ms === null || x === undefined) continue;
    times.push(ms);
    a.push(x ?? Number.NaN);
    b.push(x === null || y === null ? Number.NaN : y);
    rowOf.push(row);
  }
  problems.throwIfAny(what);

  const order = Array.from({ length: times.length }, (_, i) => i).sort((i, j) => times[i]! - times[j]!);
  for (let k = 1; k < order.length; k++) {
    const i = order[k]!;
    const j = order[k - 1]!;
    if (times[i] === times[j]) {
      const [first, second] = [rowOf[i]!, rowOf[j]!].sort((p, q) => p - q);
      problems.add(second!, col.time!.name, `the time ${new Date(times[i]!).toISOString()} is also on row ${first}; keep one row per time`);
    }
  }
  problems.throwIfAny(what);

  const timesMs = new Float64Array(order.map((i) => times[i]!));
  const first = new Float64Array(order.map((i) => a[i]!));
  const second = new Float64Array(order.map((i) => b[i]!));
  return {
    kind,
    timesMs,
    level: kind === 'level' ? first : null,
    east: kind === 'current' ? first : null,
    north: kind === 'current' ? second : null,
    columns: Object.values(col)
      .filter((c): c is NonNullable<typeof c> => c !== null)
      .map((c) => c.name),
  };
}
