import type Stripe from 'stripe';
import type { AppDeps } from '../../server/app.ts';
import express from 'express';
import { createPaymentsClient } from '../../server/billing/payments-client.ts';
import { startPaymentsStandIn, type RunningPaymentsStandIn } from '../../server/billing/payments-standin/start.ts';
import { ensurePrices } from '../../server/billing/prices.ts';
import { requireActiveSubscription } from '../../server/billing/subscription-gate.ts';
import type { Db } from '../../server/db/connect.ts';
import { errorMiddleware } from '../../server/http/error-middleware.ts';
import type { Role } from '../../shared/schemas/common.schema.ts';
import { listen, type RunningServer } from '../helpers/http.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

export const WEBHOOK_SECRET = 'whsec_test_billing_0123456789';
export const DAY_S = 86_400;
export const GRACE_DAYS = 7;

export interface BillingWorld {
  world: TeamWorld;
  standIn: RunningPaymentsStandIn;
  stripe: Stripe;
  prices: Map<string, string>;
  webhookUrl: string;
  close(): Promise<void>;
}

/** The team world with billing wired to a payments stand-in through the real SDK; our clock follows the stand-in's. */
export async function startBillingWorld(options: { retryDelaysMs?: number[]; extra?: Partial<AppDeps> } = {}): Promise<BillingWorld> {
  const standIn = await startPaymentsStandIn({ port: 0, webhookUrl: null, webhookSecret: WEBHOOK_SECRET, retryDelaysMs: options.retryDelaysMs ?? [100, 200, 400, 800, 1600] });
  const stripe = createPaymentsClient({ secretKey: standIn.secretKey, url: standIn.url });
  const prices = await ensurePrices(stripe);
  const world = await startTeamWorld({ ...options.extra, billing: { stripe, webhookSecret: WEBHOOK_SECRET, prices, graceDays: GRACE_DAYS, clock: () => standIn.now() } });
  const webhookUrl = `${world.baseUrl}/api/billing/webhook`;
  standIn.setWebhookUrl(webhookUrl);
  return {
    world,
    standIn,
    stripe,
    prices,
    webhookUrl,
    async close() {
      await standIn.close();
      await world.close();
    },
  };
}

/** A stand-in forecast route behind the gate, as the forecast area mounts it (membership set as requireMember does). */
export async function startGatedRoute(db: Db, clock: () => Date): Promise<RunningServer> {
  const app = express();
  app.get(
    '/orgs/:orgId/forecast',
    (req, _res, next) => {
      req.membership = { organisationId: String(req.params.orgId), role: (req.get('x-role') ?? 'crew') as Role };
      next();
    },
    requireActiveSubscription(db, { graceDays: GRACE_DAYS, clock }),
    (_req, res) => {
      res.json({ forecast: 'visible' });
    },
  );
  app.use(errorMiddleware);
  return listen(app);
}

/** Submits the stand-in's checkout form with a card number; answers the status and where it redirects. */
export async function payOnCheckoutPage(checkoutUrl: string, cardNumber: string): Promise<{ status: number; location: string | null; body: string }> {
  const response = await fetch(checkoutUrl, { method: 'POST', body: new URLSearchParams({ cardNumber }), redirect: 'manual' });
  return { status: response.status, location: response.headers.get('location'), body: await response.text() };
}

export async function countRows(db: Db, table: 'billing_events' | 'billing_accounts' | 'audit_events'): Promise<number> {
  const row = await db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
  return Number(row.n);
}
