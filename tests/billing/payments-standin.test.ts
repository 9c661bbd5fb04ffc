import { createServer, type Server } from 'node:http';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPaymentsClient } from '../../server/billing/payments-client.ts';
import { startPaymentsStandIn, type RunningPaymentsStandIn } from '../../server/billing/payments-standin/start.ts';
import { ensurePrices } from '../../server/billing/prices.ts';
import { PLANS } from '../../server/billing/plans.ts';
import { DAY_S, payOnCheckoutPage } from './billing-world.ts';

const SECRET = 'whsec_standin_test_0123456789';

// The stand-in, driven through the real payments SDK; the SDK's own constructEvent checks its signatures.
describe('payments stand-in', () => {
  let standIn: RunningPaymentsStandIn;
  let stripe: Stripe;
  let receiver: Server;
  const received: Stripe.Event[] = [];
  let prices: Map<string, string>;

  beforeAll(async () => {
    receiver = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      req.on('end', () => {
        try {
          received.push(stripe.webhooks.constructEvent(Buffer.concat(chunks), String(req.headers['stripe-signature']), SECRET));
          res.writeHead(200).end();
        } catch {
          res.writeHead(400).end();
        }
      });
    });
    await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
    const address = receiver.address();
    const port = typeof address === 'object' && address ? address.port : 0;
    standIn = await startPaymentsStandIn({ port: 0, webhookUrl: `http://127.0.0.1:${port}/hook`, webhookSecret: SECRET, retryDelaysMs: [50] });
    stripe = createPaymentsClient({ secretKey: standIn.secretKey, url: standIn.url });
    prices = await ensurePrices(stripe);
  });
  afterAll(async () => {
    await standIn?.close();
    await new Promise((resolve) => receiver?.close(resolve));
  });

  async function checkout(trialDays?: number) {
    const customer = await stripe.customers.create({ email: 'someone@farm.test' });
    const session = await stripe.checkout.sessions.create({
      mode: 'subscription',
      customer: customer.id,
      line_items: [{ price: prices.get('planktide_buoy_month')!, quantity: 1 }],
      ...(trialDays ? { subscription_data: { trial_period_days: trialDays } } : {}),
      success_url: 'http://127.0.0.1:9/done?session={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://127.0.0.1:9/cancelled',
    });
    return { customer, session };
  }

  it('creates each plan price once, found again by lookup key on a second run', async () => {
    const again = await ensurePrices(stripe);
    expect(again).toEqual(prices);
    const listed = await stripe.prices.list({ limit: 100 });
    expect(listed.data).toHaveLength(PLANS.length * 2);
    const buoy = await stripe.prices.retrieve(prices.get('planktide_buoy_year')!);
    expect(buoy).toMatchObject({ unit_amount: 49_000, currency: 'eur', lookup_key: 'planktide_buoy_year', recurring: { interval: 'year' } });
  });

  it('replaces a price whose amount changed in the plan file, moving the lookup key to the new one', async () => {
    const changed = PLANS.map((p) => (p.id === 'buoy' ? { ...p, prices: { ...p.prices, month: 5_900 } } : p));
    const next = await ensurePrices(stripe, changed);
    expect(next.get('planktide_buoy_month')).not.toBe(prices.get('planktide_buoy_month'));
    const found = await stripe.prices.list({ lookup_keys: ['planktide_buoy_month'] });
    expect(found.data.map((p) => p.unit_amount)).toEqual([5_900]);
    prices = await ensurePrices(stripe);
    expect((await stripe.prices.retrieve(prices.get('planktide_buoy_month')!)).unit_amount).toBe(4_900);
  });

  it('refuses a call with an unknown secret key, as the service does', async () => {
    const stranger = createPaymentsClient({ secretKey: 'sk_test_wrong', url: standIn.url });
    await expect(stranger.customers.list()).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
  });

  it('shows the decline on the checkout page and makes no subscription for the declined test card', async () => {
    const { session } = await checkout();
    const answer = await payOnCheckoutPage(session.url!, '4000000000000002');
    expect(answer.status).toBe(402);
    expect(answer.body).toContain('Your card was declined');
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
  });

  it('asks for authentication with the 3155 card and completes once confirmed', async () => {
    const { session, customer } = await checkout();
    const first = await payOnCheckoutPage(session.url!, '4000002500003155');
    expect(first.location).toBe(`/checkout/${session.id}/authenticate`);
    const refused = await fetch(`${standIn.url}/checkout/${session.id}/authenticate`, { method: 'POST', body: new URLSearchParams({ decision: 'refuse' }), redirect: 'manual' });
    expect(await refused.text()).toContain('Authentication failed');
    await payOnCheckoutPage(session.url!, '4000002500003155');
    const confirmed = await fetch(`${standIn.url}/checkout/${session.id}/authenticate`, { method: 'POST', body: new URLSearchParams({ decision: 'confirm' }), redirect: 'manual' });
    expect(confirmed.headers.get('location')).toBe(`http://127.0.0.1:9/done?session=${session.id}`);
    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription'] });
    expect(done.status).toBe('complete');
    expect((done.subscription as Stripe.Subscription).status).toBe('active');
    const invoices = await stripe.invoices.list({ customer: customer.id });
    expect(invoices.data.map((i) => [i.status, i.amount_paid])).toEqual([['paid', 4_900]]);
  });

  it('delivers events signed so that the SDK verifies them, in the order they happened', async () => {
    const { session } = await checkout(14);
    await payOnCheckoutPage(session.url!, '4242424242424242');
    await standIn.deliveriesSettled();
    const ours = received.filter((e) => {
      const object = e.data.object as { id?: string; subscription?: string; customer?: string };
      return object.id === session.id || object.customer === session.customer || object.subscription === session.subscription;
    });
    expect(ours.map((e) => e.type)).toEqual(expect.arrayContaining(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']));
    expect(ours.map((e) => e.type).indexOf('customer.subscription.created')).toBeLessThan(ours.map((e) => e.type).indexOf('checkout.session.completed'));
  });

  it('changes the quantity, and ends a subscription set to cancel at the period end when the clock reaches it', async () => {
    const { session } = await checkout();
    await payOnCheckoutPage(session.url!, '4242424242424242');
    const subId = (await stripe.checkout.sessions.retrieve(session.id)).subscription as string;
    const sub = await stripe.subscriptions.retrieve(subId);
    const updated = await stripe.subscriptions.update(subId, { items: [{ id: sub.items.data[0]!.id, quantity: 4 }], cancel_at_period_end: true });
    expect(updated.items.data[0]!.quantity).toBe(4);
    expect(updated.cancel_at).toBe(updated.items.data[0]!.current_period_end);
    standIn.advanceClock(32 * DAY_S);
    const ended = await stripe.subscriptions.retrieve(subId);
    expect(ended.status).toBe('canceled');
    expect(ended.ended_at).toBe(updated.items.data[0]!.current_period_end);
  });

  it('tries a failed renewal again every 3 days and cancels after the 4th failure', async () => {
    const { session, customer } = await checkout(14);
    await payOnCheckoutPage(session.url!, '4000000000000341');
    const subId = (await stripe.checkout.sessions.retrieve(session.id)).subscription as string;
    standIn.advanceClock(14 * DAY_S + 60);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('past_due');
    standIn.advanceClock(7 * DAY_S);
    const invoice = (await stripe.invoices.list({ customer: customer.id, status: 'open' })).data[0]!;
    expect(invoice.attempt_count).toBe(3);
    standIn.advanceClock(3 * DAY_S);
    expect((await stripe.subscriptions.retrieve(subId)).status).toBe('canceled');
  });
});
