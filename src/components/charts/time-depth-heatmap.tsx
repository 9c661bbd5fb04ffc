import type { ForecastGrid } from '../../../shared/forecast/grid.ts';
import type { ForecastWindowDto } from '../../../shared/schemas/forecast.schema.ts';

/**
 * The time-depth heatmap shared by the manager's forecast screen and the biologist's what-if screen.
 * CONTRACT (kept stable; the implementation is being built): draws `grid[field]` with depth positive
 * down from the surface (labelled "Depth below surface (m)"), the bed line at grid.waterDepthM, the
 * gear band as an overlay, window bands along the time axis, a legend with units, times in `timeZone`.
 * Aggregates cells to screen pixels when the grid has more outputs or layers than pixels.
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
}

export function TimeDepthHeatmap(props: TimeDepthHeatmapProps) {
  return <div role="img" aria-label={props.label} className="h-64 rounded border border-line bg-tide-50" />;
}
