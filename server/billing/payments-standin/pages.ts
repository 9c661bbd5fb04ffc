/** The stand-in's hosted pages (checkout, authentication step, customer portal, invoice): small, self-contained HTML. */

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export const escapeHtml = (value: unknown) => String(value ?? '').replace(/[&<>"']/g, (c) => ESCAPES[c] ?? c);

const CSS = `
*{box-sizing:border-box}
body{margin:0;font-family:system-ui,sans-serif;color:#1d2a3a;background:#f6f8fa;line-height:1.5}
main{max-width:30rem;margin:0 auto;padding:2.5rem 1.25rem}
.brand{display:flex;gap:.6rem;align-items:center;margin-bottom:1.25rem}
.badge{font-size:.75rem;border:1px solid #c9d3dd;border-radius:999px;padding:.1rem .6rem;background:#eef3f7}
.card{background:#fff;border:1px solid #d8e0e8;border-radius:.75rem;padding:1.5rem;margin-bottom:1rem}
h1{font-size:1.3rem;margin:0 0 1rem}
h2{font-size:1.05rem;margin:0 0 .75rem}
label{display:block;font-weight:600;margin:.75rem 0 .3rem}
input,select{width:100%;font:inherit;padding:.5rem .7rem;border:1px solid #c9d3dd;border-radius:.5rem}
button{margin-top:1rem;width:100%;font:inherit;font-weight:700;color:#fff;background:#245c8f;border:0;border-radius:.5rem;padding:.6rem 1rem;cursor:pointer}
button.secondary{background:#fff;color:#245c8f;border:1px solid #245c8f}
button.danger{background:#a33a2b}
.alert{border-left:4px solid #a33a2b;background:#fbeee9;padding:.6rem .8rem;border-radius:.4rem;margin-bottom:1rem}
.hint{font-size:.85rem;color:#55657a}
dl{display:grid;grid-template-columns:auto 1fr;gap:.25rem 1rem;margin:0}
dt{color:#55657a}
dd{margin:0;font-weight:600}
table{width:100%;border-collapse:collapse;font-size:.9rem}
td,th{text-align:left;padding:.3rem .2rem;border-top:1px solid #e3e8ee}
a{color:#245c8f}
`.trim();

export function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(title)}</title><style>${CSS}</style></head>
<body><main>
<div class="brand"><strong>Payments</strong><span class="badge">Local test stand-in: no real money moves</span></div>
${body}
</main></body></html>`;
}

export const money = (minor: number, currency: string) =>
  new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);

export const day = (unixSeconds: number) => new Date(unixSeconds * 1000).toISOString().slice(0, 10);

const TEST_CARDS = `<p class="hint">Test cards: 4242 4242 4242 4242 succeeds; 4000 0000 0000 0002 is declined;
4000 0025 0000 3155 asks for authentication; 4000 0000 0000 0341 can be saved but every charge fails.</p>`;

const alert = (message?: string) => (message ? `<div class="alert" role="alert">${escapeHtml(message)}</div>` : '');

export interface CheckoutView {
  id: string;
  lines: { product: string; amount: string; interval: string; quantity: number }[];
  total: string;
  trialDays: number | null;
  firstChargeOn: string;
  cancelUrl: string | null;
  email: string | null;
}

export function checkoutPage(view: CheckoutView, error?: string): string {
  const items = view.lines.map((l) => `<tr><td>${escapeHtml(l.product)}${l.quantity > 1 ? ` × ${l.quantity}` : ''}</td><td>${escapeHtml(l.amount)} per ${escapeHtml(l.interval)}</td></tr>`).join('');
  const trial = view.trialDays
    ? `<p><strong>${view.trialDays}-day free trial.</strong> Nothing is charged today; the first charge of ${escapeHtml(view.total)} is on ${escapeHtml(view.firstChargeOn)}.</p>`
    : `<p>You pay <strong>${escapeHtml(view.total)}</strong> today.</p>`;
  return layout(
    'Checkout',
    `<div class="card">
<h1>Subscribe</h1>
${alert(error)}
${view.email ? `<p class="hint">For ${escapeHtml(view.email)}</p>` : ''}
<table><tbody>${items}</tbody></table>
${trial}
<form method="post" action="/checkout/${escapeHtml(view.id)}">
<label for="card">Card number</label>
<input id="card" name="cardNumber" inputmode="numeric" autocomplete="cc-number" required>
${TEST_CARDS}
<button type="submit">${view.trialDays ? 'Start trial' : 'Subscribe and pay'}</button>
</form>
${view.cancelUrl ? `<p><a href="${escapeHtml(view.cancelUrl)}">Cancel and go back</a></p>` : ''}
</div>`,
  );
}

export function authenticatePage(sessionId: string): string {
  return layout(
    'Authenticate the payment',
    `<div class="card">
<h1>Authenticate this payment</h1>
<p>Your bank asks you to confirm that it is you. (In this test stand-in, choose the outcome.)</p>
<form method="post" action="/checkout/${escapeHtml(sessionId)}/authenticate">
<input type="hidden" name="decision" value="confirm">
<button type="submit">Complete authentication</button>
</form>
<form method="post" action="/checkout/${escapeHtml(sessionId)}/authenticate">
<input type="hidden" name="decision" value="refuse">
<button type="submit" class="secondary">Fail authentication</button>
</form>
</div>`,
  );
}

export interface PortalView {
  id: string;
  email: string | null;
  returnUrl: string | null;
  subscription: null | {
    product: string;
    price: string;
    priceId: string;
    status: string;
    periodEnd: string;
    trialEnd: string | null;
    cancelAtPeriodEnd: boolean;
  };
  choices: { priceId: string; label: string }[];
  invoices: { number: string; date: string; amount: string; status: string }[];
  card: string | null;
}

export function portalPage(view: PortalView, notice?: string, error?: string): string {
  const sub = view.subscription;
  const action = (name: string) => `/portal/${escapeHtml(view.id)}/${name}`;
  const summary = sub
    ? `<dl>
<dt>Plan</dt><dd>${escapeHtml(sub.product)}</dd>
<dt>Price</dt><dd>${escapeHtml(sub.price)}</dd>
<dt>Status</dt><dd>${escapeHtml(sub.status)}</dd>
${sub.trialEnd ? `<dt>Trial ends</dt><dd>${escapeHtml(sub.trialEnd)}</dd>` : ''}
<dt>${sub.cancelAtPeriodEnd ? 'Ends on' : 'Renews on'}</dt><dd>${escapeHtml(sub.periodEnd)}</dd>
</dl>`
    : '<p>No current subscription.</p>';
  const change = sub
    ? `<div class="card"><h2>Change plan</h2>
<form method="post" action="${action('change-plan')}">
<label for="price">New plan</label>
<select id="price" name="price">${view.choices.map((c) => `<option value="${escapeHtml(c.priceId)}"${c.priceId === sub.priceId ? ' selected' : ''}>${escapeHtml(c.label)}</option>`).join('')}</select>
<button type="submit">Change plan</button>
</form></div>
<div class="card"><h2>${sub.cancelAtPeriodEnd ? 'Keep the subscription' : 'Cancel'}</h2>
${
  sub.cancelAtPeriodEnd
    ? `<form method="post" action="${action('resume')}"><p>The subscription ends on ${escapeHtml(sub.periodEnd)}.</p><button type="submit">Keep subscription</button></form>`
    : `<form method="post" action="${action('cancel')}"><p>The subscription stays until ${escapeHtml(sub.periodEnd)}, then ends.</p><button type="submit" class="danger">Cancel subscription</button></form>`
}
</div>`
    : '';
  const invoices = view.invoices.length
    ? `<table><thead><tr><th>Invoice</th><th>Date</th><th>Amount</th><th>Status</th></tr></thead><tbody>${view.invoices
        .map((i) => `<tr><td>${escapeHtml(i.number)}</td><td>${escapeHtml(i.date)}</td><td>${escapeHtml(i.amount)}</td><td>${escapeHtml(i.status)}</td></tr>`)
        .join('')}</tbody></table>`
    : '<p>No invoices yet.</p>';
  return layout(
    'Manage your subscription',
    `<div class="card"><h1>Your subscription</h1>
${notice ? `<p role="status"><strong>${escapeHtml(notice)}</strong></p>` : ''}
${alert(error)}
${view.email ? `<p class="hint">${escapeHtml(view.email)}</p>` : ''}
${summary}
${view.returnUrl ? `<p><a href="${escapeHtml(view.returnUrl)}">Return to the app</a></p>` : ''}
</div>
${change}
<div class="card"><h2>Card</h2>
<p>${view.card ? `Card ending ${escapeHtml(view.card.slice(-4))}` : 'No card saved.'}</p>
<form method="post" action="${action('card')}">
<label for="card">New card number</label>
<input id="card" name="cardNumber" inputmode="numeric" required>
${TEST_CARDS}
<button type="submit" class="secondary">Update card</button>
</form></div>
<div class="card"><h2>Invoices</h2>${invoices}</div>`,
  );
}

export function invoicePage(invoice: { number: string; date: string; amount: string; status: string; period: string }): string {
  return layout(
    `Invoice ${invoice.number}`,
    `<div class="card"><h1>Invoice ${escapeHtml(invoice.number)}</h1>
<dl><dt>Date</dt><dd>${escapeHtml(invoice.date)}</dd><dt>Period</dt><dd>${escapeHtml(invoice.period)}</dd><dt>Amount</dt><dd>${escapeHtml(invoice.amount)}</dd><dt>Status</dt><dd>${escapeHtml(invoice.status)}</dd></dl></div>`,
  );
}

export const messagePage = (title: string, message: string) => layout(title, `<div class="card"><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p></div>`);
