import { Router, type Request, type RequestHandler, type Response } from 'express';
import { makeId } from './ids.ts';
import { missing, StandInError, type PaymentsState } from './payments-state.ts';
import { checkoutJson, customerJson, invoiceJson, portalJson, priceJson, productJson, type Interval, type Json, type LineRecord, type Metadata } from './records.ts';

// Form values as the SDK encodes them: strings, bracketed objects and indexed arrays; '' means "unset".
type Form = Record<string, unknown>;

function text(form: Form, key: string, required = false): string | undefined {
  const value = form[key];
  if (typeof value === 'string' && value !== '') return value;
  if (required) throw new StandInError(400, `Missing required param: ${key}.`, key, 'parameter_missing');
  return undefined;
}

function whole(form: Form, key: string, required = false): number | undefined {
  const value = text(form, key, required);
  if (value === undefined) return undefined;
  if (!/^\d+$/.test(value)) throw new StandInError(400, `Invalid integer: ${value}`, key, 'parameter_invalid_integer');
  return Number(value);
}

function flag(form: Form, key: string): boolean | undefined {
  const value = text(form, key);
  if (value === undefined) return undefined;
  if (value !== 'true' && value !== 'false') throw new StandInError(400, `Invalid boolean: ${value}`, key);
  return value === 'true';
}

function metadata(form: Form, key = 'metadata'): Metadata | undefined {
  const value = form[key];
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'object' || value === null) throw new StandInError(400, 'Invalid metadata: give keys and string values.', key);
  return Object.fromEntries(Object.entries(value).filter(([, v]) => typeof v === 'string' && v !== '')) as Metadata;
}

/** An indexed array (items[0][price]=...), which the form parser gives as an array or, past its limit, an object. */
function list(form: Form, key: string): Form[] {
  const value = form[key];
  if (value === undefined || value === '') return [];
  const entries = Array.isArray(value) ? value : typeof value === 'object' && value ? Object.values(value) : [value];
  return entries.map((entry) => (typeof entry === 'object' && entry ? (entry as Form) : { value: entry }));
}

function strings(form: Form, key: string): string[] {
  return list(form, key).map((entry) => entry.value).filter((v): v is string => typeof v === 'string');
}

function lines(form: Form, key: string): LineRecord[] {
  return list(form, key).map((entry, index) => {
    const line = { price: text(entry, 'price', true) ?? '', quantity: whole(entry, 'quantity') ?? 1 };
    if (line.quantity < 1) throw new StandInError(400, 'Quantity must be at least 1.', `${key}[${index}][quantity]`);
    return line;
  });
}

/** A list answer, newest first, with limit and starting_after. */
function page(url: string, rows: Json[], query: Form): Json {
  const limit = Math.min(100, Math.max(1, whole(query, 'limit') ?? 10));
  const after = text(query, 'starting_after');
  let start = 0;
  if (after) start = rows.findIndex((r) => r.id === after) + 1;
  const data = rows.slice(start, start + limit);
  return { object: 'list', url, has_more: start + limit < rows.length, data };
}

const newestFirst = <T extends { created: number }>(rows: T[]) => [...rows].sort((a, b) => b.created - a.created);

/** Replaces ids by objects for the paths asked for in expand[] (one level: "customer", "latest_invoice", "data.customer"). */
function expand(state: PaymentsState, object: Json, paths: string[]): Json {
  const lookup = (field: string, id: unknown): unknown => {
    if (typeof id !== 'string') return id;
    if (field === 'customer' && state.customers.has(id)) return customerJson(state.customers.get(id)!);
    if (field === 'latest_invoice' && state.invoices.has(id)) return invoiceJson(state.invoices.get(id)!, state.baseUrl);
    if (field === 'subscription' && state.subscriptions.has(id)) return state.subscriptionJson(state.subscriptions.get(id)!);
    if (field === 'product' && state.products.has(id)) return productJson(state.products.get(id)!);
    return id;
  };
  const result: Json = { ...object };
  for (const path of paths) {
    if (path.startsWith('data.') && Array.isArray(result.data)) {
      const field = path.slice(5);
      result.data = (result.data as Json[]).map((row) => ({ ...row, [field]: lookup(field, row[field]) }));
    } else if (path in result) {
      result[path] = lookup(path, result[path]);
    }
  }
  return result;
}

/** The REST API subset Planktide uses, under /v1, answering as the payments service does. */
export function apiHandlers(state: PaymentsState, secretKey: string): Router {
  const router = Router();
  const replies = new Map<string, { status: number; body: Json }>();

  const authenticate: RequestHandler = (req, res, next) => {
    const given = /^Bearer (.+)$/.exec(req.headers.authorization ?? '')?.[1];
    if (given !== secretKey) {
      res.status(401).json({ error: { type: 'invalid_request_error', message: `Invalid API Key provided: ${given ? `${given.slice(0, 8)}***` : '(none)'}` } });
      return;
    }
    next();
  };

  // Every call first runs what fell due on the stand-in's clock (real time passes too).
  const handle = (fn: (req: Request, form: Form) => Json | { status: number; body: Json }) => (req: Request, res: Response) => {
    const key = req.method === 'POST' ? req.get('idempotency-key') : undefined;
    const cached = key ? replies.get(key) : undefined;
    if (cached) {
      res.status(cached.status).set('idempotent-replayed', 'true').json(cached.body);
      return;
    }
    let status = 200;
    let body: Json;
    try {
      state.runDue(state.now());
      const form: Form = { ...(req.query as Form), ...((req.body ?? {}) as Form) };
      const answer = fn(req, form);
      if ('status' in answer && 'body' in answer && typeof answer.status === 'number') {
        status = answer.status;
        body = answer.body as Json;
      } else {
        body = answer as Json;
        const paths = strings(form, 'expand');
        if (paths.length) body = expand(state, body, paths);
      }
    } catch (error) {
      if (!(error instanceof StandInError)) throw error;
      status = error.status;
      body = { error: { type: error.type, message: error.message, ...(error.param ? { param: error.param } : {}), ...(error.code ? { code: error.code } : {}) } };
    }
    if (key) replies.set(key, { status, body });
    res.status(status).set('request-id', makeId('req')).json(body);
  };

  router.use('/v1', authenticate);

  // Customers
  router.post('/v1/customers', handle((_req, f) => customerJson(state.createCustomer({ email: text(f, 'email'), name: text(f, 'name'), metadata: metadata(f) }))));
  router.get('/v1/customers', handle((_req, f) => {
    const email = text(f, 'email');
    return page('/v1/customers', newestFirst([...state.customers.values()].filter((c) => !email || c.email === email)).map(customerJson), f);
  }));
  router.get('/v1/customers/:id', handle((req) => customerJson(state.customer(String(req.params.id)))));
  router.post('/v1/customers/:id', handle((req, f) => {
    const customer = state.customer(String(req.params.id));
    if (text(f, 'email')) customer.email = text(f, 'email')!;
    if (text(f, 'name')) customer.name = text(f, 'name')!;
    const meta = metadata(f);
    if (meta) customer.metadata = { ...customer.metadata, ...meta };
    return customerJson(customer);
  }));

  // Products and prices
  const createProduct = (f: Form) => {
    const product = { id: makeId('prod'), created: state.now(), name: text(f, 'name', true)!, description: text(f, 'description') ?? null, active: flag(f, 'active') ?? true, metadata: metadata(f) ?? {} };
    state.products.set(product.id, product);
    return product;
  };
  router.post('/v1/products', handle((_req, f) => productJson(createProduct(f))));
  router.get('/v1/products', handle((_req, f) => page('/v1/products', newestFirst([...state.products.values()]).map(productJson), f)));
  router.get('/v1/products/:id', handle((req) => {
    const product = state.products.get(String(req.params.id));
    if (!product) throw missing('product', String(req.params.id));
    return productJson(product);
  }));

  router.post('/v1/prices', handle((_req, f) => {
    const productData = f.product_data as Form | undefined;
    const product = productData ? createProduct(productData).id : text(f, 'product', true)!;
    if (!state.products.has(product)) throw missing('product', product);
    const recurring = (f.recurring ?? {}) as Form;
    const interval = text(recurring, 'interval', true) as Interval;
    if (!['day', 'week', 'month', 'year'].includes(interval)) throw new StandInError(400, `Invalid recurring[interval]: ${interval}`, 'recurring[interval]');
    const lookupKey = text(f, 'lookup_key') ?? null;
    const holder = lookupKey ? [...state.prices.values()].find((p) => p.lookupKey === lookupKey) : undefined;
    if (holder) {
      if (flag(f, 'transfer_lookup_key') !== true) throw new StandInError(400, `A price (${holder.id}) already uses that lookup key.`, 'lookup_key');
      holder.lookupKey = null;
    }
    const price = {
      id: makeId('price'),
      created: state.now(),
      product,
      unitAmount: whole(f, 'unit_amount', true)!,
      currency: text(f, 'currency', true)!.toLowerCase(),
      interval,
      intervalCount: whole(recurring, 'interval_count') ?? 1,
      lookupKey,
      nickname: text(f, 'nickname') ?? null,
      active: flag(f, 'active') ?? true,
      metadata: metadata(f) ?? {},
    };
    state.prices.set(price.id, price);
    return priceJson(price);
  }));
  router.get('/v1/prices', handle((_req, f) => {
    const keys = strings(f, 'lookup_keys');
    const active = flag(f, 'active');
    const product = text(f, 'product');
    const rows = [...state.prices.values()].filter(
      (p) => (!keys.length || (p.lookupKey !== null && keys.includes(p.lookupKey))) && (active === undefined || p.active === active) && (!product || p.product === product),
    );
    return page('/v1/prices', newestFirst(rows).map(priceJson), f);
  }));
  router.get('/v1/prices/:id', handle((req) => priceJson(state.price(String(req.params.id)))));

  // Checkout sessions
  router.post('/v1/checkout/sessions', handle((_req, f) => {
    if (text(f, 'mode', true) !== 'subscription') throw new StandInError(400, 'The stand-in supports only mode=subscription.', 'mode');
    const subscriptionData = (f.subscription_data ?? {}) as Form;
    const session = state.createCheckout({
      customer: text(f, 'customer') ?? null,
      customerEmail: text(f, 'customer_email') ?? null,
      clientReferenceId: text(f, 'client_reference_id') ?? null,
      successUrl: text(f, 'success_url', true)!,
      cancelUrl: text(f, 'cancel_url') ?? null,
      lines: lines(f, 'line_items'),
      trialPeriodDays: whole(subscriptionData, 'trial_period_days') ?? null,
      subscriptionMetadata: metadata(subscriptionData) ?? {},
      metadata: metadata(f) ?? {},
    });
    return checkoutJson(session, state.baseUrl);
  }));
  router.get('/v1/checkout/sessions/:id', handle((req) => checkoutJson(state.session(String(req.params.id)), state.baseUrl)));

  // Subscriptions
  router.post('/v1/subscriptions', handle((_req, f) => {
    const sub = state.createSubscription({ customer: text(f, 'customer', true)!, lines: lines(f, 'items'), trialPeriodDays: whole(f, 'trial_period_days') ?? null, metadata: metadata(f) ?? {} });
    return state.subscriptionJson(sub);
  }));
  router.get('/v1/subscriptions', handle((_req, f) => {
    const customer = text(f, 'customer');
    const status = text(f, 'status');
    const rows = [...state.subscriptions.values()].filter((s) => (!customer || s.customer === customer) && (status === 'all' || (status ? s.status === status : s.status !== 'canceled')));
    return page('/v1/subscriptions', newestFirst(rows).map((s) => state.subscriptionJson(s)), f);
  }));
  router.get('/v1/subscriptions/:id', handle((req) => state.subscriptionJson(state.subscription(String(req.params.id)))));
  router.post('/v1/subscriptions/:id', handle((req, f) => {
    const items = list(f, 'items').map((item) => ({ id: text(item, 'id'), price: text(item, 'price'), quantity: whole(item, 'quantity') }));
    const sub = state.updateSubscription(String(req.params.id), { cancelAtPeriodEnd: flag(f, 'cancel_at_period_end'), items, metadata: metadata(f) });
    return state.subscriptionJson(sub);
  }));
  router.delete('/v1/subscriptions/:id', handle((req) => state.subscriptionJson(state.cancelSubscription(String(req.params.id)))));

  // Invoices
  router.get('/v1/invoices', handle((_req, f) => {
    const customer = text(f, 'customer');
    const subscription = text(f, 'subscription');
    const status = text(f, 'status');
    const rows = [...state.invoices.values()].filter((i) => (!customer || i.customer === customer) && (!subscription || i.subscription === subscription) && (!status || i.status === status));
    return page('/v1/invoices', newestFirst(rows).map((i) => invoiceJson(i, state.baseUrl)), f);
  }));
  router.get('/v1/invoices/:id', handle((req) => {
    const invoice = state.invoices.get(String(req.params.id));
    if (!invoice) throw missing('invoice', String(req.params.id));
    return invoiceJson(invoice, state.baseUrl);
  }));

  // Customer portal
  router.post('/v1/billing_portal/sessions', handle((_req, f) => portalJson(state.createPortal(text(f, 'customer', true)!, text(f, 'return_url') ?? null), state.baseUrl)));

  // Events
  router.get('/v1/events/:id', handle((req) => {
    const event = state.events.find((e) => e.id === req.params.id);
    if (!event) throw missing('event', String(req.params.id));
    return eventJson(event);
  }));
  router.get('/v1/events', handle((_req, f) => {
    const type = text(f, 'type');
    return page('/v1/events', newestFirst(state.events.filter((e) => !type || e.type === type)).map(eventJson), f);
  }));

  router.use('/v1', (req, res) => {
    res.status(404).json({ error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${req.originalUrl}).` } });
  });
  return router;
}

export const API_VERSION = '2026-10-28.endive';

export function eventJson(event: { id: string; type: string; created: number; object: Json; previousAttributes?: Json }): Json {
  return {
    id: event.id,
    object: 'event',
    api_version: API_VERSION,
    created: event.created,
    type: event.type,
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    data: { object: event.object, ...(event.previousAttributes ? { previous_attributes: event.previousAttributes } : {}) },
  };
}
