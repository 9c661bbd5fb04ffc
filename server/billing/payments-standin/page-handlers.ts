import { Router, type Request, type Response } from 'express';
import { StandInError, type PaymentsState } from './payments-state.ts';
import { authenticatePage, checkoutPage, day, invoicePage, messagePage, money, portalPage, type PortalView } from './pages.ts';
import type { PriceRecord } from './records.ts';

const field = (req: Request, name: string) => {
  const value = (req.body as Record<string, unknown> | undefined)?.[name];
  return typeof value === 'string' ? value : '';
};

function sendPage(res: Response, html: string, status = 200): void {
  res.status(status).set('content-type', 'text/html; charset=utf-8').set('cache-control', 'no-store').send(html);
}

/** The hosted pages: checkout (with the authentication step), the customer portal and invoices. */
export function pageHandlers(state: PaymentsState): Router {
  const router = Router();
  const productName = (price: PriceRecord) => state.products.get(price.product)?.name ?? price.id;
  const priceLabel = (price: PriceRecord) => `${money(price.unitAmount, price.currency)} per ${price.interval}`;

  const renderCheckout = (res: Response, id: string, error?: string) => {
    const session = state.session(id);
    if (session.status !== 'open') return sendPage(res, messagePage('Checkout finished', 'This checkout has already finished. Return to the app.'), 410);
    const prices = session.lines.map((line) => ({ line, price: state.price(line.price) }));
    const first = prices[0]!.price;
    const total = prices.reduce((sum, p) => sum + p.price.unitAmount * p.line.quantity, 0);
    const trialEnd = state.now() + (session.trialPeriodDays ?? 0) * 86_400;
    sendPage(
      res,
      checkoutPage(
        {
          id: session.id,
          lines: prices.map(({ line, price }) => ({ product: productName(price), amount: money(price.unitAmount, price.currency), interval: price.interval, quantity: line.quantity })),
          total: money(total, first.currency),
          trialDays: session.trialPeriodDays,
          firstChargeOn: day(session.trialPeriodDays ? trialEnd : state.now()),
          cancelUrl: session.cancelUrl,
          email: session.customer ? state.customer(session.customer).email : session.customerEmail,
        },
        error,
      ),
      error ? 402 : 200,
    );
  };

  const afterCheckout = (res: Response, id: string, outcome: ReturnType<PaymentsState['payCheckout']>) => {
    if (outcome.outcome === 'complete') return res.redirect(303, outcome.redirect);
    if (outcome.outcome === 'authenticate') return res.redirect(303, `/checkout/${id}/authenticate`);
    renderCheckout(res, id, outcome.message);
  };

  router.get('/checkout/:id', (req, res) => renderCheckout(res, String(req.params.id)));
  router.post('/checkout/:id', (req, res) => {
    const id = String(req.params.id);
    afterCheckout(res, id, state.payCheckout(id, field(req, 'cardNumber')));
  });
  router.get('/checkout/:id/authenticate', (req, res) => {
    const session = state.session(String(req.params.id));
    if (!session.pendingCard) return res.redirect(303, `/checkout/${session.id}`);
    sendPage(res, authenticatePage(session.id));
  });
  router.post('/checkout/:id/authenticate', (req, res) => {
    const id = String(req.params.id);
    afterCheckout(res, id, state.authenticateCheckout(id, field(req, 'decision') === 'confirm'));
  });

  const portalView = (id: string): PortalView => {
    const portal = state.portals.get(id);
    if (!portal) throw new StandInError(404, 'This portal link is unknown or has expired.');
    const customer = state.customer(portal.customer);
    const sub = state.currentSubscription(customer.id);
    const price = sub ? state.price(sub.items[0]!.price) : null;
    const choices = [...state.prices.values()]
      .filter((p) => p.active && state.products.get(p.product)?.active !== false && (!price || p.currency === price.currency))
      .sort((a, b) => (a.interval === b.interval ? a.unitAmount - b.unitAmount : a.interval.localeCompare(b.interval)))
      .map((p) => ({ priceId: p.id, label: `${productName(p)}: ${priceLabel(p)}` }));
    return {
      id,
      email: customer.email,
      returnUrl: portal.returnUrl,
      subscription:
        sub && price
          ? {
              product: productName(price),
              price: priceLabel(price),
              priceId: price.id,
              status: sub.status,
              periodEnd: day(sub.currentPeriodEnd),
              trialEnd: sub.status === 'trialing' && sub.trialEnd ? day(sub.trialEnd) : null,
              cancelAtPeriodEnd: sub.cancelAtPeriodEnd,
            }
          : null,
      choices,
      invoices: [...state.invoices.values()]
        .filter((i) => i.customer === customer.id)
        .sort((a, b) => b.created - a.created)
        .map((i) => ({ number: i.number, date: day(i.created), amount: money(i.amountDue, i.currency), status: i.status })),
      card: customer.card,
    };
  };

  router.get('/portal/:id', (req, res) => {
    const notice = typeof req.query.notice === 'string' ? req.query.notice : undefined;
    sendPage(res, portalPage(portalView(String(req.params.id)), notice));
  });

  const portalAction = (name: string, act: (customerId: string, req: Request) => string | { error: string }) => {
    router.post(`/portal/:id/${name}`, (req, res) => {
      const id = String(req.params.id);
      const portal = state.portals.get(id);
      if (!portal) throw new StandInError(404, 'This portal link is unknown or has expired.');
      state.runDue(state.now());
      const result = act(portal.customer, req);
      if (typeof result === 'string') return res.redirect(303, `/portal/${id}?notice=${encodeURIComponent(result)}`);
      sendPage(res, portalPage(portalView(id), undefined, result.error), 400);
    });
  };
  const current = (customerId: string) => {
    const sub = state.currentSubscription(customerId);
    if (!sub) throw new StandInError(400, 'There is no current subscription to change.');
    return sub;
  };
  portalAction('change-plan', (customerId, req) => {
    const sub = current(customerId);
    const price = state.price(field(req, 'price'));
    state.updateSubscription(sub.id, { items: [{ id: sub.items[0]!.id, price: price.id }] });
    return `Your plan is now ${productName(price)} (${priceLabel(price)}).`;
  });
  portalAction('cancel', (customerId) => {
    state.updateSubscription(current(customerId).id, { cancelAtPeriodEnd: true });
    return 'Your subscription will end at the end of the period.';
  });
  portalAction('resume', (customerId) => {
    state.updateSubscription(current(customerId).id, { cancelAtPeriodEnd: false });
    return 'Your subscription will continue.';
  });
  portalAction('card', (customerId, req) => {
    const result = state.updateCard(customerId, field(req, 'cardNumber'));
    return result.ok ? 'Your card was updated.' : { error: result.message };
  });

  router.get('/invoices/:id', (req, res) => {
    const invoice = state.invoices.get(String(req.params.id));
    if (!invoice) throw new StandInError(404, 'No such invoice.');
    sendPage(res, invoicePage({ number: invoice.number, date: day(invoice.created), amount: money(invoice.amountDue, invoice.currency), status: invoice.status, period: `${day(invoice.periodStart)} to ${day(invoice.periodEnd)}` }));
  });

  return router;
}
