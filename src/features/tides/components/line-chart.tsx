import { scaleLinear } from '@visx/scale';

export interface ChartSeries {
  label: string;
  values: (number | null)[];
  /** A CSS colour (use the theme tokens). */
  colour: string;
  dashed?: boolean;
}

export interface ChartMark {
  /** Index into the times. */
  at: number;
  label: string;
}

const W = 900;
const H = 220;
const M = { top: 12, right: 12, bottom: 28, left: 52 };

function path(values: (number | null)[], x: (i: number) => number, y: (v: number) => number): string {
  let d = '';
  let pen = false;
  values.forEach((v, i) => {
    if (v === null || !Number.isFinite(v)) {
      pen = false;
      return;
    }
    d += `${pen ? 'L' : 'M'}${x(i).toFixed(1)},${y(v).toFixed(1)}`;
    pen = true;
  });
  return d;
}

/** A plain SVG line chart over sample indices, with a labelled y axis, tick labels on x and optional vertical marks. */
export function LineChart({ title, yLabel, series, xTicks, marks = [], zeroLine = false }: { title: string; yLabel: string; series: ChartSeries[]; xTicks: { at: number; label: string }[]; marks?: ChartMark[]; zeroLine?: boolean }) {
  const n = Math.max(1, ...series.map((s) => s.values.length));
  const all = series.flatMap((s) => s.values.filter((v): v is number => v !== null && Number.isFinite(v)));
  const lo = Math.min(0, ...all);
  const hi = Math.max(0, ...all);
  const pad = (hi - lo) * 0.05 || 0.1;
  const x = scaleLinear({ domain: [0, n - 1], range: [M.left, W - M.right] });
  const y = scaleLinear({ domain: [lo - pad, hi + pad], range: [H - M.bottom, M.top], nice: true });
  const yTicks = y.ticks(5);
  return (
    <figure className="rounded-lg border border-line bg-white p-2">
      <figcaption className="px-1 text-sm font-semibold">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={title} className="h-auto w-full">
        {yTicks.map((t) => (
          <g key={t}>
            <line x1={M.left} x2={W - M.right} y1={y(t)} y2={y(t)} stroke="var(--color-line)" />
            <text x={M.left - 6} y={y(t) + 4} textAnchor="end" fontSize="11" fill="var(--color-ink-soft)">{t}</text>
          </g>
        ))}
        {zeroLine && <line x1={M.left} x2={W - M.right} y1={y(0)} y2={y(0)} stroke="var(--color-ink-soft)" />}
        <text x={12} y={H / 2} transform={`rotate(-90 12 ${H / 2})`} textAnchor="middle" fontSize="11" fill="var(--color-ink)">{yLabel}</text>
        {xTicks.map((t) => (
          <text key={t.at} x={x(t.at)} y={H - 8} textAnchor="middle" fontSize="11" fill="var(--color-ink-soft)">{t.label}</text>
        ))}
        {marks.map((m, i) => (
          <line key={i} x1={x(m.at)} x2={x(m.at)} y1={M.top} y2={H - M.bottom} stroke="var(--color-ember-600)" strokeWidth="1" strokeDasharray="2 3">
            <title>{m.label}</title>
          </line>
        ))}
        {series.map((s) => (
          <path key={s.label} d={path(s.values, x, y)} fill="none" stroke={s.colour} strokeWidth="1.5" strokeDasharray={s.dashed ? '5 3' : undefined} />
        ))}
      </svg>
      <ul className="flex flex-wrap gap-4 px-1 text-xs">
        {series.map((s) => (
          <li key={s.label} className="flex items-center gap-1">
            <svg width="20" height="6" aria-hidden="true"><line x1="0" x2="20" y1="3" y2="3" stroke={s.colour} strokeWidth="2" strokeDasharray={s.dashed ? '5 3' : undefined} /></svg>
            {s.label}
          </li>
        ))}
        {marks.length > 0 && <li className="flex items-center gap-1"><span className="inline-block h-3 border-l border-dashed border-ember-600" aria-hidden="true" /> slack water</li>}
      </ul>
    </figure>
  );
}
