import Stripe from 'stripe';
import type { BillingInterval, BillingStatus, CheckoutInput, Invoice, SubscriptionStatus } from '../../shared/schemas/billing.schema.ts';
import type { Role } from '../../shared/schemas/common.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { BillingAccount, BillingAccountUpdate } from '../db/tables/billing.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentUser } from '../http/request-context.ts';
import type { BillingDeps } from './billing.routes.ts';
import * as repo from './billing.repository.ts';
import { findPlan, lookupKey, planForLookupKey, PLANS } from './plans.ts';
import { accessFromAccount } from './subscription-gate.ts';

/** Subscriptions that have not ended: a new checkout would make a second one. */
const CURRENT: readonly string[] = ['trialing', 'active', 'past_due', 'unpaid', 'paused', 'incomplete'];

const iso = (unixSeconds: number) => new Date(unixSeconds * 1000).toISOString();

function payments(deps: BillingDeps): Stripe {
  if (!deps.stripe) throw new AppError('service_unavailable', 'Payments are not set up on this server. Ask its operator to configure the payments service.');
  return deps.stripe;
}

/** Turns the payments service being unreachable or failing into a 503 the client can show. */
async function callPayments<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (error) {
    if (error instanceof Stripe.errors.StripeError && !(error instanceof Stripe.errors.StripeInvalidRequestError)) {
      throw new AppError('service_unavailable', 'The payments service did not answer as expected. Try again in a minute.');
    }
    throw error;
  }
}

function toInvoice(invoice: Stripe.Invoice): Invoice {
  return {
    id: invoice.id ?? '',
    number: invoice.number,
    status: invoice.status ?? 'draft',
    amount: invoice.amount_due,
    currency: invoice.currency,
    createdAt: iso(invoice.created),
    periodStart: iso(invoice.period_start),
    periodEnd: iso(invoice.period_end),
    url: invoice.hosted_invoice_url ?? null,
  };
}

export async function billingStatus(deps: BillingDeps, organisationId: string, role: Role): Promise<BillingStatus> {
  const account = await repo.findAccount(deps.db, organisationId);
  const access = accessFromAccount(account, deps);
  if (role !== 'owner') return { forecastsUnlocked: access.unlocked, detail: null };

  const plan = findPlan(account?.plan_id) ?? null;
  const interval = account?.billing_interval ?? null;
  const renewing = (access.status === 'trialing' || access.status === 'active' || access.status === 'past_due') && !account?.cancel_at_period_end;
  let invoices: Invoice[] = [];
  let invoicesUnavailable = false;
  if (account && deps.stripe) {
    try {
      invoices = (await deps.stripe.invoices.list({ customer: account.customer_id, limit: 24 })).data.map(toInvoice);
    } catch {
      invoicesUnavailable = true;
    }
  }
  return {
    forecastsUnlocked: access.unlocked,
    detail: {
      status: access.status,
      plan,
      interval,
      trialEnd: access.status === 'trialing' && account?.trial_end ? account.trial_end.toISOString() : null,
      currentPeriodEnd: account?.current_period_end?.toISOString() ?? null,
      cancelAtPeriodEnd: account?.cancel_at_period_end ?? false,
      pastDueSince: access.status === 'past_due' ? (account?.past_due_since?.toISOString() ?? null) : null,
      locksAt: access.locksAt?.toISOString() ?? null,
      nextInvoice:
        renewing && plan && interval && account?.current_period_end
          ? { amount: plan.prices[interval] * (account.quantity ?? 1), currency: plan.currency, date: account.current_period_end.toISOString() }
          : null,
      invoices,
      invoicesUnavailable,
      trialAvailable: !account?.subscription_id,
      canManage: Boolean(account?.subscription_id),
      plans: [...PLANS],
    },
  };
}

async function priceIdFor(deps: BillingDeps, stripe: Stripe, planId: string, interval: BillingInterval): Promise<string> {
  const key = lookupKey(planId, interval);
  const known = deps.prices?.get(key);
  if (known) return known;
  const found = await callPayments(() => stripe.prices.list({ lookup_keys: [key], active: true, limit: 1 }));
  const id = found.data[0]?.id;
  if (!id) throw new AppError('service_unavailable', 'This plan has no price in the payments service yet. Ask the operator to restart Planktide, which creates the prices.');
  return id;
}

/** The organisation's payments customer, made (or made again, when the service no longer knows it) on first use. */
async function customerFor(deps: BillingDeps, stripe: Stripe, organisationId: string, account: BillingAccount | undefined, actor: CurrentUser): Promise<string> {
  if (account) {
    const known = await callPayments(() => stripe.customers.retrieve(account.customer_id)).catch((error: unknown) => {
      if (error instanceof Stripe.errors.StripeInvalidRequestError && error.code === 'resource_missing') return null;
      throw error;
    });
    if (known && !known.deleted) return account.customer_id;
  }
  const organisation = await deps.db.selectFrom('organisations').select('name').where('id', '=', organisationId).executeTakeFirstOrThrow();
  const customer = await callPayments(() => stripe.customers.create({ email: actor.email, name: organisation.name, metadata: { organisation_id: organisationId } }));
  await repo.saveCustomer(deps.db, organisationId, customer.id);
  return customer.id;
}

const baseUrl = (deps: BillingDeps, requestOrigin: string) => (deps.appBaseUrl ?? requestOrigin).replace(/\/$/, '');

export async function startCheckout(deps: BillingDeps, organisationId: string, actor: CurrentUser, input: CheckoutInput, requestOrigin: string): Promise<{ url: string }> {
  const plan = findPlan(input.plan);
  if (!plan) {
    throw new AppError('validation_failed', `The request body has problems: plan: no such plan; choose one of ${PLANS.map((p) => p.id).join(', ')}.`, [{ path: 'plan', message: 'no such plan' }]);
  }
  const account = await repo.findAccount(deps.db, organisationId);
  if (account?.status && CURRENT.includes(account.status)) {
    throw new AppError('conflict', 'This organisation already has a subscription. Change or cancel it through "Manage subscription".');
  }
  const stripe = payments(deps);
  const price = await priceIdFor(deps, stripe, plan.id, input.interval);
  const customer = await customerFor(deps, stripe, organisationId, account, actor);
  const back = `${baseUrl(deps, requestOrigin)}/o/${organisationId}/billing`;
  const trial = !account?.subscription_id && plan.trialDays > 0;
  const session = await callPayments(() =>
    stripe.checkout.sessions.create({
      mode: 'subscription',
      customer,
      client_reference_id: organisationId,
      line_items: [{ price, quantity: 1 }],
      subscription_data: { metadata: { organisation_id: organisationId }, ...(trial ? { trial_period_days: plan.trialDays } : {}) },
      metadata: { organisation_id: organisationId },
      success_url: `${back}?checkout=complete`,
      cancel_url: `${back}?checkout=cancelled`,
    }),
  );
  if (!session.url) throw new AppError('service_unavailable', 'The payments service gave no checkout page. Try again.');
  await recordAudit(deps.db, { organisationId, actorUserId: actor.id, action: 'billing.checkout_started', subject: plan.name, details: { interval: input.interval, trial } });
  return { url: session.url };
}

export async function openPortal(deps: BillingDeps, organisationId: string, requestOrigin: string): Promise<{ url: string }> {
  const account = await repo.findAccount(deps.db, organisationId);
  if (!account?.subscription_id) throw new AppError('conflict', 'There is no subscription to manage yet. Choose a plan and subscribe first.');
  const stripe = payments(deps);
  const session = await callPayments(() => stripe.billingPortal.sessions.create({ customer: account.customer_id, return_url: `${baseUrl(deps, requestOrigin)}/o/${organisationId}/billing` }));
  return { url: session.url };
}

// ---- webhook events ----

interface EventReferences {
  subscriptionId?: string;
  customerId?: string;
  organisationId?: string;
}

const idOf = (value: unknown): string | undefined =>
  typeof value === 'string' ? value : value && typeof value === 'object' && 'id' in value && typeof value.id === 'string' ? value.id : undefined;

/** Which subscription, customer and organisation an event is about, whatever its type. */
export function eventReferences(event: Stripe.Event): EventReferences {
  const object = event.data.object as unknown as Record<string, unknown>;
  const metadata = (object.metadata ?? {}) as Record<string, string>;
  switch (object.object) {
    case 'subscription':
      return { subscriptionId: idOf(object.id), customerId: idOf(object.customer), organisationId: metadata.organisation_id };
    case 'invoice': {
      const details = (object.parent as { subscription_details?: { subscription?: unknown; metadata?: Record<string, string> } | null } | null)?.subscription_details;
      return { subscriptionId: idOf(details?.subscription), customerId: idOf(object.customer), organisationId: details?.metadata?.organisation_id };
    }
    case 'checkout.session':
      return { subscriptionId: idOf(object.subscription), customerId: idOf(object.customer), organisationId: (object.client_reference_id as string | null) ?? metadata.organisation_id };
    default:
      return { customerId: idOf(object.customer) };
  }
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The mirror of a subscription as the payments service has it now. */
function mirrorOf(sub: Stripe.Subscription, account: BillingAccount, event: Stripe.Event): BillingAccountUpdate {
  const item = sub.items.data[0];
  const price = item?.price;
  const mapped =
    planForLookupKey(price?.lookup_key) ??
    (findPlan(price?.metadata?.planktide_plan) && (price?.recurring?.interval === 'month' || price?.recurring?.interval === 'year')
      ? { plan: findPlan(price.metadata.planktide_plan)!, interval: price.recurring.interval as BillingInterval }
      : undefined);
  const latest = sub.latest_invoice && typeof sub.latest_invoice === 'object' ? sub.latest_invoice : null;
  let pastDueSince: Date | null = null;
  if (sub.status === 'past_due') {
    if (account.status === 'past_due' && account.past_due_since) pastDueSince = account.past_due_since;
    else if (latest && latest.status === 'open') pastDueSince = new Date(latest.created * 1000);
    else pastDueSince = new Date(event.created * 1000);
  }
  return {
    subscription_id: sub.id,
    subscription_created_at: new Date(sub.created * 1000),
    plan_id: mapped?.plan.id ?? null,
    billing_interval: mapped?.interval ?? null,
    price_id: price?.id ?? null,
    status: sub.status,
    quantity: item?.quantity ?? null,
    trial_end: sub.trial_end ? new Date(sub.trial_end * 1000) : null,
    current_period_end: item ? new Date(item.current_period_end * 1000) : null,
    cancel_at_period_end: sub.cancel_at_period_end,
    past_due_since: pastDueSince,
    synced_at: new Date(),
  };
}

export type EventOutcome = 'applied' | 'duplicate' | 'ignored' | 'stale';

/**
 * Applies one verified payments event, once: its id is recorded in the same transaction as the change,
 * and a second delivery finds it there. The subscription is read again from the payments service (with
 * the organisation's row locked) rather than taken from the event, so events arriving out of order,
 * or late, still leave the mirror as the service has it now.
 */
export async function handleEvent(deps: BillingDeps, event: Stripe.Event): Promise<{ outcome: EventOutcome; status?: SubscriptionStatus | string }> {
  const refs = eventReferences(event);
  let organisationId = refs.customerId ? await repo.findOrganisationByCustomer(deps.db, refs.customerId) : undefined;
  if (!organisationId && refs.organisationId && UUID.test(refs.organisationId) && (await repo.organisationExists(deps.db, refs.organisationId))) {
    organisationId = refs.organisationId;
  }
  return deps.db.transaction().execute(async (trx) => {
    const fresh = await repo.recordEvent(trx, { id: event.id, type: event.type, organisationId: organisationId ?? null, created: new Date(event.created * 1000) });
    if (!fresh) return { outcome: 'duplicate' as const };
    if (!organisationId || !refs.subscriptionId) return { outcome: 'ignored' as const };
    let account = await repo.lockAccount(trx, organisationId);
    if (!account && refs.customerId) {
      await repo.saveCustomer(trx, organisationId, refs.customerId);
      account = await repo.lockAccount(trx, organisationId);
    }
    if (!account) return { outcome: 'ignored' as const };
    const stripe = payments(deps);
    const sub = await stripe.subscriptions.retrieve(refs.subscriptionId, { expand: ['latest_invoice'] });
    // An event about an older subscription (e.g. a late one about a canceled one) leaves a newer one alone;
    // of two made in the same second, one that has not ended stays.
    if (account.subscription_id && account.subscription_id !== sub.id) {
      const current = account.subscription_created_at?.getTime() ?? 0;
      const incoming = sub.created * 1000;
      const currentEnded = account.status === 'canceled' || account.status === 'incomplete_expired';
      if (incoming < current || (incoming === current && !currentEnded)) return { outcome: 'stale' as const };
    }
    const mirror = mirrorOf(sub, account, event);
    await repo.updateAccount(trx, organisationId, mirror);
    if (mirror.status !== account.status || mirror.plan_id !== account.plan_id || mirror.cancel_at_period_end !== account.cancel_at_period_end) {
      await recordAudit(trx, {
        organisationId,
        actorUserId: null,
        action: 'billing.subscription_changed',
        subject: findPlan(mirror.plan_id as string | null)?.name ?? 'subscription',
        details: { eventId: event.id, eventType: event.type, status: mirror.status, previousStatus: account.status, interval: mirror.billing_interval, cancelAtPeriodEnd: mirror.cancel_at_period_end },
      });
    }
    return { outcome: 'applied' as const, status: sub.status };
  });
}
