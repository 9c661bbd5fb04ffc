import { Router } from 'express';
import type { Db } from '../db/connect.ts';

/** Deps of the sampling-plan area (filled in by that area). */
export interface SamplingDeps {
  db: Db;
}

/** Routes under /api/orgs/:orgId for sampling plans (to be built). */
export function samplingRoutes(_deps: SamplingDeps): Router {
  return Router({ mergeParams: true });
}
