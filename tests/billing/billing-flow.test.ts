import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { billingRedirectSchema, billingStatusSchema } from '../../shared/schemas/billing.schema.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import type { RunningServer } from '../helpers/http.ts';
import { DAY_S, GRACE_DAYS, payOnCheckoutPage, startBillingWorld, startGatedRoute, type BillingWorld } from './billing-world.ts';

// Checkout → signed webhooks → trialing/active → gate open; failed renewal → past due → locked after the grace period.
// The steps build on each other, in order, on organisation A; organisation B never subscribes.
describe('subscribing and paying', () => {
  let bw: BillingWorld;
  let gated: RunningServer;
  let customerId = '';

  const status = async (key = 'ownerA') => {
    const answer = await (await bw.world.as(key)).api(bw.world.baseUrl, 'GET', `/orgs/${bw.world.orgA}/billing`);
    expect(answer.status).toBe(200);
    return billingStatusSchema.parse(answer.json);
  };
  const forecast = (orgId: string, role = 'crew') => fetch(`${gated.baseUrl}/orgs/${orgId}/forecast`, { headers: { 'x-role': role } });

  beforeAll(async () => {
    bw = await startBillingWorld();
    gated = await startGatedRoute(bw.world.database.db, () => bw.standIn.now());
  }, 60_000);
  afterAll(async () => {
    await gated?.close();
    await bw?.close();
  });

  it('locks forecasts of an organisation that never subscribed, telling crew to ask their owner and owners to subscribe', async () => {
    const crew = await forecast(bw.world.orgA, 'crew');
    expect(crew.status).toBe(402);
    const crewError = apiErrorSchema.parse(await crew.json()).error;
    expect(crewError.code).toBe('payment_required');
    expect(crewError.message).toContain('Ask an owner');
    const owner = apiErrorSchema.parse(await (await forecast(bw.world.orgA, 'owner')).json()).error;
    expect(owner.message).toContain('Subscribe');
    expect((await status()).detail).toMatchObject({ status: 'none', trialAvailable: true, plan: null });
  });

  it('takes an owner through the hosted checkout page to a trialing subscription mirrored from signed webhooks', async () => {
    const owner = await bw.world.as('ownerA');
    const started = await owner.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/checkout`, { plan: 'longline', interval: 'month' });
    expect(started.status).toBe(200);
    const { url } = billingRedirectSchema.parse(started.json);
    expect(url.startsWith(bw.standIn.url)).toBe(true);
    const page = await fetch(url);
    expect(await page.text()).toContain('14-day free trial');

    const paid = await payOnCheckoutPage(url, '4242 4242 4242 4242');
    expect(paid.status).toBe(303);
    expect(paid.location).toBe(`${bw.world.baseUrl}/o/${bw.world.orgA}/billing?checkout=complete`);
    await bw.standIn.deliveriesSettled();

    const detail = (await status()).detail!;
    expect(detail).toMatchObject({ status: 'trialing', interval: 'month', trialAvailable: false, canManage: true, cancelAtPeriodEnd: false });
    expect(detail.plan?.id).toBe('longline');
    // 14-day trial from the checkout (the stand-in's clock, which ours follows).
    expect(Date.parse(detail.trialEnd!) - bw.standIn.now().getTime()).toBeGreaterThan(13.99 * DAY_S * 1000);
    expect(detail.nextInvoice).toEqual({ amount: 14_900, currency: 'eur', date: detail.trialEnd });
    const account = await bw.world.database.db.selectFrom('billing_accounts').selectAll().where('organisation_id', '=', bw.world.orgA).executeTakeFirstOrThrow();
    customerId = account.customer_id;
    expect(bw.standIn.deliveries().every((d) => d.status === 200)).toBe(true);
  });

  it('opens the gate for the subscribing organisation and not for its neighbour', async () => {
    expect((await forecast(bw.world.orgA)).status).toBe(200);
    expect((await forecast(bw.world.orgB)).status).toBe(402);
  });

  it('shows crew only whether forecasts are unlocked, and refuses them checkout and the portal', async () => {
    const crewStatus = await status('crewA');
    expect(crewStatus).toEqual({ forecastsUnlocked: true, detail: null });
    const crew = await bw.world.as('crewA');
    expect((await crew.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/checkout`, { plan: 'buoy', interval: 'month' })).status).toBe(403);
    expect((await crew.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/portal`)).status).toBe(403);
  });

  it('refuses a second checkout while the subscription is current', async () => {
    const owner = await bw.world.as('ownerA');
    const again = await owner.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/checkout`, { plan: 'buoy', interval: 'year' });
    expect(again.status).toBe(409);
  });

  it('charges the plan at the end of the trial and becomes active, with the invoice listed', async () => {
    bw.standIn.advanceClock(15 * DAY_S);
    await bw.standIn.deliveriesSettled();
    const detail = (await status()).detail!;
    expect(detail.status).toBe('active');
    const paid = detail.invoices.filter((i) => i.status === 'paid' && i.amount === 14_900);
    expect(paid).toHaveLength(1);
    expect((await forecast(bw.world.orgA)).status).toBe(200);
  });

  it('makes the subscription past due when a renewal fails, keeping forecasts through the grace period', async () => {
    bw.standIn.setCustomerCard(customerId, '4000000000000341');
    const before = (await status()).detail!;
    const toRenewal = (Date.parse(before.currentPeriodEnd!) - bw.standIn.now().getTime()) / 1000 + 60;
    bw.standIn.advanceClock(toRenewal);
    await bw.standIn.deliveriesSettled();
    const after = await status();
    expect(after.detail!.status).toBe('past_due');
    expect(after.forecastsUnlocked).toBe(true);
    expect(Date.parse(after.detail!.locksAt!) - Date.parse(after.detail!.pastDueSince!)).toBe(GRACE_DAYS * DAY_S * 1000);
    expect(after.detail!.invoices[0]).toMatchObject({ status: 'open', amount: 14_900 });
    expect((await forecast(bw.world.orgA)).status).toBe(200);
  });

  it('locks forecasts once the grace period has passed with the invoice still unpaid', async () => {
    bw.standIn.advanceClock((GRACE_DAYS + 1) * DAY_S);
    await bw.standIn.deliveriesSettled();
    const after = await status();
    expect(after.detail!.status).toBe('past_due');
    expect(after.forecastsUnlocked).toBe(false);
    const locked = await forecast(bw.world.orgA, 'owner');
    expect(locked.status).toBe(402);
    expect(apiErrorSchema.parse(await locked.json()).error.message).toContain('grace period has ended');
  });

  it('unlocks again when the owner pays with a working card through the portal', async () => {
    const owner = await bw.world.as('ownerA');
    const portal = billingRedirectSchema.parse((await owner.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/portal`)).json);
    const updated = await fetch(`${portal.url}/card`, { method: 'POST', body: new URLSearchParams({ cardNumber: '4242424242424242' }), redirect: 'manual' });
    expect(updated.status).toBe(303);
    await bw.standIn.deliveriesSettled();
    const after = await status();
    expect(after.detail!.status).toBe('active');
    expect(after.forecastsUnlocked).toBe(true);
    expect((await forecast(bw.world.orgA)).status).toBe(200);
  });

  it('cancels at the period end through the portal: no next invoice, then canceled and locked', async () => {
    const owner = await bw.world.as('ownerA');
    const portal = billingRedirectSchema.parse((await owner.api(bw.world.baseUrl, 'POST', `/orgs/${bw.world.orgA}/billing/portal`)).json);
    expect((await fetch(`${portal.url}/cancel`, { method: 'POST', redirect: 'manual' })).status).toBe(303);
    await bw.standIn.deliveriesSettled();
    const pending = (await status()).detail!;
    expect(pending).toMatchObject({ status: 'active', cancelAtPeriodEnd: true, nextInvoice: null });
    bw.standIn.advanceClock((Date.parse(pending.currentPeriodEnd!) - bw.standIn.now().getTime()) / 1000 + 60);
    await bw.standIn.deliveriesSettled();
    const ended = await status();
    expect(ended.detail).toMatchObject({ status: 'canceled', trialAvailable: false });
    expect(ended.forecastsUnlocked).toBe(false);
  });

  it('records the subscription changes in the audit log', async () => {
    const rows = await bw.world.database.db.selectFrom('audit_events').select(['action', 'details']).where('organisation_id', '=', bw.world.orgA).where('action', 'like', 'billing.%').execute();
    const statuses = rows.filter((r) => r.action === 'billing.subscription_changed').map((r) => (r.details as { status: string }).status);
    expect(statuses).toEqual(expect.arrayContaining(['trialing', 'active', 'past_due', 'canceled']));
    expect(rows.some((r) => r.action === 'billing.checkout_started')).toBe(true);
  });
});
