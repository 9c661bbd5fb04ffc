import { createHash } from 'node:crypto';

/** Server-rendered pages of the stand-in: small, self-contained, no external assets. */
export interface Page {
  status: number;
  title: string;
  html: string;
  /** Inline scripts on the page, allowed by hash in the Content-Security-Policy. */
  scripts: string[];
}

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;', '`': '&#96;' };

export function escapeHtml(value: unknown): string {
  return String(value ?? '').replace(/[&<>"'`]/g, (c) => ESCAPES[c] ?? c);
}

// Planktide's look (see the client's tokens): deep-navy ink on pale paper, tide-blue primary.
const CSS = `
:root{--ink:oklch(0.25 0.04 250);--ink-soft:oklch(0.45 0.03 250);--paper:oklch(0.985 0.005 220);--line:oklch(0.9 0.01 230);--tide-50:oklch(0.97 0.02 230);--tide-500:oklch(0.55 0.11 235);--tide-700:oklch(0.42 0.09 245);--alarm:oklch(0.52 0.18 25);--ember-100:oklch(0.95 0.04 70)}
*{box-sizing:border-box}
body{margin:0;min-height:100vh;font-family:'Nunito Sans',system-ui,sans-serif;color:var(--ink);background:var(--paper);line-height:1.5}
main{max-width:26rem;margin:0 auto;padding:3rem 1.25rem}
.brand{display:flex;align-items:center;gap:.6rem;margin-bottom:1.5rem}
.brand strong{font-size:1.35rem;letter-spacing:.01em}
.badge{font-size:.75rem;border:1px solid var(--line);border-radius:999px;padding:.1rem .6rem;color:var(--ink-soft);background:var(--tide-50)}
.card{background:#fff;border:1px solid var(--line);border-radius:.75rem;padding:1.5rem;box-shadow:0 1px 2px oklch(0.25 0.04 250 / .06)}
h1{font-size:1.3rem;margin:0 0 1rem}
label{display:block;font-weight:600;margin:.9rem 0 .3rem}
input[type=email],input[type=password],input[type=text]{width:100%;font:inherit;color:inherit;padding:.55rem .7rem;border:1px solid var(--line);border-radius:.5rem;background:var(--paper)}
input:focus-visible,button:focus-visible,a:focus-visible{outline:3px solid var(--tide-500);outline-offset:2px}
.hint{font-size:.85rem;color:var(--ink-soft);margin:.25rem 0 0}
button{margin-top:1.25rem;width:100%;font:inherit;font-weight:700;color:#fff;background:var(--tide-500);border:0;border-radius:.5rem;padding:.65rem 1rem;cursor:pointer}
button:hover{background:var(--tide-700)}
.alert{border-radius:.5rem;padding:.6rem .8rem;margin-bottom:.5rem;background:var(--ember-100);color:var(--ink);border-left:4px solid var(--alarm)}
.field-error{color:var(--alarm);font-size:.85rem;margin:.25rem 0 0}
a{color:var(--tide-700)}
.switch{margin:1.25rem 0 0;font-size:.95rem}
footer{margin-top:1.5rem;font-size:.8rem;color:var(--ink-soft)}
`.trim();

export const STYLE_HASH = createHash('sha256').update(CSS).digest('base64');

function layout(title: string, body: string, scripts: string[] = []): string {
  const scriptTags = scripts.map((s) => `<script>${s}</script>`).join('');
  return `<!doctype html>
<html lang="en-GB">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} · Planktide local sign-in stand-in</title>
<style>${CSS}</style>
</head>
<body>
<main>
<div class="brand"><strong>Planktide</strong><span class="badge">Local sign-in stand-in</span></div>
<div class="card">
${body}
</div>
<footer>This page comes from the local stand-in for Planktide's identity service, for development and tests.
Accounts made here live only in this database.</footer>
</main>
${scriptTags}
</body>
</html>`;
}

function alert(message: string | undefined): string {
  return message ? `<div class="alert" role="alert">${escapeHtml(message)}</div>` : '';
}

function fieldError(id: string, message: string | undefined): string {
  return message ? `<p class="field-error" id="${id}-error">${escapeHtml(message)}</p>` : '';
}

function describedBy(id: string, message: string | undefined): string {
  return message ? ` aria-invalid="true" aria-describedby="${id}-error"` : '';
}

export interface SignInPageInput {
  uid: string;
  formToken: string;
  email?: string;
  message?: string;
  status?: number;
}

export function signInPage(input: SignInPageInput): Page {
  const uid = encodeURIComponent(input.uid);
  const title = 'Sign in';
  const body = `<h1>Sign in to Planktide</h1>
${alert(input.message)}
<form method="post" action="/interaction/${uid}/login" novalidate>
<input type="hidden" name="formToken" value="${escapeHtml(input.formToken)}">
<label for="email">E-mail</label>
<input id="email" name="email" type="email" autocomplete="username" required value="${escapeHtml(input.email ?? '')}"${input.email ? '' : ' autofocus'}>
<label for="password">Password</label>
<input id="password" name="password" type="password" autocomplete="current-password" required${input.email ? ' autofocus' : ''}>
<button type="submit">Sign in</button>
</form>
<p class="switch">New to Planktide? <a href="/interaction/${uid}/signup">Create an account</a></p>`;
  return { status: input.status ?? 200, title, html: layout(title, body), scripts: [] };
}

export interface SignUpPageInput {
  uid: string;
  formToken: string;
  values?: { email?: string; displayName?: string };
  errors?: { email?: string; password?: string; displayName?: string };
  message?: string;
  passwordMin: number;
  status?: number;
}

export function signUpPage(input: SignUpPageInput): Page {
  const uid = encodeURIComponent(input.uid);
  const errors = input.errors ?? {};
  const values = input.values ?? {};
  const title = 'Create an account';
  const body = `<h1>Create your Planktide account</h1>
${alert(input.message)}
<form method="post" action="/interaction/${uid}/signup" novalidate>
<input type="hidden" name="formToken" value="${escapeHtml(input.formToken)}">
<label for="displayName">Your name</label>
<input id="displayName" name="displayName" type="text" autocomplete="name" required value="${escapeHtml(values.displayName ?? '')}"${describedBy('displayName', errors.displayName)}>
${fieldError('displayName', errors.displayName)}
<label for="email">E-mail</label>
<input id="email" name="email" type="email" autocomplete="email" required value="${escapeHtml(values.email ?? '')}"${describedBy('email', errors.email)}>
${fieldError('email', errors.email)}
<label for="password">Password</label>
<input id="password" name="password" type="password" autocomplete="new-password" required minlength="${input.passwordMin}"${describedBy('password', errors.password)}>
<p class="hint">At least ${input.passwordMin} characters. A few unrelated words make a good one.</p>
${fieldError('password', errors.password)}
<button type="submit">Create account</button>
</form>
<p class="switch">Already have an account? <a href="/interaction/${uid}">Sign in</a></p>`;
  return { status: input.status ?? 200, title, html: layout(title, body), scripts: [] };
}

export function messagePage(input: { status: number; title: string; text: string }): Page {
  const body = `<h1>${escapeHtml(input.title)}</h1><p>${escapeHtml(input.text)}</p>`;
  return { status: input.status, title: input.title, html: layout(input.title, body), scripts: [] };
}

const AUTO_SUBMIT = "document.getElementById('sign-out').submit();";

/**
 * The end-session form. With `auto` the page submits itself (no click), else it asks first.
 * The hidden inputs carry oidc-provider's per-session xsrf token and logout=yes (end the whole session).
 */
export function signOutPage(input: { action: string; xsrf: string; auto: boolean }): Page {
  const title = 'Signing out';
  const form = `<form id="sign-out" method="post" action="${escapeHtml(input.action)}">
<input type="hidden" name="xsrf" value="${escapeHtml(input.xsrf)}">
<input type="hidden" name="logout" value="yes">
${input.auto ? '<noscript><button type="submit">Sign out</button></noscript>' : '<button type="submit">Sign out</button>'}
</form>`;
  const body = input.auto
    ? `<h1>Signing you out…</h1><p>One moment: you are being signed out of Planktide.</p>${form}`
    : `<h1>Sign out of Planktide?</h1><p>You will need to sign in again to use Planktide.</p>${form}`;
  return { status: 200, title, html: layout(title, body, input.auto ? [AUTO_SUBMIT] : []), scripts: input.auto ? [AUTO_SUBMIT] : [] };
}

export function signedOutPage(): Page {
  return messagePage({ status: 200, title: 'Signed out', text: 'You are signed out of Planktide. You can close this tab.' });
}

/** Headers for every page: strict CSP (inline style and scripts by hash), no framing, no caching. */
export function pageHeaders(page: Page, formActionSources: readonly string[]): Record<string, string> {
  const scriptSources = page.scripts.map((s) => `'sha256-${createHash('sha256').update(s).digest('base64')}'`);
  const csp = [
    "default-src 'none'",
    `style-src 'sha256-${STYLE_HASH}'`,
    scriptSources.length ? `script-src ${scriptSources.join(' ')}` : "script-src 'none'",
    // Browsers apply form-action to the redirects after a submit too: allow the clients' origins.
    `form-action 'self' ${formActionSources.join(' ')}`.trim(),
    "base-uri 'none'",
    "frame-ancestors 'none'",
  ].join('; ');
  return {
    'Content-Type': 'text/html; charset=utf-8',
    'Content-Security-Policy': csp,
    'X-Frame-Options': 'DENY',
    'X-Content-Type-Options': 'nosniff',
    'Referrer-Policy': 'no-referrer',
    'Cache-Control': 'no-store',
  };
}
