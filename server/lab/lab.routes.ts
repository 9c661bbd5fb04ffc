import { Router } from 'express';
import type { Db } from '../db/connect.ts';

/** Deps of the biologist's workbench area (filled in by that area). */
export interface LabDeps {
  db: Db;
}

/** Routes under /api/orgs/:orgId for profile versions, lab results, comparison and calibration (to be built). */
export function labRoutes(_deps: LabDeps): Router {
  return Router({ mergeParams: true });
}
