import express, { Router, type Request } from 'express';
import type Stripe from 'stripe';
import { checkoutInputSchema, type CheckoutInput } from '../../shared/schemas/billing.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import * as service from './billing.service.ts';

/** Deps of the billing area. Without `stripe` and `webhookSecret`, status still answers; checkout, portal and webhooks answer 503. */
export interface BillingDeps {
  db: Db;
  /** The payments SDK client (pointed at the local stand-in or the hosted service). */
  stripe?: Stripe;
  /** The webhook endpoint's signing secret (whsec_…). */
  webhookSecret?: string;
  /** Public base URL of the app, for checkout and portal return addresses (default: the request's origin). */
  appBaseUrl?: string;
  /** Days a past-due subscription keeps forecasts unlocked (default 7). */
  graceDays?: number;
  /** The clock, for tests that move time. */
  clock?: () => Date;
  /** Lookup key → price id from ensurePrices at start-up; looked up on demand when absent. */
  prices?: Map<string, string>;
}

const origin = (req: Request) => `${req.protocol}://${req.get('host') ?? 'localhost'}`;

/** POST /api/billing/webhook: signed events from the payments service; mounted before the JSON parser (raw body). */
export function billingWebhookRoutes(deps: BillingDeps): Router {
  const router = Router();
  router.post('/billing/webhook', express.raw({ type: 'application/json', limit: '1mb' }), async (req, res) => {
    const signature = req.get('stripe-signature');
    if (!signature || !Buffer.isBuffer(req.body)) {
      throw new AppError('bad_request', 'Expected a signed payments event: a JSON body with a Stripe-Signature header.');
    }
    if (!deps.stripe || !deps.webhookSecret) throw new AppError('service_unavailable', 'Payments are not set up on this server.');
    let event: Stripe.Event;
    try {
      event = deps.stripe.webhooks.constructEvent(req.body, signature, deps.webhookSecret);
    } catch {
      throw new AppError('bad_request', 'The event signature does not verify: wrong secret, altered body, or too old.');
    }
    const result = await service.handleEvent(deps, event);
    req.log?.info({ eventId: event.id, eventType: event.type, outcome: result.outcome }, 'payments event');
    res.json({ received: true, ...result });
  });
  return router;
}

/** /api/orgs/:orgId/billing: members read whether forecasts are unlocked; owners read the detail, subscribe and manage. */
export function billingRoutes(deps: BillingDeps): Router {
  const router = Router({ mergeParams: true });
  const members = requireMember(deps.db, ALL_ROLES);
  const owners = requireMember(deps.db, ['owner']);

  router.get('/', members, async (req, res) => {
    res.json(await service.billingStatus(deps, req.membership!.organisationId, req.membership!.role));
  });
  router.post('/checkout', owners, validate({ body: checkoutInputSchema }), async (req, res) => {
    res.json(await service.startCheckout(deps, req.membership!.organisationId, req.user!, req.body as CheckoutInput, origin(req)));
  });
  router.post('/portal', owners, async (req, res) => {
    res.json(await service.openPortal(deps, req.membership!.organisationId, origin(req)));
  });
  return router;
}
