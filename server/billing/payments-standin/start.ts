/**
 * The local payments stand-in: plays the hosted payments service on loopback so Planktide runs its
 * billing through the real payments SDK (pointed here with host, port and protocol 'http').
 *
 * - API (/v1, form-encoded requests as the SDK sends them, JSON answers shaped like the service's):
 *   customers, products, prices (lookup_keys), checkout sessions (mode subscription), subscriptions
 *   (retrieve, list, update: cancel_at_period_end, price and quantity of items; cancel), invoices,
 *   billing portal sessions, events. Bearer secret key required. Idempotency-Key replays the first answer.
 * - Pages: /checkout/:id (test card numbers decide the outcome, see cards.ts; 4000002500003155 adds an
 *   authentication step), /portal/:id (change plan, cancel at period end or keep, update card, invoices),
 *   /invoices/:id.
 * - Billing cycle: trials end into a charge on the saved card; each period renews with a charge; a failed
 *   charge makes the subscription past_due and sends invoice.payment_failed, is tried again every 3 days,
 *   and after the 4th failed attempt the subscription is canceled. No proration.
 * - Webhooks: every event is POSTed to webhookUrl, signed with webhookSecret (Stripe-Signature: t=..,v1=..),
 *   in order; failures are retried after retryDelaysMs while later events go ahead.
 * - Clock: the real clock plus an offset; advanceClock(seconds) runs what falls due on the way, each at
 *   its own time (event `created` uses this clock; signatures use the real time, as receivers check it).
 * - State is in memory: a restart forgets everything (prices are created again at Planktide's start).
 */
import type { Server } from 'node:http';
import express from 'express';
import { eventJson, apiHandlers } from './api-handlers.ts';
import { pageHandlers } from './page-handlers.ts';
import { messagePage } from './pages.ts';
import { PaymentsState, StandInError } from './payments-state.ts';
import type { EventRecord, Json } from './records.ts';
import { WebhookSender, type DeliveryAttempt } from './webhook-sender.ts';

export const STANDIN_SECRET_KEY = 'sk_test_planktide_standin';

export interface PaymentsStandInOptions {
  /** 0 picks a free port. */
  port: number;
  host?: string;
  /** Where events are delivered; null delivers nothing. */
  webhookUrl: string | null;
  webhookSecret: string;
  secretKey?: string;
  /** Waits before each retry of a failed delivery (default 1 s, 5 s, 30 s, 2 min, 10 min, 1 h). */
  retryDelaysMs?: number[];
}

export interface RunningPaymentsStandIn {
  url: string;
  host: string;
  port: number;
  secretKey: string;
  /** The stand-in's clock. */
  now(): Date;
  /** Moves the clock forward, running trial ends, renewals, retries and cancellations due on the way. */
  advanceClock(seconds: number): void;
  /** Every event made so far, oldest first, as the API answers them. */
  events(): Json[];
  /** Every delivery attempt so far. */
  deliveries(): DeliveryAttempt[];
  /** Events not yet delivered successfully. */
  pendingDeliveries(): { eventId: string; type: string; attempts: number }[];
  /** Resolves when no delivery is waiting. */
  deliveriesSettled(): Promise<void>;
  /** Points webhook deliveries at another endpoint (e.g. once the app listens). */
  setWebhookUrl(url: string | null): void;
  pauseDeliveries(): void;
  resumeDeliveries(): void;
  /** Sends one event to the endpoint now (signed), whatever the queue; answers the HTTP status (0: unreachable). */
  deliverNow(eventId: string): Promise<number>;
  /** Saves a test card on a customer (as the portal's card form does); a past-due invoice is tried at once. */
  setCustomerCard(customerId: string, cardNumber: string): void;
  close(): Promise<void>;
}

export async function startPaymentsStandIn(options: PaymentsStandInOptions): Promise<RunningPaymentsStandIn> {
  const host = options.host ?? '127.0.0.1';
  const secretKey = options.secretKey ?? STANDIN_SECRET_KEY;
  const sender = new WebhookSender({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    retryDelaysMs: options.retryDelaysMs ?? [1_000, 5_000, 30_000, 120_000, 600_000, 3_600_000],
  });
  const payloads = new Map<string, string>();
  const onEvent = (event: EventRecord) => {
    const payload = JSON.stringify(eventJson(event), null, 2);
    payloads.set(event.id, payload);
    sender.enqueue(event, payload);
  };

  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'extended');
  app.use(express.urlencoded({ extended: true, limit: '1mb' }));

  const state = new PaymentsState('', onEvent);
  app.use(apiHandlers(state, secretKey));
  app.use(pageHandlers(state));
  app.use((error: unknown, req: express.Request, res: express.Response, _next: express.NextFunction) => {
    const known = error instanceof StandInError ? error : null;
    const status = known?.status ?? 500;
    const message = known?.message ?? 'The payments stand-in failed.';
    if (req.path.startsWith('/v1')) res.status(status).json({ error: { type: known?.type ?? 'api_error', message } });
    else res.status(status).set('content-type', 'text/html; charset=utf-8').send(messagePage('Something went wrong', message));
  });

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port, host, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  const url = `http://${host}:${port}`;
  state.baseUrl = url;

  return {
    url,
    host,
    port,
    secretKey,
    now: () => new Date(state.now() * 1000),
    advanceClock: (seconds) => state.advance(seconds),
    events: () => state.events.map(eventJson),
    deliveries: () => [...sender.attempts],
    pendingDeliveries: () => sender.pending(),
    deliveriesSettled: () => sender.idle(),
    setWebhookUrl: (url) => sender.setUrl(url),
    pauseDeliveries: () => sender.pause(),
    resumeDeliveries: () => sender.resume(),
    deliverNow: async (eventId) => {
      const payload = payloads.get(eventId);
      if (!payload) throw new Error(`No event ${eventId} in the stand-in`);
      const event = state.events.find((e) => e.id === eventId)!;
      return sender.send(eventId, event.type, payload);
    },
    setCustomerCard: (customerId, cardNumber) => {
      const result = state.updateCard(customerId, cardNumber);
      if (!result.ok) throw new Error(result.message);
    },
    close: () =>
      new Promise<void>((resolve) => {
        sender.close();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
