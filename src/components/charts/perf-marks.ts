/**
 * Performance marks of the time-depth heatmap: the grid's fetcher marks GRID_ARRIVED when a decoded
 * grid is in hand; the heatmap measures from it to its cells being written (HEATMAP_DRAWN) and to
 * the next frame (HEATMAP_PAINTED). Read them with performance.getEntriesByName().
 */
export const GRID_ARRIVED = 'planktide:grid-arrived';
export const HEATMAP_DRAWN = 'planktide:grid-to-heatmap-drawn';
export const HEATMAP_PAINTED = 'planktide:grid-to-heatmap-painted';

export function markGridArrived(): void {
  if (typeof performance !== 'undefined' && typeof performance.mark === 'function') performance.mark(GRID_ARRIVED);
}

/** Called once the cells are on the canvas: measures from the latest arrival mark, once per arrival. */
export function measureHeatmapDrawn(): void {
  if (typeof performance === 'undefined' || typeof performance.getEntriesByName !== 'function') return;
  const arrived = performance.getEntriesByName(GRID_ARRIVED, 'mark').at(-1);
  if (!arrived) return;
  const start = arrived.startTime;
  performance.clearMarks(GRID_ARRIVED);
  performance.measure(HEATMAP_DRAWN, { start, end: performance.now() });
  if (typeof requestAnimationFrame === 'function') {
    // The frame after the one that shows the canvas: the browser has painted by then.
    requestAnimationFrame(() => setTimeout(() => performance.measure(HEATMAP_PAINTED, { start, end: performance.now() }), 0));
  }
}

/** A named step of drawing, for finding where the time goes (read with performance.getEntriesByType('mark')). */
export function markStep(name: string): void {
  if (typeof performance !== 'undefined' && typeof performance.mark === 'function') performance.mark(`planktide:heatmap-${name}`);
}
