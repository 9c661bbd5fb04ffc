import { scaleLinear } from '@visx/scale';
import type { ForecastGrid } from '../../../../shared/forecast/grid.ts';
import type { Preview } from '../../../../shared/schemas/tides.schema.ts';
import { drawnTimeSpan, type TimeRange } from '../../../components/charts/heatmap-bins.ts';
import { HEATMAP_MARGIN } from '../../../components/charts/time-depth-heatmap.tsx';
import { timeTicks } from '../../../components/charts/time-axis.ts';
import { useElementWidth } from '../../../components/charts/use-element-width.ts';

interface Series {
  label: string;
  unit: string;
  /** [time ms, value] pairs. */
  points: [number, number][];
  colour: string;
  zeroLine?: boolean;
}

const PANEL = 84;
const GAP = 22;

function Panel({ series, x, width, top, cursorMs }: { series: Series; x: (t: number) => number; width: number; top: number; cursorMs: number | null }) {
  const values = series.points.map((p) => p[1]);
  const lo = Math.min(...values, series.zeroLine ? 0 : Number.POSITIVE_INFINITY);
  const hi = Math.max(...values, series.zeroLine ? 0 : Number.NEGATIVE_INFINITY);
  const pad = (hi - lo) * 0.08 || 0.1;
  const y = scaleLinear({ domain: [lo - pad, hi + pad], range: [PANEL, 0], nice: true });
  const d = series.points.map(([t, v], i) => `${i ? 'L' : 'M'}${x(t).toFixed(1)},${y(v).toFixed(1)}`).join('');
  return (
    <g transform={`translate(${HEATMAP_MARGIN.left},${top})`}>
      <text x={-HEATMAP_MARGIN.left + 2} y={-6} fontSize={11} fontWeight={600} fill="var(--color-ink)">
        {series.label} ({series.unit})
      </text>
      <rect width={width} height={PANEL} fill="white" stroke="var(--color-line)" />
      {y.ticks(3).map((t) => (
        <g key={t} transform={`translate(0,${y(t)})`}>
          <line x2={width} stroke="var(--color-line)" />
          <text x={-6} y={4} textAnchor="end" fontSize={10} fill="var(--color-ink-soft)">
            {t}
          </text>
        </g>
      ))}
      {series.zeroLine && <line x1={0} x2={width} y1={y(0)} y2={y(0)} stroke="var(--color-ink-soft)" />}
      <path d={d} fill="none" stroke={series.colour} strokeWidth={1.75} />
      {cursorMs !== null && <line x1={x(cursorMs)} x2={x(cursorMs)} y1={0} y2={PANEL} stroke="var(--color-ink)" />}
    </g>
  );
}

/**
 * The tide under the heatmap, on its time axis: the depth-mean current of the forecast (positive =
 * flood) and the water level of the site's tide preview, when the site has level constituents.
 */
export function TideStrip({ grid, preview, timeZone, timeRange, cursorMs }: { grid: ForecastGrid; preview: Preview | null; timeZone: string; timeRange: TimeRange; cursorMs: number | null }) {
  const [ref, width] = useElementWidth<HTMLDivElement>();
  const span = drawnTimeSpan(grid, timeRange);
  const plotWidth = Math.max(10, width - HEATMAP_MARGIN.left - HEATMAP_MARGIN.right);
  const x = scaleLinear({ domain: [span.startMs, span.endMs], range: [0, plotWidth] });
  const inSpan = (t: number) => t >= span.startMs && t <= span.endMs;
  const current: Series = {
    label: 'Depth-mean current along the main axis, + flood',
    unit: 'm/s',
    colour: 'var(--color-ramp-2)',
    zeroLine: true,
    points: Array.from(grid.depthMeanAlong, (v, i) => [grid.startMs + i * grid.stepMs, v] as [number, number]).filter(([t]) => inSpan(t)),
  };
  const level: Series | null = preview?.level
    ? {
        label: 'Water level above chart datum',
        unit: 'm',
        colour: 'var(--color-tide-700)',
        points: preview.times.map((t, i) => [Date.parse(t), preview.level!.values[i]!] as [number, number]).filter(([t]) => inSpan(t)),
      }
    : null;
  const panels = [current, ...(level && level.points.length > 1 ? [level] : [])];
  const ticks = timeTicks(span.startMs, span.endMs, timeZone, plotWidth).filter((t) => t.major);
  const height = panels.length * (PANEL + GAP) + 20;
  return (
    <div ref={ref} className="w-full">
      {width > 0 && (
        <svg width={width} height={height} role="img" aria-label={`Tide at the site over the same days: ${panels.map((p) => p.label).join('; ')}`}>
          {panels.map((series, i) => (
            <Panel key={series.label} series={series} x={x} width={plotWidth} top={GAP - 4 + i * (PANEL + GAP)} cursorMs={cursorMs} />
          ))}
          <g transform={`translate(${HEATMAP_MARGIN.left},${height - 16})`}>
            {ticks.map((t) => (
              <text key={t.ms} x={x(t.ms)} y={10} fontSize={11} fontWeight={600} fill="var(--color-ink)">
                {t.label}
              </text>
            ))}
          </g>
        </svg>
      )}
      {!preview?.level && <p className="text-xs text-ink-soft">No water level: the site's tides have current constituents only.</p>}
    </div>
  );
}
