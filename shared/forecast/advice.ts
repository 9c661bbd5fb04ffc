/**
 * Sampling advice per site-local calendar day (rules: docs/windows.md): a representative hose
 * sample, worst-case samples, exposure of the gear band above the trigger level, and a check of
 * each planned official sample. Every item carries a plain-language reason. Depths are metres
 * below the surface; times are UTC epoch ms (the reasons show site-local clock times).
 *
 * The official-sample check never proposes another time: it says whether the scheduled time is in
 * an unrepresentative phase and suggests an extra worst-case bottle, so nobody can use it to pick
 * a time that lowers counts.
 */
import { DateTime } from 'luxon';
import { z } from 'zod';
import { rangeMeanConcentration, type ForecastGrid } from './grid.ts';
import { DEFAULT_WINDOW_SETTINGS, type WindowSettings } from './window-settings.ts';
import { columnSeries, intervalsWhere, seriesAt, type ForecastWindow } from './windows.ts';

const MS_PER_H = 3_600_000;

const representativeSchema = z.object({
  method: z.literal('hose'),
  timeMs: z.number(),
  topM: z.number(),
  bottomM: z.number(),
  /** False when no mixed window falls on the day and the time is the lowest-CV time instead. */
  inMixedWindow: z.boolean(),
  windowStartMs: z.number().optional(),
  windowEndMs: z.number().optional(),
  /** Coefficient of variation over depth at that time. */
  cv: z.number(),
  expectedCellsPerL: z.number(),
  reason: z.string(),
});

const worstCaseSchema = z.object({
  kind: z.enum(['near_bed', 'subsurface_peak', 'gear_band']),
  method: z.enum(['bottle', 'hose']),
  timeMs: z.number(),
  /** Bottle depth. */
  depthM: z.number().optional(),
  /** Hose range (gear band). */
  topM: z.number().optional(),
  bottomM: z.number().optional(),
  expectedCellsPerL: z.number(),
  windowStartMs: z.number().optional(),
  windowEndMs: z.number().optional(),
  /** Peak times of the other windows of this kind on the day (not chosen: lower forecast counts). */
  otherTimesMs: z.array(z.number()),
  reason: z.string(),
});

const exposureSchema = z.object({
  topM: z.number(),
  bottomM: z.number(),
  triggerCellsPerL: z.number(),
  hoursAbove: z.number(),
  periods: z.array(z.object({ startMs: z.number(), endMs: z.number() })),
  maxCellsPerL: z.number(),
  maxMs: z.number(),
  reason: z.string(),
});

const officialSampleCheckSchema = z.object({
  timeMs: z.number(),
  label: z.string().optional(),
  unrepresentative: z.boolean(),
  phases: z.array(z.enum(['slump', 'subsurface_peak', 'stratified'])),
  /** Hose-range mean over depth mean at the sample time (below 1: the hose under-reads the column). */
  hoseToColumnRatio: z.number(),
  reason: z.string(),
});

export const dayAdviceSchema = z.object({
  /** Site-local calendar date, yyyy-MM-dd. */
  date: z.string(),
  timeZone: z.string(),
  /** Local midnight to local midnight, UTC ms; 23 or 25 h on a daylight-saving change. */
  dayStartMs: z.number(),
  dayEndMs: z.number(),
  hoursInDay: z.number(),
  /** The part of the day the forecast covers. */
  coveredStartMs: z.number(),
  coveredEndMs: z.number(),
  partial: z.boolean(),
  representative: representativeSchema,
  worstCase: z.array(worstCaseSchema),
  exposure: exposureSchema,
  officialSamples: z.array(officialSampleCheckSchema),
});

export type RepresentativeSample = z.infer<typeof representativeSchema>;
export type WorstCaseSample = z.infer<typeof worstCaseSchema>;
export type Exposure = z.infer<typeof exposureSchema>;
export type OfficialSampleCheck = z.infer<typeof officialSampleCheckSchema>;
export type DayAdvice = z.infer<typeof dayAdviceSchema>;

export interface AdviceInput {
  grid: ForecastGrid;
  windows: ForecastWindow[];
  site: { timeZone: string; gearTopM: number; gearBottomM: number; waterDepthM: number };
  triggerCellsPerL: number;
  /** The usual hose range; default 0 to min(10 m, water depth). */
  hoseRange?: { topM: number; bottomM: number };
  officialSamples?: { timeMs: number; label?: string }[];
  /** The settings the windows were found with (for the mixed-column limit); default the defaults. */
  settings?: WindowSettings;
}

interface Context {
  grid: ForecastGrid;
  zone: string;
  dstDay: boolean;
  cv: Float64Array;
  depthMean: Float64Array;
  hose: Float64Array;
  gear: Float64Array;
  hoseTop: number;
  hoseBottom: number;
  settings: WindowSettings;
}

/** Advice for every site-local day the forecast touches. Throws RangeError on an unknown time zone or bad ranges. */
export function adviseDays(input: AdviceInput): DayAdvice[] {
  const { grid, site } = input;
  const zone = site.timeZone;
  if (!DateTime.fromMillis(0, { zone }).isValid) throw new RangeError(`unknown time zone: ${zone}`);
  if (!(site.gearBottomM > site.gearTopM)) throw new RangeError('gear bottom must be deeper than gear top');
  if (!Number.isFinite(input.triggerCellsPerL)) throw new RangeError('trigger level must be a number');
  if (grid.nt < 1) return [];
  const settings = input.settings ?? DEFAULT_WINDOW_SETTINGS;
  const hoseTop = input.hoseRange?.topM ?? 0;
  const hoseBottom = input.hoseRange?.bottomM ?? Math.min(10, site.waterDepthM);
  if (!(hoseBottom > hoseTop)) throw new RangeError('hose bottom must be deeper than hose top');
  const series = columnSeries(grid, settings);
  const hose = new Float64Array(grid.nt);
  const gear = new Float64Array(grid.nt);
  for (let i = 0; i < grid.nt; i++) {
    hose[i] = rangeMeanConcentration(grid, i, hoseTop, hoseBottom);
    gear[i] = rangeMeanConcentration(grid, i, site.gearTopM, site.gearBottomM);
  }
  const gearAbove = new Float64Array(grid.nt);
  for (let i = 0; i < grid.nt; i++) gearAbove[i] = gear[i]! - input.triggerCellsPerL;
  const abovePeriods = intervalsWhere(grid, gearAbove, true);

  const forecastEndMs = grid.startMs + (grid.nt - 1) * grid.stepMs;
  const days: DayAdvice[] = [];
  let day = DateTime.fromMillis(grid.startMs, { zone }).startOf('day');
  for (;;) {
    const next = day.plus({ days: 1 }).startOf('day');
    const dayStartMs = day.toMillis();
    const dayEndMs = next.toMillis();
    if (dayStartMs > forecastEndMs || (dayStartMs === forecastEndMs && days.length > 0)) break;
    const hoursInDay = (dayEndMs - dayStartMs) / MS_PER_H;
    const ctx: Context = {
      grid,
      zone,
      dstDay: hoursInDay !== 24,
      cv: series.cv,
      depthMean: series.depthMean,
      hose,
      gear,
      hoseTop,
      hoseBottom,
      settings,
    };
    const coveredStartMs = Math.max(dayStartMs, grid.startMs);
    const coveredEndMs = Math.min(dayEndMs, forecastEndMs);
    const span = { startMs: coveredStartMs, endMs: coveredEndMs };
    const inDay = (t: number) => t >= coveredStartMs && (t < dayEndMs || (t === forecastEndMs && t <= coveredEndMs));
    const dayWindows = input.windows.filter((w) => inDay(w.peakMs));
    days.push({
      date: day.toISODate() ?? '',
      timeZone: zone,
      dayStartMs,
      dayEndMs,
      hoursInDay,
      coveredStartMs,
      coveredEndMs,
      partial: coveredStartMs > dayStartMs || coveredEndMs < dayEndMs,
      representative: withPartialNote(ctx, representative(ctx, input.windows, span), span, dayStartMs, dayEndMs),
      worstCase: worstCases(ctx, dayWindows, span, site),
      exposure: exposure(ctx, abovePeriods, span, site, input.triggerCellsPerL),
      officialSamples: (input.officialSamples ?? [])
        .filter((s) => inDay(s.timeMs) && s.timeMs <= forecastEndMs)
        .sort((a, b) => a.timeMs - b.timeMs)
        .map((s) => checkOfficial(ctx, input.windows, s)),
    });
    day = next;
  }
  return days;
}

interface Span {
  startMs: number;
  endMs: number;
}

/** Output indices whose times fall in [span.startMs, span.endMs]. */
function outputRange(grid: ForecastGrid, span: Span): [number, number] {
  const first = Math.max(0, Math.ceil((span.startMs - grid.startMs) / grid.stepMs - 1e-9));
  const last = Math.min(grid.nt - 1, Math.floor((span.endMs - grid.startMs) / grid.stepMs + 1e-9));
  return [first, last];
}

function representative(ctx: Context, windows: ForecastWindow[], span: Span): RepresentativeSample {
  const { grid } = ctx;
  let best: { startMs: number; endMs: number } | null = null;
  for (const w of windows) {
    if (w.kind !== 'mixed') continue;
    const s = Math.max(w.startMs, span.startMs);
    const e = Math.min(w.endMs, span.endMs);
    if (e <= s) continue;
    if (!best || e - s > best.endMs - best.startMs) best = { startMs: s, endMs: e };
  }
  const range = metreRange(ctx.hoseTop, ctx.hoseBottom);
  if (best) {
    const timeMs = (best.startMs + best.endMs) / 2;
    const cv = seriesAt(grid, ctx.cv, timeMs);
    const expected = seriesAt(grid, ctx.hose, timeMs);
    return {
      method: 'hose',
      timeMs,
      topM: ctx.hoseTop,
      bottomM: ctx.hoseBottom,
      inMixedWindow: true,
      windowStartMs: best.startMs,
      windowEndMs: best.endMs,
      cv,
      expectedCellsPerL: expected,
      reason:
        `Representative sample: hose over ${range} at ${clock(ctx, timeMs)}, the middle of the longest well-mixed period of the day ` +
        `(${clock(ctx, best.startMs)}–${clock(ctx, best.endMs)}). Cells are spread evenly through the water then ` +
        `(variation over depth ${percent(cv)}), so the hose reads what the whole column holds: about ${cells(expected)}.`,
    };
  }
  // No mixed window on the day: the output with the lowest CV.
  const [first, last] = outputRange(grid, span);
  let k = -1;
  for (let i = first; i <= last; i++) {
    const v = ctx.cv[i]!;
    if (!Number.isNaN(v) && (k < 0 || v < ctx.cv[k]!)) k = i;
  }
  const timeMs = k >= 0 ? grid.startMs + k * grid.stepMs : (span.startMs + span.endMs) / 2;
  const cv = k >= 0 ? ctx.cv[k]! : Number.NaN;
  const expected = seriesAt(grid, ctx.hose, timeMs);
  const spread = Number.isNaN(cv)
    ? 'No cells are forecast in the water, so any time is as representative as another.'
    : `Cells are most evenly spread at ${clock(ctx, timeMs)} (variation over depth ${percent(cv)}, above the ${percent(ctx.settings.mixedCv)} limit of a mixed column), so a hose then comes closest to the column but is not fully representative.`;
  return {
    method: 'hose',
    timeMs,
    topM: ctx.hoseTop,
    bottomM: ctx.hoseBottom,
    inMixedWindow: false,
    cv,
    expectedCellsPerL: expected,
    reason: `No well-mixed period is forecast on this day. ${spread} Hose over ${range} at ${clock(ctx, timeMs)}: about ${cells(expected)}.`,
  };
}

/** Says so when the forecast covers only part of the day, since the choice is then among fewer hours. */
function withPartialNote(ctx: Context, rep: RepresentativeSample, span: Span, dayStartMs: number, dayEndMs: number): RepresentativeSample {
  if (span.startMs <= dayStartMs && span.endMs >= dayEndMs) return rep;
  return { ...rep, reason: `${rep.reason} The forecast covers only ${clock(ctx, span.startMs)}–${clock(ctx, span.endMs)} of this day.` };
}

/** Concentration at a depth at a time, linear in time between outputs (the layer holding the depth). */
function concentrationAt(grid: ForecastGrid, depthM: number, tMs: number): number {
  let layer = grid.nz - 1;
  for (let k = 0; k < grid.nz; k++) {
    if (depthM <= grid.depthM[k]! + grid.thicknessM[k]! / 2) {
      layer = k;
      break;
    }
  }
  const x = Math.min(grid.nt - 1, Math.max(0, (tMs - grid.startMs) / grid.stepMs));
  const i = Math.floor(x);
  const w = x - i;
  const a = grid.concentration[i * grid.nz + layer]!;
  if (w === 0 || i + 1 >= grid.nt) return a;
  return a + w * (grid.concentration[(i + 1) * grid.nz + layer]! - a);
}

function worstCases(ctx: Context, dayWindows: ForecastWindow[], span: Span, site: AdviceInput['site']): WorstCaseSample[] {
  const { grid } = ctx;
  const out: WorstCaseSample[] = [];
  const nearBed = Math.max(0, grid.waterDepthM - 0.5);
  const pick = (kind: 'slump' | 'subsurface_peak') => {
    const list = dayWindows
      .filter((w) => w.kind === kind)
      .map((w) => {
        const depth = kind === 'slump' ? (w.peakDepthM ?? nearBed) : (w.peakDepthM ?? grid.waterDepthM / 2);
        return { w, depth, value: concentrationAt(grid, depth, w.peakMs) };
      })
      .sort((a, b) => b.value - a.value);
    return list;
  };

  const slumps = pick('slump');
  const topSlump = slumps[0];
  if (topSlump) {
    const { w, depth, value } = topSlump;
    const mean = seriesAt(grid, ctx.depthMean, w.peakMs);
    out.push({
      kind: 'near_bed',
      method: 'bottle',
      timeMs: w.peakMs,
      depthM: depth,
      expectedCellsPerL: value,
      windowStartMs: w.startMs,
      windowEndMs: w.endMs,
      otherTimesMs: slumps.slice(1).map((s) => s.w.peakMs),
      reason:
        `Worst case near the bed: bottle at ${metres(depth)} below the surface at ${clock(ctx, w.peakMs)}, the peak of the slump window ` +
        `${clock(ctx, w.startMs)}–${clock(ctx, w.endMs)}. With little current, cells settle and pile up near the bed: about ` +
        `${cells(value)} there, ${ratio(value / mean)} the column mean.` +
        (slumps.length > 1 ? ` This is the highest of ${slumps.length} slump windows on the day.` : ''),
    });
  }

  const layers = pick('subsurface_peak');
  const topLayer = layers[0];
  if (topLayer) {
    const { w, depth, value } = topLayer;
    const mean = seriesAt(grid, ctx.depthMean, w.peakMs);
    const inHose = depth >= ctx.hoseTop && depth <= ctx.hoseBottom;
    const hoseNote = inHose
      ? `A hose over ${metreRange(ctx.hoseTop, ctx.hoseBottom)} mixes the layer with thinner water and under-reads it.`
      : `A hose over ${metreRange(ctx.hoseTop, ctx.hoseBottom)} misses it.`;
    out.push({
      kind: 'subsurface_peak',
      method: 'bottle',
      timeMs: w.peakMs,
      depthM: depth,
      expectedCellsPerL: value,
      windowStartMs: w.startMs,
      windowEndMs: w.endMs,
      otherTimesMs: layers.slice(1).map((s) => s.w.peakMs),
      reason:
        `Worst case in a layer: bottle at ${metres(depth)} below the surface at ${clock(ctx, w.peakMs)} ` +
        `(layer forecast ${clock(ctx, w.startMs)}–${clock(ctx, w.endMs)}): about ${cells(value)}, ${ratio(value / mean)} the column mean. ${hoseNote}`,
    });
  }

  const [first, last] = outputRange(grid, span);
  if (last >= first) {
    let k = first;
    for (let i = first; i <= last; i++) if (ctx.gear[i]! > ctx.gear[k]!) k = i;
    const timeMs = grid.startMs + k * grid.stepMs;
    const value = ctx.gear[k]!;
    out.push({
      kind: 'gear_band',
      method: 'hose',
      timeMs,
      topM: site.gearTopM,
      bottomM: site.gearBottomM,
      expectedCellsPerL: value,
      otherTimesMs: [],
      reason:
        `Worst case at the stock: the gear band (${metreRange(site.gearTopM, site.gearBottomM)}) holds the most cells at ` +
        `${clock(ctx, timeMs)}, about ${cells(value)}. A hose over the gear band then shows the stock's highest exposure of the day.`,
    });
  }
  return out;
}

function exposure(
  ctx: Context,
  periods: { startMs: number; endMs: number }[],
  span: Span,
  site: AdviceInput['site'],
  trigger: number,
): Exposure {
  const { grid } = ctx;
  const inside: { startMs: number; endMs: number }[] = [];
  let totalMs = 0;
  for (const p of periods) {
    const s = Math.max(p.startMs, span.startMs);
    const e = Math.min(p.endMs, span.endMs);
    if (e <= s) continue;
    inside.push({ startMs: s, endMs: e });
    totalMs += e - s;
  }
  const [first, last] = outputRange(grid, span);
  let k = Math.max(0, Math.min(first, grid.nt - 1));
  for (let i = first; i <= last; i++) if (ctx.gear[i]! > ctx.gear[k]!) k = i;
  const maxMs = grid.startMs + k * grid.stepMs;
  const max = ctx.gear[k]!;
  const hoursAbove = totalMs / MS_PER_H;
  const band = metreRange(site.gearTopM, site.gearBottomM);
  const list = inside.map((p) => `${clock(ctx, p.startMs)}–${clock(ctx, p.endMs)}`).join(', ');
  const reason =
    inside.length > 0
      ? `The gear band (${band}) is forecast above the trigger of ${cells(trigger)} for ${hoursAbove.toFixed(1)} h on this day (${list}); highest ${cells(max)} at ${clock(ctx, maxMs)}.`
      : `The gear band (${band}) stays below the trigger of ${cells(trigger)} all day; highest ${cells(max)} at ${clock(ctx, maxMs)}.`;
  return { topM: site.gearTopM, bottomM: site.gearBottomM, triggerCellsPerL: trigger, hoursAbove, periods: inside, maxCellsPerL: max, maxMs, reason };
}

function checkOfficial(ctx: Context, windows: ForecastWindow[], sample: { timeMs: number; label?: string }): OfficialSampleCheck {
  const { grid } = ctx;
  const t = sample.timeMs;
  const containing = (kind: ForecastWindow['kind']) => windows.find((w) => w.kind === kind && t >= w.startMs && t <= w.endMs);
  const slump = containing('slump');
  const layer = containing('subsurface_peak');
  const mixed = containing('mixed');
  const cv = seriesAt(grid, ctx.cv, t);
  const stratified = !mixed && cv >= ctx.settings.mixedCv;
  const mean = seriesAt(grid, ctx.depthMean, t);
  const hoseRatio = mean > 0 ? seriesAt(grid, ctx.hose, t) / mean : Number.NaN;
  const phases: OfficialSampleCheck['phases'] = [];
  const hose = `a hose over ${metreRange(ctx.hoseTop, ctx.hoseBottom)}`;
  const hoseReads = Number.isNaN(hoseRatio) ? '' : ` ${capital(hose)} is forecast to collect about ${ratio(hoseRatio)} the column mean then.`;
  const parts: string[] = [];
  if (slump) {
    phases.push('slump');
    parts.push(
      `It falls in a slump window (${clock(ctx, slump.startMs)}–${clock(ctx, slump.endMs)}): cells have settled toward the bed, so the upper water holds fewer than the column does.` +
        ` A bottle at ${metres(slump.peakDepthM ?? grid.waterDepthM - 0.5)} taken alongside shows the near-bed count.`,
    );
  }
  if (layer) {
    phases.push('subsurface_peak');
    parts.push(
      `It falls while cells form a layer at about ${metres(layer.peakDepthM ?? Number.NaN)} (${clock(ctx, layer.startMs)}–${clock(ctx, layer.endMs)}), which ${hose} dilutes or misses.` +
        ` A bottle at the layer taken alongside shows its count.`,
    );
  }
  if (stratified) {
    phases.push('stratified');
    parts.push(`It falls outside any well-mixed period while cells are unevenly spread through depth (variation ${percent(cv)}).`);
  }
  const name = sample.label ? `Official sample "${sample.label}"` : 'Official sample';
  const head = `${name} at ${clock(ctx, t)}.`;
  const unrepresentative = phases.length > 0;
  const reason = unrepresentative
    ? `${head} ${parts.join(' ')}${hoseReads} The count may not represent the water. Keep to the official schedule and record this phase with the result.`
    : mixed
      ? `${head} It falls in a well-mixed period (${clock(ctx, mixed.startMs)}–${clock(ctx, mixed.endMs)}): cells are spread evenly, so ${hose} represents the column.`
      : `${head} Cells are forecast to be evenly spread through depth then (variation ${percent(cv)}), so ${hose} represents the column.`;
  const check: OfficialSampleCheck = { timeMs: t, unrepresentative, phases, hoseToColumnRatio: hoseRatio, reason };
  if (sample.label !== undefined) check.label = sample.label;
  return check;
}

function clock(ctx: Context, tMs: number): string {
  const dt = DateTime.fromMillis(tMs, { zone: ctx.zone });
  // On a daylight-saving change day an hour repeats or is skipped: name the zone's offset.
  return ctx.dstDay ? dt.setLocale('en-GB').toFormat('HH:mm ZZZZ') : dt.toFormat('HH:mm');
}

const metres = (m: number) => `${Number(m.toFixed(1))} m`;
const metreRange = (top: number, bottom: number) => `${Number(top.toFixed(1))}–${metres(bottom)}`;
const percent = (x: number) => `${Math.round(x * 100)} %`;
const ratio = (x: number) => `${x.toFixed(1)}×`;
const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function cells(x: number): string {
  if (!Number.isFinite(x)) return 'no forecast';
  const rounded = x >= 100 ? Math.round(x) : Number(x.toPrecision(2));
  return `${rounded.toLocaleString('en-GB')} cells/L`;
}
