/**
 * Messages between the what-if screen and its Web Worker. The page posts `run` every time a parameter
 * moves; the worker drops a run as soon as a newer one arrives ("cancelled") and answers the newest
 * with its grid, windows and how long it took.
 */
import type { CurrentConstituentInput } from '../../shared/forecast/case-builder.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import type { WindowSettings } from '../../shared/forecast/window-settings.ts';
import type { ForecastWindow } from '../../shared/forecast/windows.ts';
import type { OrganismParams } from '../../shared/schemas/organism.schema.ts';

export interface WhatIfInput {
  site: { latitudeDeg: number; longitudeDeg: number; waterDepthM: number; bedRoughnessM: number };
  organismName: string;
  params: OrganismParams;
  current: { constituents: CurrentConstituentInput[]; axisDeg: number | null };
  /** Forecast start, UTC epoch ms. */
  startMs: number;
  horizonDays: number;
  layers: number;
  timeStepS?: number;
  windowSettings: WindowSettings;
}

export interface WhatIfTiming {
  /** Whole recompute inside the worker (case, engine, grid, windows), ms. */
  totalMs: number;
  /** The engine alone, ms. */
  modelMs: number;
}

export type WhatIfRequest = { type: 'run'; id: number; input: WhatIfInput };

export type WhatIfResponse =
  | { type: 'result'; id: number; grid: ForecastGrid; windows: ForecastWindow[]; timing: WhatIfTiming }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
