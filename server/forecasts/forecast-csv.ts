import { DateTime } from 'luxon';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';

const HEADER = 'time_utc,time_local,depth_m_below_surface,concentration_cells_per_l,current_speed_m_s,eddy_diffusivity_m2_s';

/** The grid in long format (RFC 4180): one row per output time and layer; times in UTC and site-local. */
export function* forecastCsvLines(grid: ForecastGrid, timeZone: string): Generator<string> {
  yield `${HEADER}\r\n`;
  for (let i = 0; i < grid.nt; i++) {
    const t = grid.startMs + i * grid.stepMs;
    const utc = new Date(t).toISOString();
    const local = DateTime.fromMillis(t, { zone: timeZone }).toISO({ suppressMilliseconds: true }) ?? '';
    let chunk = '';
    for (let k = 0; k < grid.nz; k++) {
      const j = i * grid.nz + k;
      chunk += `${utc},${local},${grid.depthM[k]!.toFixed(3)},${grid.concentration[j]!.toPrecision(6)},${grid.speed[j]!.toPrecision(4)},${grid.diffusivity[j]!.toPrecision(4)}\r\n`;
    }
    yield chunk;
  }
}
