import type { CurrentConstituentInput } from '../../shared/forecast/case-builder.ts';

/** The site's active current constituents, as a forecast needs them. */
export interface ActiveCurrentSet {
  id: string;
  version: number;
  source: string;
  createdAt: Date;
  constituents: CurrentConstituentInput[];
  /** The site's main (flood) axis, degrees anticlockwise from east; null when the set is rectilinear without orientation. */
  axisDeg: number | null;
}

export type RefreshOutcome = { ok: true; note: string | null } | { ok: false; note: string };

/** Where forecasts get a site's tides: the tides area provides it. */
export interface TideSource {
  /** Refreshes the site's constituents from the tide feed when the site uses the feed. Never throws. */
  refresh(organisationId: string, siteId: string): Promise<RefreshOutcome>;
  active(siteId: string): Promise<ActiveCurrentSet | null>;
}
