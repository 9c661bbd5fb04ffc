// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { depthMeanConcentration, type ForecastGrid } from '../../shared/forecast/grid.ts';
import { binGrid, colourDomain, outputSpan, valueAt } from '../../src/components/charts/heatmap-bins.ts';
import { oklchToRgb, rampTable } from '../../src/components/charts/ramp.ts';
import { TimeDepthHeatmap } from '../../src/components/charts/time-depth-heatmap.tsx';

const HOUR = 3_600_000;

/** A grid whose concentration is f(output, layer); layer thicknesses as given (surface first). */
function makeGrid(nt: number, thickness: number[], f: (i: number, k: number) => number): ForecastGrid {
  const nz = thickness.length;
  const depthM = new Float64Array(nz);
  let top = 0;
  thickness.forEach((h, k) => {
    depthM[k] = top + h / 2;
    top += h;
  });
  const concentration = new Float32Array(nt * nz);
  for (let i = 0; i < nt; i++) for (let k = 0; k < nz; k++) concentration[i * nz + k] = f(i, k);
  return {
    startMs: Date.UTC(2026, 11, 1),
    stepMs: 10 * 60_000,
    nt,
    nz,
    waterDepthM: top,
    depthM,
    thicknessM: Float64Array.from(thickness),
    concentration,
    speed: new Float32Array(nt * nz).fill(0.2),
    diffusivity: new Float32Array(nt * nz).fill(1e-3),
    depthMeanAlong: new Float64Array(nt),
    depthMeanSpeed: new Float64Array(nt),
    bedStressPa: new Float64Array(nt),
  };
}

afterEach(cleanup);

describe('heatmap aggregation to screen cells', () => {
  it('draws one column per output when the grid has fewer outputs than pixels', () => {
    const grid = makeGrid(12, [1, 1, 1, 1], (i, k) => 100 * i + k);
    const bins = binGrid(grid, 'concentration', 800, 4);
    expect([bins.cols, bins.rows]).toEqual([12, 4]);
    // Equal rows over equal layers: each cell is the grid value itself.
    expect(bins.values[5 * 4 + 2]).toBe(502);
  });

  it('averages the outputs that share a column when there are more outputs than pixels', () => {
    const grid = makeGrid(1000, [2, 2], (i) => i);
    const bins = binGrid(grid, 'concentration', 100, 2);
    expect(bins.cols).toBe(100);
    // Column c holds outputs 10c … 10c+9, whose mean is 10c + 4.5 (arithmetic series).
    expect(bins.values[37 * 2]).toBeCloseTo(374.5, 4);
    expect(bins.values[99 * 2 + 1]).toBeCloseTo(994.5, 4);
  });

  it('weights uneven layers by their overlap with each row, keeping the column mean of the grid', () => {
    // Layers 0–1 m (10 cells/L) and 1–4 m (50 cells/L); rows 0–2 m and 2–4 m.
    const grid = makeGrid(1, [1, 3], (_i, k) => (k === 0 ? 10 : 50));
    const bins = binGrid(grid, 'concentration', 10, 2);
    // Row 0: (10·1 + 50·1)/2 = 30; row 1: 50 (hand computation).
    expect(Array.from(bins.values)).toEqual([30, 50]);
    // Equal rows, so their plain mean is the thickness-weighted depth mean of the grid.
    expect((bins.values[0]! + bins.values[1]!) / 2).toBeCloseTo(depthMeanConcentration(grid, 0), 6);
  });

  it('draws only the outputs inside the chosen days', () => {
    const grid = makeGrid(7 * 144 + 1, [5, 5], () => 1);
    const range = { startMs: grid.startMs, endMs: grid.startMs + 3 * 24 * HOUR };
    expect(outputSpan(grid, range)).toEqual([0, 3 * 144]);
    const bins = binGrid(grid, 'concentration', 2000, 2, range);
    expect(bins.cols).toBe(3 * 144 + 1);
    expect(bins.endMs - bins.startMs).toBe((3 * 144 + 1) * grid.stepMs);
  });

  it('reads the raw value at the output nearest a time and the layer holding a depth', () => {
    const grid = makeGrid(10, [1, 3], (i, k) => 10 * i + k);
    expect(valueAt(grid, 'concentration', grid.startMs + 3.4 * grid.stepMs, 2.5)).toMatchObject({ index: 3, layer: 1, value: 31 });
  });

  it('spans four decades below the maximum on a log scale and starts at zero on a linear one', () => {
    expect(colourDomain({ minPositive: 1e-3, max: 5e4 }, 'log')).toEqual([5, 5e4]);
    expect(colourDomain({ minPositive: 200, max: 5e4 }, 'log')).toEqual([200, 5e4]);
    expect(colourDomain({ minPositive: 200, max: 5e4 }, 'linear')).toEqual([0, 5e4]);
  });

  it('keeps every output of a 7-day grid on a chart wider than its outputs, and halves them on one half as wide', () => {
    const grid = makeGrid(7 * 144 + 1, Array.from({ length: 100 }, () => 0.18), (i, k) => i + k);
    expect(binGrid(grid, 'concentration', 1200, 150).cols).toBe(grid.nt);
    const half = binGrid(grid, 'concentration', 504, 150);
    expect(half.cols).toBe(504);
    expect(half.max).toBe(grid.nt - 1 + 99);
  });
});

describe('the colour ramp', () => {
  it('converts OKLCH to sRGB as the OKLab definition does', () => {
    // OKLab's reference white: L = 1 with no chroma is sRGB white (Ottosson 2020).
    expect(oklchToRgb(1, 0, 0)).toEqual([255, 255, 255]);
    // sRGB red is oklch(62.8% 0.2577 29.23) [from memory: CSS Color 4 examples]; within one step of 255.
    const [r, g, b] = oklchToRgb(0.62796, 0.25768, 29.2339);
    expect(r).toBeGreaterThanOrEqual(254);
    expect(g).toBeLessThanOrEqual(1);
    expect(b).toBeLessThanOrEqual(1);
  });

  it('rises in luminance from the first entry to the last, so order survives grey-scale', () => {
    const table = rampTable(64);
    // Relative luminance with the sRGB coefficients of ITU-R BT.709, on linearised channels.
    const lin = (c: number) => (c / 255 <= 0.04045 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4);
    const luminance = Array.from({ length: 64 }, (_, i) => 0.2126 * lin(table[i * 3]!) + 0.7152 * lin(table[i * 3 + 1]!) + 0.0722 * lin(table[i * 3 + 2]!));
    for (let i = 1; i < 64; i++) expect(luminance[i]!).toBeGreaterThan(luminance[i - 1]!);
  });
});

describe('the time-depth heatmap', () => {
  it('has a legend with units, a labelled depth axis and a keyboard cursor that reads out time, depth and value', () => {
    const grid = makeGrid(145, [2, 2, 2, 2, 2], (i, k) => 100 + 10 * k + i);
    render(<TimeDepthHeatmap grid={grid} field="concentration" scale="linear" timeZone="Europe/London" gearBand={{ topM: 1, bottomM: 6 }} width={700} label="Concentration of test cells, cells/L" />);
    expect(screen.getByText('Concentration (cells/L), linear scale')).toBeTruthy();
    expect(screen.getByText('Depth below surface (m)')).toBeTruthy();
    expect(screen.getByText('bed 10 m')).toBeTruthy();
    const chart = screen.getByRole('group', { name: 'Concentration of test cells, cells/L' });
    fireEvent.keyDown(chart, { key: 'Home' });
    fireEvent.keyDown(chart, { key: 'ArrowUp', shiftKey: true });
    // Home: the first output (Tue 1 Dec 2026 00:00 GMT); middle depth 5 m, one metre up: 4 m, the bottom edge of layer 1 (2–4 m): 100 + 10 + 0.
    expect(screen.getByTestId('heatmap-readout').textContent).toBe('Tue 1 Dec 00:00 GMT (UTC+00:00) · 4 m below surface · 110 cells/L');
  });
});
