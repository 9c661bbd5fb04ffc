/** The stand-in's own records (what it remembers), and their JSON shapes as the payments API answers them. */

export type Json = Record<string, unknown>;
export type Metadata = Record<string, string>;
export type Interval = 'day' | 'week' | 'month' | 'year';
export type SubscriptionStatus = 'trialing' | 'active' | 'past_due' | 'canceled';

export interface CustomerRecord {
  id: string;
  created: number;
  email: string | null;
  name: string | null;
  metadata: Metadata;
  /** The saved test card number (the stand-in keeps one card per customer). */
  card: string | null;
}

export interface ProductRecord {
  id: string;
  created: number;
  name: string;
  description: string | null;
  active: boolean;
  metadata: Metadata;
}

export interface PriceRecord {
  id: string;
  created: number;
  product: string;
  unitAmount: number;
  currency: string;
  interval: Interval;
  intervalCount: number;
  lookupKey: string | null;
  nickname: string | null;
  active: boolean;
  metadata: Metadata;
}

export interface LineRecord {
  price: string;
  quantity: number;
}

export interface CheckoutRecord {
  id: string;
  created: number;
  expiresAt: number;
  customer: string | null;
  customerEmail: string | null;
  clientReferenceId: string | null;
  successUrl: string;
  cancelUrl: string | null;
  lines: LineRecord[];
  trialPeriodDays: number | null;
  subscriptionMetadata: Metadata;
  metadata: Metadata;
  status: 'open' | 'complete' | 'expired';
  paymentStatus: 'unpaid' | 'paid' | 'no_payment_required';
  subscription: string | null;
  /** A card waiting for the authentication step. */
  pendingCard: string | null;
}

export interface ItemRecord {
  id: string;
  created: number;
  price: string;
  quantity: number;
}

export interface SubscriptionRecord {
  id: string;
  created: number;
  customer: string;
  status: SubscriptionStatus;
  items: ItemRecord[];
  currentPeriodStart: number;
  currentPeriodEnd: number;
  trialStart: number | null;
  trialEnd: number | null;
  cancelAtPeriodEnd: boolean;
  canceledAt: number | null;
  endedAt: number | null;
  startDate: number;
  latestInvoice: string | null;
  metadata: Metadata;
  /** When the stand-in tries an unpaid invoice again (past due only). */
  nextRetryAt: number | null;
}

export interface InvoiceRecord {
  id: string;
  number: string;
  created: number;
  customer: string;
  subscription: string | null;
  subscriptionMetadata: Metadata;
  status: 'open' | 'paid' | 'void' | 'uncollectible';
  amountDue: number;
  amountPaid: number;
  currency: string;
  periodStart: number;
  periodEnd: number;
  billingReason: 'subscription_create' | 'subscription_cycle' | 'subscription_update';
  attemptCount: number;
  nextPaymentAttempt: number | null;
  paidAt: number | null;
  lines: { price: string; quantity: number; amount: number; description: string; periodStart: number; periodEnd: number }[];
}

export interface PortalRecord {
  id: string;
  created: number;
  customer: string;
  returnUrl: string | null;
}

export interface EventRecord {
  id: string;
  type: string;
  created: number;
  object: Json;
  previousAttributes?: Json;
}

export const customerJson = (c: CustomerRecord): Json => ({
  id: c.id,
  object: 'customer',
  created: c.created,
  email: c.email,
  name: c.name,
  metadata: c.metadata,
  livemode: false,
  currency: null,
  delinquent: false,
  description: null,
  invoice_settings: { default_payment_method: c.card ? `pm_card_${c.card.slice(-4)}` : null, custom_fields: null, footer: null, rendering_options: null },
});

export const productJson = (p: ProductRecord): Json => ({
  id: p.id,
  object: 'product',
  created: p.created,
  updated: p.created,
  name: p.name,
  description: p.description,
  active: p.active,
  metadata: p.metadata,
  livemode: false,
  type: 'service',
});

export const priceJson = (p: PriceRecord): Json => ({
  id: p.id,
  object: 'price',
  created: p.created,
  product: p.product,
  active: p.active,
  currency: p.currency,
  unit_amount: p.unitAmount,
  unit_amount_decimal: String(p.unitAmount),
  billing_scheme: 'per_unit',
  type: 'recurring',
  recurring: { interval: p.interval, interval_count: p.intervalCount, usage_type: 'licensed', meter: null },
  lookup_key: p.lookupKey,
  nickname: p.nickname,
  metadata: p.metadata,
  livemode: false,
  tax_behavior: 'unspecified',
});

export const checkoutJson = (s: CheckoutRecord, baseUrl: string): Json => ({
  id: s.id,
  object: 'checkout.session',
  mode: 'subscription',
  created: s.created,
  expires_at: s.expiresAt,
  customer: s.customer,
  customer_email: s.customerEmail,
  client_reference_id: s.clientReferenceId,
  success_url: s.successUrl,
  cancel_url: s.cancelUrl,
  metadata: s.metadata,
  status: s.status,
  payment_status: s.paymentStatus,
  subscription: s.subscription,
  url: s.status === 'open' ? `${baseUrl}/checkout/${s.id}` : null,
  livemode: false,
});

export function itemJson(item: ItemRecord, sub: SubscriptionRecord, price: PriceRecord): Json {
  return {
    id: item.id,
    object: 'subscription_item',
    created: item.created,
    price: priceJson(price),
    quantity: item.quantity,
    subscription: sub.id,
    current_period_start: sub.currentPeriodStart,
    current_period_end: sub.currentPeriodEnd,
    metadata: {},
    discounts: [],
    tax_rates: [],
  };
}

export function subscriptionJson(sub: SubscriptionRecord, priceOf: (id: string) => PriceRecord): Json {
  const first = sub.items[0];
  return {
    id: sub.id,
    object: 'subscription',
    created: sub.created,
    customer: sub.customer,
    status: sub.status,
    currency: first ? priceOf(first.price).currency : 'eur',
    items: {
      object: 'list',
      data: sub.items.map((item) => itemJson(item, sub, priceOf(item.price))),
      has_more: false,
      url: `/v1/subscription_items?subscription=${sub.id}`,
    },
    billing_cycle_anchor: sub.trialEnd ?? sub.startDate,
    cancel_at: sub.cancelAtPeriodEnd ? sub.currentPeriodEnd : null,
    cancel_at_period_end: sub.cancelAtPeriodEnd,
    canceled_at: sub.canceledAt,
    ended_at: sub.endedAt,
    collection_method: 'charge_automatically',
    start_date: sub.startDate,
    trial_start: sub.trialStart,
    trial_end: sub.trialEnd,
    latest_invoice: sub.latestInvoice,
    metadata: sub.metadata,
    livemode: false,
  };
}

export function invoiceJson(inv: InvoiceRecord, baseUrl: string): Json {
  return {
    id: inv.id,
    object: 'invoice',
    number: inv.number,
    created: inv.created,
    customer: inv.customer,
    status: inv.status,
    amount_due: inv.amountDue,
    amount_paid: inv.amountPaid,
    amount_remaining: inv.amountDue - inv.amountPaid,
    total: inv.amountDue,
    subtotal: inv.amountDue,
    currency: inv.currency,
    period_start: inv.periodStart,
    period_end: inv.periodEnd,
    billing_reason: inv.billingReason,
    attempt_count: inv.attemptCount,
    attempted: inv.attemptCount > 0,
    next_payment_attempt: inv.nextPaymentAttempt,
    collection_method: 'charge_automatically',
    hosted_invoice_url: `${baseUrl}/invoices/${inv.id}`,
    parent: inv.subscription
      ? { type: 'subscription_details', quote_details: null, subscription_details: { subscription: inv.subscription, metadata: inv.subscriptionMetadata } }
      : null,
    status_transitions: { finalized_at: inv.created, paid_at: inv.paidAt, marked_uncollectible_at: null, voided_at: null },
    lines: {
      object: 'list',
      has_more: false,
      url: `/v1/invoices/${inv.id}/lines`,
      data: inv.lines.map((line, index) => ({
        id: `il_${inv.id.slice(3)}${index}`,
        object: 'line_item',
        amount: line.amount,
        currency: inv.currency,
        description: line.description,
        quantity: line.quantity,
        period: { start: line.periodStart, end: line.periodEnd },
        pricing: { type: 'price_details', price_details: { price: line.price, product: null }, unit_amount_decimal: null },
      })),
    },
    livemode: false,
  };
}

export const portalJson = (p: PortalRecord, baseUrl: string): Json => ({
  id: p.id,
  object: 'billing_portal.session',
  created: p.created,
  customer: p.customer,
  return_url: p.returnUrl,
  url: `${baseUrl}/portal/${p.id}`,
  livemode: false,
  configuration: 'bpc_standin',
  flow: null,
  locale: null,
  on_behalf_of: null,
});
