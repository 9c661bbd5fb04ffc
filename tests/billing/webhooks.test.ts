import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/free-port.ts';
import { countRows, startBillingWorld, WEBHOOK_SECRET, type BillingWorld } from './billing-world.ts';

// Webhook endpoint: signatures on the raw body, idempotency by event id, order-independence, retries.
describe('payments webhooks', () => {
  let bw: BillingWorld;
  const price = () => bw.prices.get('planktide_buoy_month')!;

  /** A customer with a working card and a subscription made through the API (no checkout page), tagged with org A. */
  async function subscribeOrgA(trialDays?: number) {
    bw.standIn.advanceClock(60); // each subscription a minute after the last, as in life
    const customer = await bw.stripe.customers.create({ email: 'owner@alder.test', metadata: { organisation_id: bw.world.orgA } });
    bw.standIn.setCustomerCard(customer.id, '4242424242424242');
    const sub = await bw.stripe.subscriptions.create({ customer: customer.id, items: [{ price: price() }], metadata: { organisation_id: bw.world.orgA }, ...(trialDays ? { trial_period_days: trialDays } : {}) });
    return { customer, sub };
  }
  const eventsOf = (subscriptionId: string) =>
    bw.standIn.events().filter((e) => ((e.data as { object: { id?: string } }).object.id ?? '') === subscriptionId) as { id: string; type: string }[];
  const mirror = () => bw.world.database.db.selectFrom('billing_accounts').selectAll().where('organisation_id', '=', bw.world.orgA).executeTakeFirst();
  const post = (body: string, signature?: string) =>
    fetch(bw.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', ...(signature ? { 'stripe-signature': signature } : {}) }, body });

  beforeAll(async () => {
    bw = await startBillingWorld({ retryDelaysMs: [150, 300, 600, 1200] });
    bw.standIn.pauseDeliveries();
  }, 60_000);
  afterAll(async () => {
    await bw?.close();
  });

  it('answers 400 to a bad signature, an altered body or no signature, and changes nothing', async () => {
    const { sub } = await subscribeOrgA();
    const event = eventsOf(sub.id).find((e) => e.type === 'customer.subscription.created')!;
    const payload = JSON.stringify(event);
    const db = bw.world.database.db;
    const before = await Promise.all([countRows(db, 'billing_events'), countRows(db, 'billing_accounts'), countRows(db, 'audit_events')]);

    const wrongSecret = bw.stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_ours_0123456789' });
    const rightSignature = bw.stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET });
    const altered = payload.replace('"trialing"', '"active"').replace('"active"', '"canceled"');
    const stale = bw.stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET, timestamp: Math.floor(Date.now() / 1000) - 3600 });
    for (const [body, signature] of [[payload, wrongSecret], [altered, rightSignature], [payload, undefined], [payload, stale]] as const) {
      const answer = await post(body, signature);
      expect(answer.status).toBe(400);
      expect(((await answer.json()) as { error: { code: string } }).error.code).toBe('bad_request');
    }
    const after = await Promise.all([countRows(db, 'billing_events'), countRows(db, 'billing_accounts'), countRows(db, 'audit_events')]);
    expect(after).toEqual(before);
    await bw.stripe.subscriptions.cancel(sub.id);
  });

  it('applies an event delivered twice once: one recorded event, one audit entry', async () => {
    const { sub } = await subscribeOrgA();
    const created = eventsOf(sub.id).find((e) => e.type === 'customer.subscription.created')!;
    expect(await bw.standIn.deliverNow(created.id)).toBe(200);
    expect(await bw.standIn.deliverNow(created.id)).toBe(200);
    const db = bw.world.database.db;
    expect(await db.selectFrom('billing_events').select('event_id').where('event_id', '=', created.id).execute()).toHaveLength(1);
    const audits = await db.selectFrom('audit_events').select('details').where('action', '=', 'billing.subscription_changed').execute();
    expect(audits.filter((a) => (a.details as { eventId: string }).eventId === created.id)).toHaveLength(1);
    expect((await mirror())?.status).toBe('active');
  });

  it('answers the second delivery of an event as a duplicate', async () => {
    const { sub } = await subscribeOrgA();
    const created = eventsOf(sub.id).find((e) => e.type === 'customer.subscription.created')!;
    const payload = JSON.stringify(created);
    const sign = () => bw.stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET });
    expect(await (await post(payload, sign())).json()).toMatchObject({ received: true, outcome: 'applied' });
    expect(await (await post(payload, sign())).json()).toMatchObject({ received: true, outcome: 'duplicate' });
  });

  it('ends in the state the payments service has when events arrive newest first', async () => {
    const { sub } = await subscribeOrgA(14);
    await bw.stripe.subscriptions.update(sub.id, { items: [{ id: sub.items.data[0]!.id, quantity: 3 }] });
    await bw.stripe.subscriptions.update(sub.id, { cancel_at_period_end: true });
    await bw.stripe.subscriptions.cancel(sub.id);
    const events = eventsOf(sub.id);
    expect(events.map((e) => e.type)).toEqual(['customer.subscription.created', 'customer.subscription.updated', 'customer.subscription.updated', 'customer.subscription.deleted']);
    for (const event of [...events].reverse()) expect(await bw.standIn.deliverNow(event.id)).toBe(200);
    const row = await mirror();
    expect(row).toMatchObject({ subscription_id: sub.id, status: 'canceled', quantity: 3, cancel_at_period_end: true });
  });

  it('leaves a newer subscription in place when a late event about an older one arrives', async () => {
    const older = await subscribeOrgA();
    await bw.stripe.subscriptions.cancel(older.sub.id);
    const newer = await subscribeOrgA(14);
    for (const event of eventsOf(newer.sub.id)) expect(await bw.standIn.deliverNow(event.id)).toBe(200);
    expect(await mirror()).toMatchObject({ subscription_id: newer.sub.id, status: 'trialing' });
    const late = eventsOf(older.sub.id).find((e) => e.type === 'customer.subscription.deleted')!;
    const answer = await post(JSON.stringify(late), bw.stripe.webhooks.generateTestHeaderString({ payload: JSON.stringify(late), secret: WEBHOOK_SECRET }));
    expect(await answer.json()).toMatchObject({ outcome: 'stale' });
    expect(await mirror()).toMatchObject({ subscription_id: newer.sub.id, status: 'trialing' });
    await bw.stripe.subscriptions.cancel(newer.sub.id);
  });

  it('retries a delivery with growing waits while our endpoint is down, until it is up again', async () => {
    bw.standIn.setWebhookUrl(`http://127.0.0.1:${await freePort()}/api/billing/webhook`);
    bw.standIn.resumeDeliveries();
    await bw.standIn.deliveriesSettled();
    const { sub } = await subscribeOrgA(14);
    const created = eventsOf(sub.id).find((e) => e.type === 'customer.subscription.created')!;
    await expect.poll(() => bw.standIn.deliveries().filter((d) => d.eventId === created.id).length, { timeout: 5000 }).toBeGreaterThanOrEqual(2);
    const failed = bw.standIn.deliveries().filter((d) => d.eventId === created.id);
    expect(failed.every((d) => d.status === 0)).toBe(true);
    expect(failed[1]!.at.getTime() - failed[0]!.at.getTime()).toBeGreaterThanOrEqual(140);
    expect(await bw.world.database.db.selectFrom('billing_events').select('event_id').where('event_id', '=', created.id).execute()).toHaveLength(0);

    bw.standIn.setWebhookUrl(bw.webhookUrl);
    await bw.standIn.deliveriesSettled();
    const attempts = bw.standIn.deliveries().filter((d) => d.eventId === created.id);
    expect(attempts.at(-1)!.status).toBe(200);
    expect(await bw.world.database.db.selectFrom('billing_events').select('event_id').where('event_id', '=', created.id).execute()).toHaveLength(1);
    expect(await mirror()).toMatchObject({ subscription_id: sub.id, status: 'trialing' });
  });
});
