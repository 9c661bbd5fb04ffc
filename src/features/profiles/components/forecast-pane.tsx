import type { ReactNode } from 'react';
import type { ForecastGrid } from '../../../../shared/forecast/grid.ts';
import type { ForecastWindowDto } from '../../../../shared/schemas/forecast.schema.ts';
import { TimeDepthHeatmap } from '../../../components/charts/time-depth-heatmap.tsx';
import { figure, siteTime, WINDOW_LABELS } from './format.ts';
import { summariseGrid } from './grid-summary.ts';

interface ForecastPaneProps {
  title: string;
  subtitle?: ReactNode;
  grid: ForecastGrid;
  windows: ForecastWindowDto[];
  timeZone: string;
  gear: { topM: number; bottomM: number };
  label: string;
  testId: string;
  children?: ReactNode;
}

/** One forecast drawn as a time-depth heatmap with its windows and where-are-the-cells readouts. */
export function ForecastPane({ title, subtitle, grid, windows, timeZone, gear, label, testId, children }: ForecastPaneProps) {
  const summary = summariseGrid(grid, gear);
  const shown = windows.filter((w) => w.kind !== 'mixed').slice(0, 12);
  return (
    <figure
      data-testid={testId}
      data-centre-of-mass={summary.centreOfMassMeanM.toFixed(3)}
      data-bottom-metre-share={summary.bottomMetreShareMean.toFixed(4)}
      data-gear-max={summary.gearMaxCellsPerL.toFixed(1)}
      data-windows={windows.length}
      className="min-w-0 space-y-3 rounded-lg border border-line bg-white p-4"
    >
      <figcaption>
        <h3 className="font-bold text-tide-900">{title}</h3>
        {subtitle && <p className="text-xs text-ink-soft">{subtitle}</p>}
      </figcaption>
      <TimeDepthHeatmap grid={grid} field="concentration" scale="log" timeZone={timeZone} gearBand={gear} windows={windows} label={label} />
      <dl className="grid grid-cols-3 gap-2 text-sm">
        <div>
          <dt className="text-xs text-ink-soft">Centre of mass (mean)</dt>
          <dd className="font-semibold">{figure(summary.centreOfMassMeanM)} m below surface</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-soft">Cells in the bottom metre (mean)</dt>
          <dd className="font-semibold">{figure(summary.bottomMetreShareMean * 100)} %</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-soft">Highest at the gear ({gear.topM}–{gear.bottomM} m)</dt>
          <dd className="font-semibold">{figure(summary.gearMaxCellsPerL)} cells/L</dd>
        </div>
      </dl>
      {children}
      <div>
        <h4 className="text-sm font-semibold">Windows ({windows.length}, times in {timeZone})</h4>
        {shown.length === 0 ? (
          <p className="text-xs text-ink-soft">No slack, slump or subsurface-peak windows in these 3 days.</p>
        ) : (
          <ul className="mt-1 space-y-0.5 text-xs">
            {shown.map((w) => (
              <li key={`${w.kind}-${w.startMs}`}>
                <span className="font-semibold">{WINDOW_LABELS[w.kind]}</span> {siteTime(w.startMs, timeZone)} – {siteTime(w.endMs, timeZone)}
                {w.peakDepthM !== undefined ? `, at ${figure(w.peakDepthM)} m` : ''}
                {w.clipped ? ' (cut by the forecast edge)' : ''}
              </li>
            ))}
          </ul>
        )}
      </div>
    </figure>
  );
}
