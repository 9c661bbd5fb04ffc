import { Router } from 'express';
import type { Db } from '../db/connect.ts';

/** Deps of the billing area (filled in by that area, e.g. the payments client and webhook secret). */
export interface BillingDeps {
  db: Db;
}

/** Webhook routes that need the raw body; mounted before the JSON parser (to be built). */
export function billingWebhookRoutes(_deps: BillingDeps): Router {
  return Router();
}

/** /api/orgs/:orgId/billing (to be built). */
export function billingRoutes(_deps: BillingDeps): Router {
  return Router({ mergeParams: true });
}
