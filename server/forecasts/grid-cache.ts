import { LRUCache } from 'lru-cache';

/** Grids held in memory, at most this many bytes in all (a 7-day, 100-layer grid is about 0.4 MB). */
const MAX_BYTES = 64 * 1024 * 1024;
/** A cached grid is dropped after this long, so a forecast deleted by retention is not served for long. */
const TTL_MS = 10 * 60_000;

/**
 * A stored forecast's grid never changes, so the API keeps recently read ones (compressed, as stored)
 * in memory instead of reading them from PostgreSQL for every request. Keyed by organisation and
 * forecast, so that a cached grid is only ever found again through its own organisation.
 */
export function createGridCache(maxBytes = MAX_BYTES) {
  const cache = new LRUCache<string, Buffer>({ maxSize: maxBytes, sizeCalculation: (grid) => Math.max(1, grid.byteLength), ttl: TTL_MS });
  const key = (organisationId: string, forecastId: string) => `${organisationId}/${forecastId}`;
  return {
    async get(organisationId: string, forecastId: string, load: () => Promise<Buffer | undefined>): Promise<Buffer | undefined> {
      const k = key(organisationId, forecastId);
      const cached = cache.get(k);
      if (cached) return cached;
      const grid = await load();
      if (grid && grid.byteLength <= maxBytes) cache.set(k, grid);
      return grid;
    },
    has: (organisationId: string, forecastId: string) => cache.has(key(organisationId, forecastId)),
  };
}

export type GridCache = ReturnType<typeof createGridCache>;
