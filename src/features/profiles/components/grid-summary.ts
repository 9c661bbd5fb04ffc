import { depthMeanConcentration, rangeMeanConcentration, type ForecastGrid } from '../../../../shared/forecast/grid.ts';

export interface GridSummary {
  /** Time-mean depth of the centre of mass, m below the surface. */
  centreOfMassMeanM: number;
  /** Time-mean share of the column's cells in the bottom metre, 0–1. */
  bottomMetreShareMean: number;
  /** Highest mean concentration over the gear band, cells/L. */
  gearMaxCellsPerL: number;
}

/** A few numbers that say where the cells are, so two forecasts can be compared at a glance. */
export function summariseGrid(grid: ForecastGrid, gear: { topM: number; bottomM: number }): GridSummary {
  const { nt, nz, waterDepthM } = grid;
  let centreSum = 0;
  let centreCount = 0;
  let shareSum = 0;
  let shareCount = 0;
  let gearMax = 0;
  for (let i = 0; i < nt; i++) {
    let total = 0;
    let moment = 0;
    for (let k = 0; k < nz; k++) {
      const cells = grid.concentration[i * nz + k]! * grid.thicknessM[k]!;
      total += cells;
      moment += cells * grid.depthM[k]!;
    }
    if (total > 0) {
      centreSum += moment / total;
      centreCount++;
      const mean = depthMeanConcentration(grid, i);
      const bottomBand = Math.min(1, waterDepthM);
      shareSum += (rangeMeanConcentration(grid, i, waterDepthM - bottomBand, waterDepthM) * bottomBand) / (mean * waterDepthM);
      shareCount++;
    }
    gearMax = Math.max(gearMax, rangeMeanConcentration(grid, i, gear.topM, gear.bottomM));
  }
  return {
    centreOfMassMeanM: centreCount ? centreSum / centreCount : Number.NaN,
    bottomMetreShareMean: shareCount ? shareSum / shareCount : Number.NaN,
    gearMaxCellsPerL: gearMax,
  };
}
