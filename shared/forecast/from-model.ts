/**
 * Converts a model run's result (shared/model/run.ts) for one organism into the ForecastGrid that is
 * stored, drawn and searched for windows. Only outputs on the regular output grid are kept: the
 * extra output the engine adds at the end of a run whose duration is not a whole number of output
 * intervals is dropped, because a ForecastGrid has one fixed step.
 */
import { buildGrid } from '../model/grid.ts';
import type { ModelResult } from '../model/run.ts';
import type { ForecastGrid } from './grid.ts';

export interface GridFromModelOptions {
  /** Clock time of the run's t = 0, UTC epoch ms. */
  startMs: number;
  /** The case's depth_m. */
  waterDepthM: number;
  /** Which of the result's organisms. */
  organismIndex: number;
  /** The site's main (flood-positive) axis, degrees anticlockwise from the model's x axis. Default 0. */
  alongAxisDeg?: number;
  /** The case's bed_refinement (default 1: uniform layers of depth/layers). */
  bedRefinement?: number;
  /** The organism's schmidt_number (default 1). */
  schmidtNumber?: number;
  /** The organism's background_diffusivity_m2_s (default 1e-6). */
  backgroundDiffusivityM2S?: number;
}

/**
 * The ForecastGrid of one organism. Speed is √(u² + v²) per layer; diffusivity is the eddy
 * viscosity / Schmidt number + background (as the engine mixes the organism); the depth-mean
 * along-axis current is the depth-mean (u, v) projected on the main axis; the depth-mean speed is
 * hypot(depth-mean u, depth-mean v). Throws RangeError on options that do not fit the result.
 */
export function gridFromModelResult(result: ModelResult, options: GridFromModelOptions): ForecastGrid {
  const organism = result.organisms[options.organismIndex];
  if (!organism) throw new RangeError(`no organism at index ${options.organismIndex}`);
  if (!(options.waterDepthM > 0)) throw new RangeError('waterDepthM must be above 0');
  const nz = result.layers;
  const times = result.timeS;
  if (times.length < 2) throw new RangeError('the result needs at least two outputs');
  const stepS = times[1]! - times[0]!;
  let nt = times.length;
  const lastGap = times[nt - 1]! - times[nt - 2]!;
  if (nt > 2 && Math.abs(lastGap - stepS) > 1e-6 * stepS) nt--;

  const modelGrid = buildGrid(options.waterDepthM, nz, options.bedRefinement ?? 1);
  const thicknessM = new Float64Array(nz);
  for (let k = 0; k < nz; k++) thicknessM[k] = modelGrid.thickness[nz - 1 - k]!;
  const depthM = Float64Array.from(result.depthM);

  const schmidt = options.schmidtNumber ?? 1;
  const background = options.backgroundDiffusivityM2S ?? 1e-6;
  const cells = nt * nz;
  const concentration = new Float32Array(cells);
  const speed = new Float32Array(cells);
  const diffusivity = new Float32Array(cells);
  for (let j = 0; j < cells; j++) {
    concentration[j] = organism.concentration[j]!;
    speed[j] = Math.hypot(result.u[j]!, result.v[j]!);
    diffusivity[j] = result.eddyViscosity[j]! / schmidt + background;
  }

  const axis = ((options.alongAxisDeg ?? 0) * Math.PI) / 180;
  const cosA = Math.cos(axis);
  const sinA = Math.sin(axis);
  const depthMeanAlong = new Float64Array(nt);
  const depthMeanSpeed = new Float64Array(nt);
  for (let i = 0; i < nt; i++) {
    const u = result.depthMeanU[i]!;
    const v = result.depthMeanV[i]!;
    depthMeanAlong[i] = u * cosA + v * sinA;
    depthMeanSpeed[i] = Math.hypot(u, v);
  }

  return {
    startMs: options.startMs + times[0]! * 1000,
    stepMs: stepS * 1000,
    nt,
    nz,
    waterDepthM: options.waterDepthM,
    depthM,
    thicknessM,
    concentration,
    speed,
    diffusivity,
    depthMeanAlong,
    depthMeanSpeed,
    bedStressPa: Float64Array.from(result.bedStressPa.subarray(0, nt)),
  };
}
