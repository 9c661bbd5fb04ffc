/**
 * Reading a lab's result sheet (RFC 4180 CSV, read with papaparse) through a column mapping chosen by
 * the user. Each row is validated with zod; every problem names its row (as numbered in the file: the
 * header is row 1) and its column, and says how to fix it. All or nothing: the caller stores nothing
 * while any problem remains.
 */
import { DateTime } from 'luxon';
import Papa from 'papaparse';
import { z } from 'zod';
import { LAB_FIELD_LABELS, LAB_FIELDS, type ColumnMapping, type LabField, type SamplingMethod, type UploadProblem } from '../../shared/schemas/lab.schema.ts';

export const MAX_LAB_ROWS = 20_000;
const MAX_PROBLEMS = 200;

export interface LabSite {
  id: string;
  name: string;
}

export interface ParsedLabRow {
  row: number;
  siteId: string;
  sampleId: string;
  sampledAt: Date;
  depthTopM: number;
  depthBottomM: number;
  method: SamplingMethod;
  taxon: string;
  cellsPerL: number;
  detectionLimit: number;
  analyst: string | null;
  lab: string | null;
}

export interface LabTable {
  columns: string[];
  rows: { row: number; cells: string[] }[];
  problems: UploadProblem[];
}

const problem = (row: number | null, column: string | null, message: string): UploadProblem => ({
  path: [row !== null ? `row ${row}` : null, column !== null ? `column ${column}` : null].filter(Boolean).join(', ') || 'file',
  row,
  column,
  message,
});

const normalise = (name: string) =>
  name
    .trim()
    .toLowerCase()
    .replace(/[()[\]/]/g, ' ')
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '');

/** Column names (normalised) recognised for each field, for the suggested mapping. */
const KNOWN_NAMES: Record<LabField, string[]> = {
  sampleId: ['sample_id', 'sampleid', 'sample', 'sample_no', 'sample_number', 'sample_ref', 'sample_code'],
  site: ['site', 'site_name', 'site_id', 'location', 'station', 'site_code'],
  sampledAt: ['sampled_at', 'sampled_at_utc', 'time_sampled', 'date_time_utc', 'datetime_utc', 'time_utc', 'sampling_time', 'date_time_sampled', 'date_sampled', 'sampled', 'datetime', 'date_time', 'time', 'collected_at', 'collection_time', 'timestamp', 'event_date', 'eventdate'],
  zone: ['zone', 'time_zone', 'timezone', 'tz', 'utc_offset'],
  depthM: ['depth', 'depth_m', 'depth_range', 'depth_range_m', 'sample_depth', 'sample_depth_m'],
  depthTopM: ['depth_top', 'depth_top_m', 'top_m', 'top', 'depth_from', 'depth_from_m', 'min_depth', 'min_depth_m', 'minimumdepthinmeters'],
  depthBottomM: ['depth_bottom', 'depth_bottom_m', 'bottom_m', 'bottom', 'depth_to', 'depth_to_m', 'max_depth', 'max_depth_m', 'maximumdepthinmeters'],
  method: ['method', 'sampling_method', 'sample_method', 'sample_type', 'gear', 'samplingprotocol'],
  taxon: ['taxon', 'species', 'organism', 'scientific_name', 'scientificname', 'taxa', 'genus', 'taxon_name'],
  cellsPerL: ['cells_per_l', 'cells_l', 'cells_per_litre', 'cells_per_liter', 'cells_litre', 'cells_liter', 'cells', 'concentration', 'concentration_cells_l', 'abundance', 'count_cells_l', 'organismquantity'],
  detectionLimit: ['detection_limit', 'detection_limit_cells_l', 'dl', 'lod', 'limit_of_detection', 'detection_limit_cells_per_l'],
  analyst: ['analyst', 'counted_by', 'analysed_by', 'analyzed_by'],
  lab: ['lab', 'laboratory', 'lab_name'],
};

/** Splits the text into columns and rows, keeping file row numbers; blank lines are skipped. */
export function readLabTable(text: string): LabTable {
  const problems: UploadProblem[] = [];
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '') return { columns: [], rows: [], problems: [problem(null, null, 'the file is empty; the first row must name the columns')] };
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false, delimitersToGuess: [',', ';', '\t', '|'] });
  for (const error of parsed.errors) {
    if (error.code === 'UndetectableDelimiter') continue;
    problems.push(problem(error.row !== undefined ? error.row + 1 : null, null, `${error.message}; check the quotes on this row`));
  }
  const [headerCells, ...body] = parsed.data;
  const columns = (headerCells ?? []).map((h) => h.trim());
  const seen = new Map<string, number>();
  columns.forEach((name, i) => {
    if (name === '') problems.push(problem(1, `${i + 1}`, 'this column has no name; name every column in the first row'));
    else if (seen.has(name.toLowerCase())) problems.push(problem(1, name, `the column name is used twice (also column ${seen.get(name.toLowerCase())! + 1}); give each column its own name`));
    else seen.set(name.toLowerCase(), i);
  });
  const rows: LabTable['rows'] = [];
  body.forEach((cells, index) => {
    const row = index + 2;
    if (cells.every((c) => c.trim() === '')) return;
    if (cells.length !== columns.length) {
      problems.push(problem(row, null, `has ${cells.length} field${cells.length === 1 ? '' : 's'} but the header has ${columns.length}; every row needs one value per column (leave a value empty, not out)`));
      return;
    }
    rows.push({ row, cells: cells.map((c) => c.trim()) });
  });
  if (rows.length === 0 && problems.length === 0) problems.push(problem(null, null, 'the file has a header but no data rows'));
  if (rows.length > MAX_LAB_ROWS) problems.push(problem(null, null, `the file has ${rows.length} rows; at most ${MAX_LAB_ROWS} are accepted (split it)`));
  return { columns, rows, problems };
}

/** The mapping found from the column names. */
export function suggestMapping(columns: readonly string[]): ColumnMapping {
  const mapping: ColumnMapping = {};
  const byName = new Map(columns.map((c) => [normalise(c), c]));
  const taken = new Set<string>();
  for (const field of LAB_FIELDS) {
    for (const name of KNOWN_NAMES[field]) {
      const column = byName.get(name);
      if (column && !taken.has(column)) {
        mapping[field] = column;
        taken.add(column);
        break;
      }
    }
  }
  // One depth column and a top/bottom pair are alternatives: a pair wins.
  if (mapping.depthTopM && mapping.depthBottomM) delete mapping.depthM;
  return mapping;
}

/** Problems of the mapping itself: columns that do not exist, required fields left unmapped. */
export function mappingProblems(columns: readonly string[], mapping: ColumnMapping): UploadProblem[] {
  const problems: UploadProblem[] = [];
  const known = new Set(columns);
  const used = new Map<string, LabField>();
  for (const field of LAB_FIELDS) {
    const column = mapping[field];
    if (column === undefined) continue;
    if (!known.has(column)) problems.push(problem(1, column, `the file has no column named ${JSON.stringify(column)} (mapped to ${LAB_FIELD_LABELS[field]}); choose one of: ${columns.join(', ')}`));
    else if (used.has(column)) problems.push(problem(1, column, `the column is mapped to both ${LAB_FIELD_LABELS[used.get(column)!]} and ${LAB_FIELD_LABELS[field]}; map it to one`));
    else used.set(column, field);
  }
  const required: LabField[] = ['sampleId', 'site', 'sampledAt', 'method', 'taxon', 'cellsPerL', 'detectionLimit'];
  for (const field of required) {
    if (!mapping[field]) problems.push(problem(1, null, `no column is mapped to ${LAB_FIELD_LABELS[field]}; add the column to the file or map an existing one`));
  }
  const range = Boolean(mapping.depthTopM || mapping.depthBottomM);
  if (!mapping.depthM && !range) problems.push(problem(1, null, 'no column is mapped to the depth; map a depth column (5, or 0-10 for a range) or the top and bottom of the range'));
  if (mapping.depthM && range) problems.push(problem(1, null, 'map either one depth column or the top and bottom of the range, not both'));
  if (range && !(mapping.depthTopM && mapping.depthBottomM)) problems.push(problem(1, null, 'the top and bottom of the depth range go together; map both'));
  return problems;
}

const OFFSET = /(Z|[+-]\d{2}(:?\d{2})?)$/i;

function zoneOf(text: string): string {
  if (/^[+-]\d{2}(:?\d{2})?$/.test(text)) return `UTC${text}`;
  if (/^(utc|gmt|z)$/i.test(text)) return 'UTC';
  return text;
}

const METHODS: Record<string, SamplingMethod> = {
  hose: 'hose',
  tube: 'hose',
  lund_tube: 'hose',
  integrated: 'hose',
  integrated_tube: 'hose',
  bottle: 'bottle',
  niskin: 'bottle',
  discrete: 'bottle',
  discrete_bottle: 'bottle',
};

function number(text: string, ctx: z.RefinementCtx, hint: string): number | undefined {
  const value = Number(text);
  if (text !== '' && Number.isFinite(value)) return value;
  const comma = /^-?\d+,\d+$/.test(text) ? ' (write decimals with a point, e.g. 0.5, not a comma)' : '';
  ctx.addIssue({ code: 'custom', message: text === '' ? `the value is empty; give ${hint}` : `${JSON.stringify(text)} is not a number${comma}; give ${hint}` });
  return undefined;
}

/** A zod schema for one row's cells by field; issues carry the field as their path. */
function rowSchema(sites: readonly LabSite[]) {
  const byId = new Map(sites.map((s) => [s.id.toLowerCase(), s.id]));
  const byName = new Map(sites.map((s) => [s.name.trim().toLowerCase(), s.id]));
  const cell = z.string().default('');
  const optionalText = cell.transform((t) => (t === '' ? null : t.slice(0, 120)));
  return z
    .object({
      sampleId: cell.pipe(z.string().min(1, 'the sample id is empty; give the lab\'s sample id').max(100, 'the sample id is longer than 100 characters')),
      site: cell.transform((text, ctx) => {
        const id = byId.get(text.toLowerCase()) ?? byName.get(text.toLowerCase());
        if (id) return id;
        const names = sites.map((s) => s.name).join('; ');
        ctx.addIssue({ code: 'custom', message: text === '' ? `the site is empty; give the site's name (${names}) or id` : `no site of this organisation is named ${JSON.stringify(text)}; use a site's name as written in Planktide (${names}) or its id` });
        return z.NEVER;
      }),
      sampledAt: cell,
      zone: cell,
      depthM: cell,
      depthTopM: cell,
      depthBottomM: cell,
      method: cell.transform((text, ctx) => {
        const method = METHODS[normalise(text)];
        if (method) return method;
        ctx.addIssue({ code: 'custom', message: text === '' ? 'the method is empty; write hose (an integrated tube sample over a depth range) or bottle (one depth)' : `${JSON.stringify(text)} is not a sampling method; write hose (an integrated tube sample over a depth range) or bottle (one depth)` });
        return z.NEVER;
      }),
      taxon: cell.pipe(z.string().min(1, 'the taxon is empty; give the taxon as the lab names it, e.g. Dinophysis acuta').max(200)),
      cellsPerL: cell.transform((text, ctx) => {
        // "<40" (not detected, limit 40) is how many labs write a count under the detection limit.
        if (/^<\s*\d/.test(text)) return { value: 0, lessThan: Number(text.replace(/^<\s*/, '')) };
        const value = number(text, ctx, 'the count in cells per litre (0 or <limit when none were seen)');
        if (value === undefined) return z.NEVER;
        if (value < 0) {
          ctx.addIssue({ code: 'custom', message: `${value} is negative; a count is ≥ 0 cells/L` });
          return z.NEVER;
        }
        return { value, lessThan: null as number | null };
      }),
      detectionLimit: cell,
      analyst: optionalText,
      lab: optionalText,
    })
    .transform((r, ctx) => {
      const issue = (path: LabField, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
      // Time, with its zone.
      let sampledAt: Date | undefined;
      const iso = r.sampledAt.replace(' ', 'T');
      if (r.sampledAt === '') issue('sampledAt', 'the time sampled is empty; give an ISO-8601 time with its zone, e.g. 2026-12-01T10:20:00+00:00');
      else {
        let parsed: DateTime | null = null;
        if (OFFSET.test(iso)) parsed = DateTime.fromISO(iso, { setZone: true });
        else if (r.zone !== '') parsed = DateTime.fromISO(iso, { zone: zoneOf(r.zone) });
        else issue('sampledAt', `${JSON.stringify(r.sampledAt)} has no time zone; write it with an offset (2026-12-01T10:20:00Z or 2026-12-01T11:20:00+01:00) or map a zone column (e.g. Europe/London)`);
        if (parsed?.isValid) sampledAt = parsed.toJSDate();
        else if (parsed?.invalidReason === 'unsupported zone') issue('zone', `${JSON.stringify(r.zone)} is not a time zone; give an IANA name such as Europe/London or an offset such as +01:00`);
        else if (parsed) issue('sampledAt', `${JSON.stringify(r.sampledAt)} is not an ISO-8601 time; write e.g. 2026-12-01T10:20:00+00:00`);
      }
      if (sampledAt && sampledAt.getTime() > Date.now() + 86_400_000) issue('sampledAt', `${sampledAt.toISOString()} is in the future; check the date and its zone`);

      // Depth: one column ("5", "0-10") or a top and bottom pair.
      let top: number | undefined;
      let bottom: number | undefined;
      const depthField: LabField = r.depthTopM !== '' || r.depthBottomM !== '' ? 'depthTopM' : 'depthM';
      const readDepth = (text: string, field: LabField, what: string) => {
        const value = Number(text.replace(/\s*m$/i, ''));
        if (text !== '' && Number.isFinite(value)) {
          if (value < 0) issue(field, `${value} is negative; depths are metres below the surface, positive down`);
          else if (value > 12000) issue(field, `${value} m is deeper than any sea; give the depth in metres`);
          else return value;
        } else issue(field, text === '' ? `the ${what} is empty; give it in m below the surface` : `${JSON.stringify(text)} is not a depth; give the ${what} in m below the surface`);
        return undefined;
      };
      if (depthField === 'depthM') {
        const range = /^\s*(\d+(?:\.\d+)?)\s*(?:-|–|to)\s*(\d+(?:\.\d+)?)\s*(m)?\s*$/i.exec(r.depthM);
        if (range) {
          top = Number(range[1]);
          bottom = Number(range[2]);
        } else {
          top = readDepth(r.depthM, 'depthM', 'depth (or range such as 0-10)');
          bottom = top;
        }
      } else {
        top = readDepth(r.depthTopM, 'depthTopM', 'top of the depth range');
        bottom = r.method === 'bottle' && r.depthBottomM === '' ? top : readDepth(r.depthBottomM, 'depthBottomM', 'bottom of the depth range');
      }
      if (top !== undefined && bottom !== undefined) {
        const where = depthField === 'depthM' ? 'depthM' : 'depthBottomM';
        if (bottom < top) issue(where, `the range ${top}-${bottom} m runs upward; give the top first (the smaller depth), e.g. ${bottom}-${top}`);
        else if (r.method === 'bottle' && bottom !== top) issue(where, `a bottle samples one depth but ${top}-${bottom} m is a range; give one depth, or write hose as the method`);
        else if (r.method === 'hose' && bottom === top) issue(where, `a hose sample covers a depth range but only ${top} m is given; give the range as top-bottom, e.g. 0-${top || 10}`);
      }

      // Detection limit: its own column, or the limit of a "<limit" count.
      let detectionLimit: number | undefined;
      if (r.detectionLimit === '' && r.cellsPerL.lessThan !== null) detectionLimit = r.cellsPerL.lessThan;
      else {
        const value = Number(r.detectionLimit);
        if (r.detectionLimit !== '' && Number.isFinite(value) && value > 0) detectionLimit = value;
        else issue('detectionLimit', r.detectionLimit === '' ? 'the detection limit is empty; give the lowest count the lab can see, in cells/L (e.g. 40 for 25 mL settled)' : `${JSON.stringify(r.detectionLimit)} is not a detection limit; give a number of cells/L above 0`);
      }
      if (sampledAt === undefined || top === undefined || bottom === undefined || detectionLimit === undefined) return z.NEVER;
      return {
        siteId: r.site,
        sampleId: r.sampleId,
        sampledAt,
        depthTopM: top,
        depthBottomM: bottom,
        method: r.method,
        taxon: r.taxon,
        cellsPerL: r.cellsPerL.value,
        detectionLimit,
        analyst: r.analyst,
        lab: r.lab,
      };
    });
}

export interface ParsedSheet {
  columns: string[];
  mapping: ColumnMapping;
  /** Problems of the file or of the mapping. */
  fileProblems: UploadProblem[];
  rows: { row: number; values: Partial<Record<LabField, string>>; problems: UploadProblem[]; parsed: ParsedLabRow | null }[];
}

/**
 * Reads every row of a sheet through the mapping (the suggested one when none is given). Also flags a
 * sample id and taxon given twice in the file.
 */
export function parseLabSheet(text: string, sites: readonly LabSite[], given: ColumnMapping | null): ParsedSheet {
  const table = readLabTable(text);
  const mapping = given ?? suggestMapping(table.columns);
  const fileProblems = [...table.problems];
  if (table.columns.length > 0) fileProblems.push(...mappingProblems(table.columns, mapping));
  const mappingBroken = fileProblems.some((p) => p.row === 1 || p.row === null);
  const index = new Map(table.columns.map((c, i) => [c, i]));
  const schema = rowSchema(sites);
  const seen = new Map<string, number>();
  const rows: ParsedSheet['rows'] = [];
  for (const { row, cells } of table.rows) {
    const values: Partial<Record<LabField, string>> = {};
    for (const field of LAB_FIELDS) {
      const column = mapping[field];
      const i = column !== undefined ? index.get(column) : undefined;
      if (i !== undefined) values[field] = cells[i] ?? '';
    }
    if (mappingBroken) {
      rows.push({ row, values, problems: [], parsed: null });
      continue;
    }
    const result = schema.safeParse(values);
    const problems: UploadProblem[] = [];
    let parsed: ParsedLabRow | null = null;
    if (result.success) {
      parsed = { row, ...result.data };
      const key = `${parsed.sampleId}\u0000${parsed.taxon.toLowerCase()}`;
      if (seen.has(key)) problems.push(problem(row, mapping.sampleId!, `sample ${parsed.sampleId} with taxon ${parsed.taxon} is also on row ${seen.get(key)}; keep one row per sample and taxon`));
      else seen.set(key, row);
    } else {
      for (const issue of result.error.issues) {
        const field = issue.path[0] as LabField | undefined;
        problems.push(problem(row, (field && mapping[field]) ?? null, issue.message));
      }
    }
    rows.push({ row, values, problems, parsed: problems.length ? null : parsed });
  }
  return { columns: table.columns, mapping, fileProblems, rows };
}

/** All problems of a parsed sheet, file problems first, at most MAX_PROBLEMS. */
export const sheetProblems = (sheet: ParsedSheet): UploadProblem[] => [...sheet.fileProblems, ...sheet.rows.flatMap((r) => r.problems)].slice(0, MAX_PROBLEMS);
