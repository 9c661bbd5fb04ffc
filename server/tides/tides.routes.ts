import { Router } from 'express';
import type { Db } from '../db/connect.ts';

/** Deps of the site tides area (filled in by that area, e.g. the tide feed client). */
export interface TidesDeps {
  db: Db;
}

/** /api/orgs/:orgId/sites/:siteId/tides (to be built). */
export function siteTideRoutes(_deps: TidesDeps): Router {
  return Router({ mergeParams: true });
}
