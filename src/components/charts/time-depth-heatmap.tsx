import { HeatmapRect } from '@visx/heatmap';
import type { RectCell } from '@visx/heatmap';
import { scaleLinear, scaleLog } from '@visx/scale';
import { memo, useCallback, useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { ForecastGrid } from '../../../shared/forecast/grid.ts';
import type { ForecastWindowDto } from '../../../shared/schemas/forecast.schema.ts';
import { binGrid, colourDomain, valueAt, type HeatmapField, type TimeRange } from './heatmap-bins.ts';
import { markStep, measureHeatmapDrawn } from './perf-marks.ts';
import { rampCss, rampTable } from './ramp.ts';
import { siteClock, timeTicks } from './time-axis.ts';

/**
 * The time-depth heatmap shared by the manager's forecast screen and the biologist's what-if screen.
 * CONTRACT (kept stable): draws `grid[field]` with depth positive down from the surface (labelled
 * "Depth below surface (m)"), the bed line at grid.waterDepthM, the gear band as an overlay, window
 * bands along the time axis, a legend with units, times in `timeZone`. Aggregates cells to screen
 * pixels when the grid has more outputs or layers than pixels.
 */
export interface TimeDepthHeatmapProps {
  grid: ForecastGrid;
  field: 'concentration' | 'speed' | 'diffusivity';
  scale: 'linear' | 'log';
  timeZone: string;
  gearBand?: { topM: number; bottomM: number };
  windows?: ForecastWindowDto[];
  width?: number;
  height?: number;
  /** Accessible name of the chart, e.g. "Concentration of Dinophysis, cells/L". */
  label: string;
  /** Optional: only this part of the forecast (default: all of it). */
  timeRange?: TimeRange;
  /** Optional: told where the cursor is (hover, tap or arrow keys), null when it leaves. */
  onCursorChange?: (cursor: HeatmapCursor | null) => void;
}

export interface HeatmapCursor {
  timeMs: number;
  depthM: number;
  value: number;
}

/** Left and right margins of the plot, so charts below can share its time axis. */
export const HEATMAP_MARGIN = { left: 64, right: 16 } as const;
const TOP = 10;
const BED_STRIP = 10;
const WINDOW_ROW = 10;
const TIME_LABELS = 20;

export const FIELD_UNITS: Record<HeatmapField, string> = { concentration: 'cells/L', speed: 'm/s', diffusivity: 'm²/s' };
const FIELD_NAMES: Record<HeatmapField, string> = { concentration: 'Concentration', speed: 'Current speed', diffusivity: 'Eddy diffusivity' };

const WINDOW_ROWS: { kind: ForecastWindowDto['kind']; label: string; colour: string }[] = [
  { kind: 'slack', label: 'slack', colour: 'var(--color-tide-500)' },
  { kind: 'slump', label: 'slump', colour: 'var(--color-ember-600)' },
  { kind: 'mixed', label: 'mixed', colour: 'var(--color-kelp-500)' },
  { kind: 'subsurface_peak', label: 'layer', colour: 'var(--color-alarm-600)' },
];
export const WINDOW_KIND_LABELS: Record<ForecastWindowDto['kind'], string> = { slack: 'Slack water', slump: 'Slump (cells near the bed)', mixed: 'Well mixed', subsurface_peak: 'Subsurface layer' };

const LUT = rampTable(256);

const markAfter = <T,>(step: string, value: T): T => {
  markStep(step);
  return value;
};
const MISSING: [number, number, number] = [235, 238, 242];

export function formatValue(field: HeatmapField, value: number): string {
  if (!Number.isFinite(value)) return 'no value';
  if (field === 'concentration') return `${(value >= 100 ? Math.round(value) : Number(value.toPrecision(2))).toLocaleString('en-GB')} cells/L`;
  if (field === 'speed') return `${value.toFixed(2)} m/s`;
  return `${value.toExponential(1)} m²/s`;
}

function tickLabel(value: number): string {
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e5 || abs < 1e-2) return value.toExponential(0).replace('e+', 'e');
  return value.toLocaleString('en-GB', { maximumSignificantDigits: 3 });
}

/**
 * Paints HeatmapRect's cells into a canvas: one pixel per cell in a small image (each cell's row and
 * column from HeatmapRect), scaled up to the chart without smoothing, then measures the time since
 * the grid arrived.
 */
function CellCanvas({ cells, width, height }: { cells: RectCell<number[], number>[][]; width: number; height: number }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const dpr = typeof window === 'undefined' ? 1 : Math.min(2, window.devicePixelRatio || 1);
  const w = Math.max(1, Math.round(width * dpr));
  const h = Math.max(1, Math.round(height * dpr));
  useLayoutEffect(() => {
    const canvas = ref.current;
    const ctx = canvas?.getContext('2d');
    const cols = cells.length;
    const rows = cells[0]?.length ?? 0;
    if (!canvas || !ctx || cols === 0 || rows === 0) return;
    const small = document.createElement('canvas');
    small.width = cols;
    small.height = rows;
    const smallCtx = small.getContext('2d');
    if (!smallCtx) return;
    const image = smallCtx.createImageData(cols, rows);
    const px = new Uint32Array(image.data.buffer);
    // Little-endian RGBA as one word per pixel.
    const word = (r: number, g: number, b: number) => ((255 << 24) | (b << 16) | (g << 8) | r) >>> 0;
    const palette = new Uint32Array(256);
    for (let i = 0; i < 256; i++) palette[i] = word(LUT[i * 3]!, LUT[i * 3 + 1]!, LUT[i * 3 + 2]!);
    const missing = word(MISSING[0], MISSING[1], MISSING[2]);
    for (let c = 0; c < cols; c++) {
      const column = cells[c]!;
      for (let r = 0; r < rows; r++) {
        const cell = column[r]!;
        const t = cell.count ?? Number.NaN;
        px[cell.row * cols + cell.column] = t === t ? palette[Math.round((t < 0 ? 0 : t > 1 ? 1 : t) * 255)]! : missing;
      }
    }
    markStep('pixels');
    smallCtx.putImageData(image, 0, 0);
    ctx.imageSmoothingEnabled = false;
    ctx.clearRect(0, 0, w, h);
    ctx.drawImage(small, 0, 0, cols, rows, 0, 0, w, h);
    measureHeatmapDrawn();
  }, [cells, w, h]);
  return <canvas ref={ref} width={w} height={h} style={{ width, height }} aria-hidden="true" className="block" />;
}

/** The cells: @visx/heatmap lays out the aggregated bins, the canvas paints them. Memoised so cursor moves do not redraw. */
const CellLayer = memo(function CellLayer({ columns, rows, width, height }: { columns: number[][]; rows: number; width: number; height: number }) {
  const binWidth = width / Math.max(1, columns.length);
  const binHeight = height / Math.max(1, rows);
  return (
    <HeatmapRect<number[], number>
      data={columns}
      bins={(column) => column}
      count={(t) => t}
      xScale={(c) => c * binWidth}
      yScale={(r) => r * binHeight}
      binWidth={binWidth}
      binHeight={binHeight}
      gap={0}
    >
      {(cells) => <CellCanvas cells={markAfter('cells', cells)} width={width} height={height} />}
    </HeatmapRect>
  );
});

function Legend({ field, scale, domain, width }: { field: HeatmapField; scale: 'linear' | 'log'; domain: [number, number]; width: number }) {
  const id = useId().replace(/:/g, '');
  const barWidth = Math.max(160, Math.min(360, width));
  const pad = 10;
  const x = scale === 'log' ? scaleLog({ domain, range: [pad, barWidth - pad] }) : scaleLinear({ domain, range: [pad, barWidth - pad], nice: false });
  const firstDecade = Math.ceil(Math.log10(domain[0]));
  const decadeCount = scale === 'log' && domain[0] > 0 ? Math.max(0, Math.floor(Math.log10(domain[1])) - firstDecade + 1) : 0;
  const decades = Array.from({ length: decadeCount }, (_, i) => 10 ** (firstDecade + i));
  // Under three decades on a log scale: 1, 2 and 5 times the powers of ten as well.
  const ticks =
    scale === 'log'
      ? decades.length >= 3
        ? decades
        : x.ticks(6).filter((t) => [1, 2, 5].includes(Number(t.toExponential(0).split('e')[0])))
      : x.ticks(4);
  const stops = Array.from({ length: 17 }, (_, i) => i / 16);
  const title = `${FIELD_NAMES[field]} (${FIELD_UNITS[field]}), ${scale} scale`;
  return (
    <figure className="text-xs" aria-label={`Legend: ${title}, from ${tickLabel(domain[0])} to ${tickLabel(domain[1])}`}>
      <figcaption className="font-semibold">{title}</figcaption>
      <svg width={barWidth} height={34} aria-hidden="true">
        <defs>
          <linearGradient id={`ramp-${id}`} x1="0" x2="1" y1="0" y2="0">
            {stops.map((t) => (
              <stop key={t} offset={t} stopColor={rampCss(LUT, t)} />
            ))}
          </linearGradient>
        </defs>
        <rect x={pad} y={2} width={barWidth - 2 * pad} height={12} fill={`url(#ramp-${id})`} stroke="var(--color-line)" />
        {ticks
          .filter((t) => t >= domain[0] && t <= domain[1])
          .map((t) => (
            <g key={t} transform={`translate(${x(t)},0)`}>
              <line y1={14} y2={18} stroke="var(--color-ink-soft)" />
              <text y={30} textAnchor="middle" fontSize={10} fill="var(--color-ink)">
                {tickLabel(t)}
              </text>
            </g>
          ))}
      </svg>
    </figure>
  );
}

export function TimeDepthHeatmap(props: TimeDepthHeatmapProps) {
  const { grid, field, scale, timeZone, gearBand, windows = [], label, timeRange, onCursorChange } = props;
  const containerRef = useRef<HTMLDivElement>(null);
  const [measured, setMeasured] = useState(0);
  useLayoutEffect(() => {
    const element = containerRef.current;
    if (!element || props.width !== undefined) return;
    setMeasured(Math.floor(element.getBoundingClientRect().width));
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver((entries) => {
      const next = Math.floor(entries[0]?.contentRect.width ?? 0);
      setMeasured((prev) => (Math.abs(prev - next) >= 1 ? next : prev));
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, [props.width]);

  const width = props.width ?? measured;
  const height = props.height ?? (width > 0 && width < 560 ? 240 : 320);
  const windowRows = WINDOW_ROWS.filter((row) => windows.some((w) => w.kind === row.kind));
  const stripHeight = windowRows.length ? windowRows.length * WINDOW_ROW + 6 : 0;
  const plotWidth = Math.max(10, width - HEATMAP_MARGIN.left - HEATMAP_MARGIN.right);
  const plotHeight = Math.max(40, height - TOP - BED_STRIP - stripHeight - TIME_LABELS);
  const totalHeight = TOP + plotHeight + BED_STRIP + stripHeight + TIME_LABELS;

  const rangeStart = timeRange?.startMs;
  const rangeEnd = timeRange?.endMs;
  const bins = useMemo(
    () => (width > 0 ? markAfter('binned', binGrid(grid, field, Math.max(1, Math.floor(plotWidth / 2)), Math.max(1, Math.round(plotHeight / 2)), rangeStart !== undefined && rangeEnd !== undefined ? { startMs: rangeStart, endMs: rangeEnd } : undefined)) : null),
    [grid, field, plotWidth, plotHeight, rangeStart, rangeEnd, width],
  );
  const domain = useMemo<[number, number]>(() => (bins ? colourDomain(bins, scale) : [0, 1]), [bins, scale]);
  const columns = useMemo(() => {
    if (!bins) return [];
    const colour = scale === 'log' ? scaleLog({ domain, range: [0, 1], clamp: true }) : scaleLinear({ domain, range: [0, 1], clamp: true });
    const out: number[][] = new Array(bins.cols);
    for (let c = 0; c < bins.cols; c++) {
      const column = new Array<number>(bins.rows);
      for (let r = 0; r < bins.rows; r++) {
        const v = bins.values[c * bins.rows + r]!;
        column[r] = Number.isNaN(v) ? Number.NaN : scale === 'log' && v <= domain[0] ? 0 : colour(v);
      }
      out[c] = column;
    }
    markStep('columns');
    return out;
  }, [bins, domain, scale]);

  const x = useMemo(() => scaleLinear({ domain: [bins?.startMs ?? grid.startMs, bins?.endMs ?? grid.startMs + 1], range: [0, plotWidth] }), [bins, grid.startMs, plotWidth]);
  const y = useMemo(() => scaleLinear({ domain: [0, grid.waterDepthM], range: [0, plotHeight] }), [grid.waterDepthM, plotHeight]);

  const [cursor, setCursor] = useState<{ timeMs: number; depthM: number; pointer: boolean } | null>(null);
  const readout = useMemo(() => {
    if (!cursor) return null;
    const at = valueAt(grid, field, cursor.timeMs, cursor.depthM);
    return { ...at, depthM: cursor.depthM };
  }, [cursor, grid, field]);
  const moveTo = useCallback(
    (next: { timeMs: number; depthM: number; pointer: boolean } | null) => {
      setCursor(next);
      if (!onCursorChange) return;
      if (!next) onCursorChange(null);
      else {
        const at = valueAt(grid, field, next.timeMs, next.depthM);
        onCursorChange({ timeMs: at.timeMs, depthM: next.depthM, value: at.value });
      }
    },
    [onCursorChange, grid, field],
  );

  const fromPointer = (event: PointerEvent<SVGRectElement>) => {
    const box = event.currentTarget.getBoundingClientRect();
    const px = Math.min(plotWidth, Math.max(0, event.clientX - box.left));
    const py = Math.min(plotHeight, Math.max(0, event.clientY - box.top));
    moveTo({ timeMs: x.invert(px), depthM: y.invert(py), pointer: true });
  };

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (!bins) return;
    const colMs = Math.max(grid.stepMs, (bins.endMs - bins.startMs) / bins.cols);
    const rowM = Math.max(grid.waterDepthM / 50, grid.waterDepthM / bins.rows);
    const current = cursor ?? { timeMs: (bins.startMs + bins.endMs) / 2, depthM: grid.waterDepthM / 2, pointer: false };
    const clampT = (t: number) => Math.min(bins.endMs, Math.max(bins.startMs, t));
    const clampD = (d: number) => Math.min(grid.waterDepthM, Math.max(0, d));
    const hour = 3_600_000;
    let next: { timeMs: number; depthM: number } | null = null;
    switch (event.key) {
      case 'ArrowLeft':
        next = { ...current, timeMs: clampT(current.timeMs - (event.shiftKey ? hour : colMs)) };
        break;
      case 'ArrowRight':
        next = { ...current, timeMs: clampT(current.timeMs + (event.shiftKey ? hour : colMs)) };
        break;
      case 'ArrowUp':
        next = { ...current, depthM: clampD(current.depthM - (event.shiftKey ? 1 : rowM)) };
        break;
      case 'ArrowDown':
        next = { ...current, depthM: clampD(current.depthM + (event.shiftKey ? 1 : rowM)) };
        break;
      case 'PageUp':
        next = { ...current, timeMs: clampT(current.timeMs - 24 * hour) };
        break;
      case 'PageDown':
        next = { ...current, timeMs: clampT(current.timeMs + 24 * hour) };
        break;
      case 'Home':
        next = { ...current, timeMs: bins.startMs };
        break;
      case 'End':
        next = { ...current, timeMs: bins.endMs };
        break;
      case 'Escape':
        moveTo(null);
        return;
      default:
        return;
    }
    event.preventDefault();
    moveTo({ ...next, pointer: false });
  };

  const readoutId = useId();
  const helpId = useId();
  const ticks = bins ? timeTicks(bins.startMs, bins.endMs, timeZone, plotWidth) : [];
  const depthTicks = y.ticks(plotHeight < 180 ? 3 : 5);
  const readoutText = readout ? `${siteClock(readout.timeMs, timeZone)} · ${Number(readout.depthM.toFixed(1))} m below surface · ${formatValue(field, readout.value)}` : null;
  const cursorX = readout ? x(readout.timeMs) : 0;
  const cursorY = readout ? y(readout.depthM) : 0;

  return (
    <div ref={containerRef} className="w-full">
      <div className="mb-1 flex flex-wrap items-end justify-between gap-2">
        {bins && <Legend field={field} scale={scale} domain={domain} width={Math.min(360, width)} />}
        <p id={helpId} className="text-xs text-ink-soft">
          Hover or tap for values; focus the chart and use the arrow keys (Shift: 1 h / 1 m, Page Up/Down: a day).
        </p>
      </div>
      <div
        role="group"
        aria-roledescription="time-depth chart"
        aria-label={label}
        aria-describedby={`${readoutId} ${helpId}`}
        tabIndex={0}
        onKeyDown={onKeyDown}
        onBlur={() => cursor && !cursor.pointer && moveTo(null)}
        className="relative select-none rounded focus-visible:outline-3"
        style={{ height: totalHeight }}
        data-testid="time-depth-heatmap"
      >
        {width > 0 && bins && (
          <>
            <div className="absolute" style={{ left: HEATMAP_MARGIN.left, top: TOP }}>
              <CellLayer columns={columns} rows={bins.rows} width={plotWidth} height={plotHeight} />
            </div>
            <svg width={width} height={totalHeight} className="absolute left-0 top-0" aria-hidden="true">
              <defs>
                <pattern id={`bed-${readoutId.replace(/:/g, '')}`} width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
                  <line x1="0" y1="0" x2="0" y2="6" stroke="var(--color-ink-soft)" strokeWidth="2" />
                </pattern>
              </defs>
              <g transform={`translate(${HEATMAP_MARGIN.left},${TOP})`}>
                {ticks
                  .filter((t) => t.major)
                  .map((t) => (
                    <line key={t.ms} x1={x(t.ms)} x2={x(t.ms)} y1={0} y2={plotHeight} stroke="white" strokeOpacity={0.55} strokeWidth={1} />
                  ))}
                {gearBand && (
                  <g>
                    <rect x={0} width={plotWidth} y={y(gearBand.topM)} height={Math.max(1, y(gearBand.bottomM) - y(gearBand.topM))} fill="white" fillOpacity={0.08} stroke="white" strokeWidth={1.5} strokeDasharray="6 4" />
                    <text x={plotWidth - 4} y={y(gearBand.topM) + 12} textAnchor="end" fontSize={11} fontWeight={600} fill="white" stroke="var(--color-ink)" strokeWidth={3} paintOrder="stroke">
                      gear {Number(gearBand.topM.toFixed(1))}–{Number(gearBand.bottomM.toFixed(1))} m
                    </text>
                  </g>
                )}
                {/* Depth axis: positive down from the surface. */}
                {depthTicks.map((d) => (
                  <g key={d} transform={`translate(0,${y(d)})`}>
                    <line x1={-5} x2={0} stroke="var(--color-ink-soft)" />
                    <text x={-8} y={4} textAnchor="end" fontSize={11} fill="var(--color-ink)">
                      {d}
                    </text>
                  </g>
                ))}
                <text transform={`translate(${-46},${plotHeight / 2}) rotate(-90)`} textAnchor="middle" fontSize={11} fill="var(--color-ink)">
                  Depth below surface (m)
                </text>
                {/* The bed. */}
                <line x1={0} x2={plotWidth} y1={plotHeight} y2={plotHeight} stroke="var(--color-ink)" strokeWidth={2} />
                <rect x={0} y={plotHeight + 1} width={plotWidth} height={BED_STRIP - 3} fill={`url(#bed-${readoutId.replace(/:/g, '')})`} />
                <text x={plotWidth - 4} y={plotHeight - 4} textAnchor="end" fontSize={11} fontWeight={600} fill="white" stroke="var(--color-ink)" strokeWidth={3} paintOrder="stroke">
                  bed {Number(grid.waterDepthM.toFixed(1))} m
                </text>
                {/* Windows, on the same time axis. */}
                {windowRows.map((row, i) => {
                  const top = plotHeight + BED_STRIP + i * WINDOW_ROW;
                  return (
                    <g key={row.kind}>
                      <text x={-8} y={top + WINDOW_ROW - 2} textAnchor="end" fontSize={10} fill="var(--color-ink)">
                        {row.label}
                      </text>
                      {windows
                        .filter((w) => w.kind === row.kind && w.endMs > (bins?.startMs ?? 0) && w.startMs < (bins?.endMs ?? 0))
                        .map((w) => {
                          const x0 = Math.max(0, x(w.startMs));
                          const x1 = Math.min(plotWidth, x(w.endMs));
                          return (
                            <rect key={`${w.kind}-${w.startMs}`} x={x0} y={top + 1} width={Math.max(1.5, x1 - x0)} height={WINDOW_ROW - 2} rx={2} fill={row.colour}>
                              <title>{`${WINDOW_KIND_LABELS[w.kind]}: ${siteClock(w.startMs, timeZone)} to ${siteClock(w.endMs, timeZone)}`}</title>
                            </rect>
                          );
                        })}
                    </g>
                  );
                })}
                {/* Time axis in the site's zone. */}
                {ticks.map((t) => (
                  <g key={`label-${t.ms}`} transform={`translate(${x(t.ms)},${plotHeight + BED_STRIP + stripHeight})`}>
                    <line y1={0} y2={t.major ? 5 : 3} stroke="var(--color-ink-soft)" />
                    <text y={15} textAnchor={t.major ? 'start' : 'middle'} fontSize={t.major ? 11 : 10} fontWeight={t.major ? 600 : 400} fill={t.major ? 'var(--color-ink)' : 'var(--color-ink-soft)'}>
                      {t.label}
                    </text>
                  </g>
                ))}
                {readout && (
                  <g pointerEvents="none">
                    <line x1={cursorX} x2={cursorX} y1={0} y2={plotHeight + BED_STRIP + stripHeight} stroke="var(--color-ink)" strokeWidth={1} />
                    <line x1={0} x2={plotWidth} y1={cursorY} y2={cursorY} stroke="var(--color-ink)" strokeWidth={1} strokeDasharray="3 3" />
                    <circle cx={cursorX} cy={cursorY} r={4} fill="white" stroke="var(--color-ink)" strokeWidth={1.5} />
                  </g>
                )}
              </g>
            </svg>
            <svg width={plotWidth} height={plotHeight} className="absolute touch-none" style={{ left: HEATMAP_MARGIN.left, top: TOP }} aria-hidden="true">
              <rect width={plotWidth} height={plotHeight} fill="transparent" onPointerMove={fromPointer} onPointerDown={fromPointer} onPointerLeave={(e) => e.pointerType === 'mouse' && moveTo(null)} />
            </svg>
            {readout && readoutText && (
              <div
                className="pointer-events-none absolute z-10 max-w-64 rounded border border-line bg-white/95 px-2 py-1 text-xs shadow"
                style={{
                  left: Math.min(width - 220, Math.max(0, HEATMAP_MARGIN.left + cursorX + 10)),
                  top: Math.max(0, TOP + cursorY - 46),
                }}
              >
                <div className="font-semibold">{formatValue(field, readout.value)}</div>
                <div>{siteClock(readout.timeMs, timeZone)}</div>
                <div>{Number(readout.depthM.toFixed(1))} m below surface</div>
              </div>
            )}
          </>
        )}
      </div>
      <p id={readoutId} aria-live="polite" className="mt-1 min-h-5 text-sm" data-testid="heatmap-readout">
        {readoutText ?? <span className="text-ink-soft">Times in {timeZone}.</span>}
      </p>
    </div>
  );
}
