import type { RequestHandler } from 'express';
import { LRUCache } from 'lru-cache';

/**
 * The busiest reads of an organisation (the overview, a site's latest forecast) are asked for by
 * every open screen, and under load hundreds of times a second. Their answers are kept for a moment
 * (READ_CACHE_MS) and shared by concurrent requests. Any change to the organisation made through the
 * API drops them at once; forecasts and alerts written by the worker processes show within that moment.
 */
export const READ_CACHE_MS = 2000;

/** Bumped on every change to an organisation: entries of an older generation are never found again. */
const generations = new Map<string, number>();

export function organisationChanged(organisationId: string): void {
  generations.set(organisationId, (generations.get(organisationId) ?? 0) + 1);
}

export function orgReadCache<V extends object>() {
  const cache = new LRUCache<string, Promise<V>>({ max: 5000, ttl: READ_CACHE_MS });
  return async (organisationId: string, key: string, load: () => Promise<V>): Promise<V> => {
    const k = `${organisationId}|${generations.get(organisationId) ?? 0}|${key}`;
    let answer = cache.get(k);
    if (!answer) {
      answer = load();
      cache.set(k, answer);
      // A failed read (not found, database down) is not kept.
      answer.catch(() => cache.delete(k));
    }
    return answer;
  };
}

/** On /orgs/:orgId: a request that may change the organisation drops its cached reads when it ends. */
export const dropOrgReadsOnWrite: RequestHandler = (req, res, next) => {
  const organisationId = req.params.orgId;
  if (req.method !== 'GET' && req.method !== 'HEAD' && typeof organisationId === 'string') {
    organisationChanged(organisationId);
    res.once('finish', () => organisationChanged(organisationId));
  }
  next();
};
