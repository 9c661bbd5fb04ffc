import { cardBehaviour, chargeSucceeds, normaliseCardNumber } from './cards.ts';
import { makeId } from './ids.ts';
import {
  checkoutJson,
  customerJson,
  invoiceJson,
  subscriptionJson,
  type CheckoutRecord,
  type CustomerRecord,
  type EventRecord,
  type Interval,
  type InvoiceRecord,
  type Json,
  type LineRecord,
  type Metadata,
  type PortalRecord,
  type PriceRecord,
  type ProductRecord,
  type SubscriptionRecord,
} from './records.ts';

const DAY = 86_400;
/** A past-due invoice is tried again every 3 days; after the 4th failed attempt the subscription is canceled. */
export const RETRY_EVERY_S = 3 * DAY;
export const MAX_ATTEMPTS = 4;

/** An error answered in the payments API's error shape. */
export class StandInError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly param?: string,
    readonly code?: string,
    readonly type = 'invalid_request_error',
  ) {
    super(message);
  }
}

export const missing = (kind: string, id: string) => new StandInError(404, `No such ${kind}: '${id}'`, 'id', 'resource_missing');

export function addInterval(at: number, interval: Interval, count: number): number {
  if (interval === 'day') return at + count * DAY;
  if (interval === 'week') return at + count * 7 * DAY;
  const date = new Date(at * 1000);
  if (interval === 'month') date.setUTCMonth(date.getUTCMonth() + count);
  else date.setUTCFullYear(date.getUTCFullYear() + count);
  return Math.floor(date.getTime() / 1000);
}

export type CheckoutOutcome =
  | { outcome: 'complete'; redirect: string }
  | { outcome: 'authenticate' }
  | { outcome: 'error'; message: string };

/**
 * Everything the payments stand-in remembers, in memory, and the rules of its billing cycle:
 * trials end into a charge, periods renew with a charge on the saved card, failed charges make the
 * subscription past due and are tried again, and cancel-at-period-end ends it at the period's end.
 * Its clock is the real clock plus an offset that tests move forward.
 */
export class PaymentsState {
  readonly customers = new Map<string, CustomerRecord>();
  readonly products = new Map<string, ProductRecord>();
  readonly prices = new Map<string, PriceRecord>();
  readonly sessions = new Map<string, CheckoutRecord>();
  readonly subscriptions = new Map<string, SubscriptionRecord>();
  readonly invoices = new Map<string, InvoiceRecord>();
  readonly portals = new Map<string, PortalRecord>();
  readonly events: EventRecord[] = [];
  private offsetS = 0;
  private frozenAt: number | null = null;
  private invoiceCounter = 0;

  constructor(
    public baseUrl: string,
    private readonly onEvent: (event: EventRecord) => void,
  ) {}

  /** The stand-in's clock, in Unix seconds. */
  now(): number {
    return this.frozenAt ?? Math.floor(Date.now() / 1000) + this.offsetS;
  }

  // ---- look-ups ----

  customer(id: string): CustomerRecord {
    const found = this.customers.get(id);
    if (!found) throw missing('customer', id);
    return found;
  }

  price(id: string): PriceRecord {
    const found = this.prices.get(id);
    if (!found) throw missing('price', id);
    return found;
  }

  subscription(id: string): SubscriptionRecord {
    const found = this.subscriptions.get(id);
    if (!found) throw missing('subscription', id);
    return found;
  }

  session(id: string): CheckoutRecord {
    const found = this.sessions.get(id);
    if (!found) throw missing('checkout.session', id);
    return found;
  }

  subscriptionJson(sub: SubscriptionRecord): Json {
    return subscriptionJson(sub, (id) => this.price(id));
  }

  // ---- events ----

  emit(type: string, object: Json, previousAttributes?: Json): EventRecord {
    const event: EventRecord = { id: makeId('evt'), type, created: this.now(), object: structuredClone(object), previousAttributes };
    this.events.push(event);
    this.onEvent(event);
    return event;
  }

  /** Applies a change to a subscription and sends customer.subscription.updated with what changed. */
  private changeSubscription(sub: SubscriptionRecord, change: (sub: SubscriptionRecord) => void): void {
    const before = this.subscriptionJson(sub);
    change(sub);
    const after = this.subscriptionJson(sub);
    const previous: Json = {};
    for (const [key, value] of Object.entries(before)) if (JSON.stringify(value) !== JSON.stringify(after[key])) previous[key] = value;
    if (Object.keys(previous).length) this.emit('customer.subscription.updated', after, previous);
  }

  // ---- customers and cards ----

  createCustomer(input: { email?: string | null; name?: string | null; metadata?: Metadata }): CustomerRecord {
    const customer: CustomerRecord = { id: makeId('cus'), created: this.now(), email: input.email ?? null, name: input.name ?? null, metadata: input.metadata ?? {}, card: null };
    this.customers.set(customer.id, customer);
    this.emit('customer.created', customerJson(customer));
    return customer;
  }

  /** Saves a new card for the customer; an unpaid invoice of a past-due subscription is tried again at once. */
  updateCard(customerId: string, number: string): { ok: true } | { ok: false; message: string } {
    const customer = this.customer(customerId);
    const behaviour = cardBehaviour(number);
    if (!behaviour) return { ok: false, message: 'Use one of the test card numbers listed on this page.' };
    if (behaviour === 'declined') return { ok: false, message: 'Your card was declined.' };
    customer.card = normaliseCardNumber(number);
    for (const sub of this.subscriptions.values()) {
      if (sub.customer === customerId && sub.status === 'past_due') this.retry(sub);
    }
    return { ok: true };
  }

  // ---- invoices ----

  /** Makes the invoice for one period and charges the saved card; true when paid. */
  private bill(sub: SubscriptionRecord, reason: InvoiceRecord['billingReason'], periodStart: number, periodEnd: number, free: boolean): boolean {
    const lines = sub.items.map((item) => {
      const price = this.price(item.price);
      const product = this.products.get(price.product);
      return {
        price: price.id,
        quantity: item.quantity,
        amount: free ? 0 : price.unitAmount * item.quantity,
        description: `${item.quantity} × ${product?.name ?? price.id}${free ? ' (trial)' : ''}`,
        periodStart,
        periodEnd,
      };
    });
    const amount = lines.reduce((sum, line) => sum + line.amount, 0);
    const invoice: InvoiceRecord = {
      id: makeId('in'),
      number: `STANDIN-${String(++this.invoiceCounter).padStart(4, '0')}`,
      created: this.now(),
      customer: sub.customer,
      subscription: sub.id,
      subscriptionMetadata: { ...sub.metadata },
      status: 'open',
      amountDue: amount,
      amountPaid: 0,
      currency: this.price(sub.items[0]!.price).currency,
      periodStart,
      periodEnd,
      billingReason: reason,
      attemptCount: 0,
      nextPaymentAttempt: null,
      paidAt: null,
      lines,
    };
    this.invoices.set(invoice.id, invoice);
    sub.latestInvoice = invoice.id;
    this.emit('invoice.created', invoiceJson(invoice, this.baseUrl));
    return this.charge(invoice);
  }

  private charge(invoice: InvoiceRecord): boolean {
    const card = this.customer(invoice.customer).card;
    if (invoice.amountDue > 0) invoice.attemptCount += 1;
    if (invoice.amountDue === 0 || chargeSucceeds(card)) {
      invoice.status = 'paid';
      invoice.amountPaid = invoice.amountDue;
      invoice.paidAt = this.now();
      invoice.nextPaymentAttempt = null;
      this.emit('invoice.paid', invoiceJson(invoice, this.baseUrl));
      return true;
    }
    invoice.nextPaymentAttempt = invoice.attemptCount < MAX_ATTEMPTS ? this.now() + RETRY_EVERY_S : null;
    this.emit('invoice.payment_failed', invoiceJson(invoice, this.baseUrl));
    return false;
  }

  // ---- subscriptions ----

  createSubscription(input: { customer: string; lines: LineRecord[]; trialPeriodDays: number | null; metadata: Metadata }): SubscriptionRecord {
    const customer = this.customer(input.customer);
    if (!input.lines.length) throw new StandInError(400, 'Missing required param: items.', 'items');
    const prices = input.lines.map((line) => this.price(line.price));
    const interval = prices[0]!;
    if (prices.some((p) => p.interval !== interval.interval || p.currency !== interval.currency)) {
      throw new StandInError(400, 'All prices on a subscription must share one currency and billing interval.', 'items');
    }
    const now = this.now();
    const trialEnd = input.trialPeriodDays ? now + input.trialPeriodDays * DAY : null;
    if (!trialEnd && !chargeSucceeds(customer.card)) {
      throw new StandInError(402, 'Your card was declined.', undefined, 'card_declined', 'card_error');
    }
    const sub: SubscriptionRecord = {
      id: makeId('sub'),
      created: now,
      customer: customer.id,
      status: trialEnd ? 'trialing' : 'active',
      items: input.lines.map((line) => ({ id: makeId('si'), created: now, price: line.price, quantity: line.quantity })),
      currentPeriodStart: now,
      currentPeriodEnd: trialEnd ?? addInterval(now, interval.interval, interval.intervalCount),
      trialStart: trialEnd ? now : null,
      trialEnd,
      cancelAtPeriodEnd: false,
      canceledAt: null,
      endedAt: null,
      startDate: now,
      latestInvoice: null,
      metadata: input.metadata,
      nextRetryAt: null,
    };
    this.subscriptions.set(sub.id, sub);
    this.emit('customer.subscription.created', this.subscriptionJson(sub));
    this.bill(sub, 'subscription_create', sub.currentPeriodStart, sub.currentPeriodEnd, Boolean(trialEnd));
    return sub;
  }

  updateSubscription(id: string, input: { cancelAtPeriodEnd?: boolean; items?: { id?: string; price?: string; quantity?: number }[]; metadata?: Metadata }): SubscriptionRecord {
    const sub = this.subscription(id);
    if (sub.status === 'canceled') throw new StandInError(400, 'A canceled subscription can only update its cancellation_details and metadata.');
    for (const change of input.items ?? []) {
      const item = change.id ? sub.items.find((i) => i.id === change.id) : sub.items.length === 1 ? sub.items[0] : undefined;
      if (!item) throw new StandInError(400, `Subscription item ${change.id ?? '(none given)'} is not on this subscription.`, 'items');
      if (change.price) {
        const next = this.price(change.price);
        if (next.interval !== this.price(item.price).interval && sub.status !== 'trialing') {
          // A new billing interval starts a new period now (the stand-in does not prorate).
          this.changeSubscription(sub, (s) => {
            item.price = next.id;
            s.currentPeriodStart = this.now();
            s.currentPeriodEnd = addInterval(this.now(), next.interval, next.intervalCount);
          });
          this.bill(sub, 'subscription_update', sub.currentPeriodStart, sub.currentPeriodEnd, false);
          continue;
        }
      }
      this.changeSubscription(sub, () => {
        if (change.price) item.price = change.price;
        if (change.quantity !== undefined) item.quantity = change.quantity;
      });
    }
    this.changeSubscription(sub, (s) => {
      if (input.cancelAtPeriodEnd !== undefined) s.cancelAtPeriodEnd = input.cancelAtPeriodEnd;
      if (input.metadata) s.metadata = { ...s.metadata, ...input.metadata };
    });
    return sub;
  }

  cancelSubscription(id: string): SubscriptionRecord {
    const sub = this.subscription(id);
    if (sub.status === 'canceled') return sub;
    this.end(sub);
    return sub;
  }

  private end(sub: SubscriptionRecord): void {
    const now = this.now();
    sub.status = 'canceled';
    sub.canceledAt = sub.canceledAt ?? now;
    sub.endedAt = now;
    sub.nextRetryAt = null;
    this.emit('customer.subscription.deleted', this.subscriptionJson(sub));
  }

  private renew(sub: SubscriptionRecord): void {
    if (sub.cancelAtPeriodEnd) return this.end(sub);
    const price = this.price(sub.items[0]!.price);
    const start = sub.currentPeriodEnd;
    const end = addInterval(start, price.interval, price.intervalCount);
    const wasTrial = sub.status === 'trialing';
    this.changeSubscription(sub, (s) => {
      s.currentPeriodStart = start;
      s.currentPeriodEnd = end;
    });
    const paid = this.bill(sub, 'subscription_cycle', start, end, false);
    this.changeSubscription(sub, (s) => {
      if (paid) {
        if (wasTrial || s.status === 'past_due') s.status = 'active';
        s.nextRetryAt = null;
      } else {
        s.status = 'past_due';
        s.nextRetryAt = this.now() + RETRY_EVERY_S;
      }
    });
  }

  private retry(sub: SubscriptionRecord): void {
    const invoice = sub.latestInvoice ? this.invoices.get(sub.latestInvoice) : undefined;
    if (!invoice || invoice.status !== 'open') {
      this.changeSubscription(sub, (s) => {
        s.status = 'active';
        s.nextRetryAt = null;
      });
      return;
    }
    const paid = this.charge(invoice);
    if (paid) {
      this.changeSubscription(sub, (s) => {
        s.status = 'active';
        s.nextRetryAt = null;
      });
    } else if (invoice.attemptCount >= MAX_ATTEMPTS) {
      this.end(sub);
    } else {
      sub.nextRetryAt = this.now() + RETRY_EVERY_S;
    }
  }

  /** The next thing due on a subscription, if any. */
  private due(sub: SubscriptionRecord): { at: number; run: () => void } | null {
    if (sub.status === 'canceled') return null;
    const renewal = { at: sub.currentPeriodEnd, run: () => this.renew(sub) };
    if (sub.status === 'past_due' && sub.nextRetryAt !== null && sub.nextRetryAt < sub.currentPeriodEnd) {
      return { at: sub.nextRetryAt, run: () => this.retry(sub) };
    }
    return renewal;
  }

  /** Runs every renewal, trial end and retry due up to `until`, in time order, each at its own time. */
  runDue(until: number): void {
    for (let guard = 0; guard < 10_000; guard++) {
      let next: { at: number; run: () => void } | null = null;
      for (const sub of this.subscriptions.values()) {
        const due = this.due(sub);
        if (due && due.at <= until && (!next || due.at < next.at)) next = due;
      }
      if (!next) return;
      this.frozenAt = next.at;
      try {
        next.run();
      } finally {
        this.frozenAt = null;
      }
    }
  }

  /** Moves the clock forward, running what falls due on the way. */
  advance(seconds: number): void {
    const target = this.now() + Math.round(seconds);
    this.runDue(target);
    this.offsetS += Math.round(seconds);
  }

  // ---- checkout ----

  createCheckout(input: Omit<CheckoutRecord, 'id' | 'created' | 'expiresAt' | 'status' | 'paymentStatus' | 'subscription' | 'pendingCard'>): CheckoutRecord {
    if (input.customer) this.customer(input.customer);
    if (!input.lines.length) throw new StandInError(400, 'Missing required param: line_items.', 'line_items');
    for (const line of input.lines) this.price(line.price);
    const now = this.now();
    const session: CheckoutRecord = { ...input, id: makeId('cs_test'), created: now, expiresAt: now + DAY, status: 'open', paymentStatus: 'unpaid', subscription: null, pendingCard: null };
    this.sessions.set(session.id, session);
    return session;
  }

  /** The card number entered on the checkout page. */
  payCheckout(sessionId: string, number: string): CheckoutOutcome {
    const session = this.session(sessionId);
    if (session.status !== 'open') return { outcome: 'error', message: 'This checkout has already finished.' };
    const behaviour = cardBehaviour(number);
    if (!behaviour) return { outcome: 'error', message: 'Use one of the test card numbers listed on this page.' };
    if (behaviour === 'declined') return { outcome: 'error', message: 'Your card was declined. Try another card.' };
    if (behaviour === 'attach_then_decline' && !session.trialPeriodDays) return { outcome: 'error', message: 'Your card was declined. Try another card.' };
    if (behaviour === 'authentication_required') {
      session.pendingCard = normaliseCardNumber(number);
      return { outcome: 'authenticate' };
    }
    return this.completeCheckout(session, normaliseCardNumber(number));
  }

  /** The authentication step: confirmed completes the checkout, refused returns to the card form. */
  authenticateCheckout(sessionId: string, confirmed: boolean): CheckoutOutcome {
    const session = this.session(sessionId);
    const card = session.pendingCard;
    session.pendingCard = null;
    if (session.status !== 'open' || !card) return { outcome: 'error', message: 'There is no payment waiting for authentication.' };
    if (!confirmed) return { outcome: 'error', message: 'Authentication failed, so the card was not charged. Try again or use another card.' };
    return this.completeCheckout(session, card);
  }

  private completeCheckout(session: CheckoutRecord, card: string): CheckoutOutcome {
    const customer = session.customer ? this.customer(session.customer) : this.createCustomer({ email: session.customerEmail });
    customer.card = card;
    const sub = this.createSubscription({ customer: customer.id, lines: session.lines, trialPeriodDays: session.trialPeriodDays, metadata: session.subscriptionMetadata });
    session.customer = customer.id;
    session.status = 'complete';
    session.subscription = sub.id;
    session.paymentStatus = session.trialPeriodDays ? 'no_payment_required' : 'paid';
    this.emit('checkout.session.completed', checkoutJson(session, this.baseUrl));
    return { outcome: 'complete', redirect: session.successUrl.replace('{CHECKOUT_SESSION_ID}', session.id) };
  }

  // ---- portal ----

  createPortal(customerId: string, returnUrl: string | null): PortalRecord {
    this.customer(customerId);
    const portal: PortalRecord = { id: makeId('bps'), created: this.now(), customer: customerId, returnUrl };
    this.portals.set(portal.id, portal);
    return portal;
  }

  /** The customer's newest subscription that has not ended (what the portal shows). */
  currentSubscription(customerId: string): SubscriptionRecord | undefined {
    return [...this.subscriptions.values()].filter((s) => s.customer === customerId && s.status !== 'canceled').sort((a, b) => b.created - a.created)[0];
  }
}
