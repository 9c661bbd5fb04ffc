import { getActiveConstituentSet, refreshSiteTidesFromFeed, type FeedRefreshDeps } from '../tides/tides.service.ts';
import type { ActiveCurrentSet, RefreshOutcome, TideSource } from './tide-source.ts';

async function active(deps: FeedRefreshDeps, siteId: string): Promise<ActiveCurrentSet | null> {
  const set = await getActiveConstituentSet(deps.db, siteId);
  if (!set?.current) return null;
  return {
    id: set.id,
    version: set.version,
    source: set.source,
    createdAt: new Date(set.createdAt),
    constituents: set.current.constituents,
    axisDeg: set.current.axisDeg,
  };
}

/**
 * Forecasts' view of the site tides area: the active set, and a refresh from the tide feed for
 * sites that take their constituents from it. A failed refresh never stops a forecast: it uses the
 * last good set and says so in the note that the forecast shows.
 */
export function siteTideSource(deps: FeedRefreshDeps): TideSource {
  return {
    active: (siteId) => active(deps, siteId),
    async refresh(organisationId, siteId): Promise<RefreshOutcome> {
      const current = await getActiveConstituentSet(deps.db, siteId);
      const usesFeed = current === null || current.source === 'feed';
      if (!deps.feed || !usesFeed) return { ok: true, note: null };
      try {
        await refreshSiteTidesFromFeed(deps, organisationId, siteId, null);
        return { ok: true, note: null };
      } catch (error) {
        const why = error instanceof Error ? error.message : String(error);
        const after = await getActiveConstituentSet(deps.db, siteId);
        const used = after ? `this forecast uses the last good set (version ${after.version}, made ${after.createdAt.slice(0, 16).replace('T', ' ')} UTC)` : 'the site has no constituent set to use';
        return { ok: false, note: `The tide feed could not be reached (${why}); ${used}.` };
      }
    },
  };
}
