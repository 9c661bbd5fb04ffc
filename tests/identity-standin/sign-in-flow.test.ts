import type { JsonWebKey } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedStandInAccounts } from '../../server/identity-standin/accounts.ts';
import { startIdentityStandIn, type RunningIdentityStandIn } from '../../server/identity-standin/start.ts';
import { freePort } from '../helpers/free-port.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';
import { CookieJarFetch, readForm } from './cookie-jar-fetch.ts';
import {
  authorizeUrl,
  capturingLogger,
  decodeJwt,
  exchangeCode,
  newAuthRequest,
  openAuthorization,
  startCallbackServer,
  submitForm,
  TEST_COOKIE_KEYS,
  testClient,
  verifyRs256,
  type CallbackServer,
} from './oidc-test-kit.ts';

const ALICE = { email: 'alice.harbour@example.test', password: 'slack water at noon', displayName: 'Alice Harbour' };

describe('identity stand-in: discovery, code flow with PKCE, sign-up and sign-out', () => {
  let database: TestDatabase;
  let callback: CallbackServer;
  let standIn: RunningIdentityStandIn;
  let discovery: Record<string, unknown>;
  const log = capturingLogger();
  const client = () => testClient(callback);
  const toCallback = (url: string) => url.startsWith(callback.redirectUri) || url.startsWith(callback.postLogoutUri);

  beforeAll(async () => {
    database = await createTestDatabase();
    await seedStandInAccounts(database.db, [ALICE]);
    callback = await startCallbackServer();
    standIn = await startIdentityStandIn({
      port: await freePort(),
      db: database.db,
      clients: [client()],
      cookieKeys: TEST_COOKIE_KEYS,
      logger: log.logger,
    });
    discovery = (await (await fetch(`${standIn.issuer}/.well-known/openid-configuration`)).json()) as Record<string, unknown>;
  });
  afterAll(async () => {
    await standIn?.close();
    await callback?.close();
    await database?.drop();
  });

  /** Signs in through the sign-in page and returns the callback URL reached plus the verifier used. */
  async function signIn(browser: CookieJarFetch, account: { email: string; password: string }) {
    const { request, verifier } = newAuthRequest(client());
    const opened = await openAuthorization(browser, standIn.issuer, request, callback.redirectUri);
    expect(opened.last.status).toBe(200);
    const submitted = await submitForm(browser, opened.last, { email: account.email, password: account.password }, toCallback);
    if (!submitted.stoppedAt) throw new Error(`Sign-in did not reach the callback (last status ${submitted.last.status})`);
    const reached = new URL(submitted.stoppedAt);
    return { reached, request, verifier, signInPage: opened.last };
  }

  async function signInAndExchange(browser: CookieJarFetch, account: { email: string; password: string }) {
    const flow = await signIn(browser, account);
    const code = flow.reached.searchParams.get('code') ?? '';
    const tokens = await exchangeCode(String(discovery.token_endpoint), client(), { code, redirectUri: callback.redirectUri, verifier: flow.verifier });
    return { ...flow, code, tokens };
  }

  it('publishes a discovery document for the code flow with S256 PKCE and the endpoints', () => {
    // OpenID Connect Discovery 1.0 section 3 and RFC 8414 section 2 name these fields.
    expect(discovery.issuer).toBe(standIn.issuer);
    expect(standIn.issuer).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    expect(discovery.response_types_supported).toEqual(['code']);
    expect(discovery.code_challenge_methods_supported).toEqual(['S256']);
    expect(discovery.grant_types_supported).toContain('authorization_code');
    expect(discovery.scopes_supported).toEqual(expect.arrayContaining(['openid', 'email', 'profile']));
    expect(discovery.claims_supported).toEqual(expect.arrayContaining(['sub', 'email', 'email_verified', 'name']));
    expect(discovery.token_endpoint_auth_methods_supported).toEqual(expect.arrayContaining(['client_secret_basic', 'client_secret_post']));
    for (const endpoint of ['authorization_endpoint', 'token_endpoint', 'jwks_uri', 'userinfo_endpoint', 'end_session_endpoint']) {
      expect(String(discovery[endpoint])).toMatch(new RegExp(`^${standIn.issuer}/`));
    }
  });

  it('shows its own sign-in page, titled as the local stand-in, with a form token and escaped output', async () => {
    const browser = new CookieJarFetch();
    const { request } = newAuthRequest(client());
    const opened = await openAuthorization(browser, standIn.issuer, request, callback.redirectUri);
    const page = opened.last;
    expect(page.status).toBe(200);
    expect(page.url).toMatch(new RegExp(`^${standIn.issuer}/interaction/[\\w-]+$`));
    expect(page.body).toMatch(/<title>Sign in · Planktide local sign-in stand-in<\/title>/);
    expect(page.body).toContain("font-family:'Nunito Sans',system-ui");
    expect(page.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
    const form = readForm(page.body, page.url);
    expect(form.action).toBe(`${page.url}/login`);
    expect(form.hidden.formToken).toMatch(/^[\w-]{40,}$/);
    expect(browser.cookieNames()).toContain('standin_interaction');

    const hostile = '"><script>alert(1)</script>@example.test';
    const refused = await browser.request(form.action, { form: { ...form.hidden, email: hostile, password: 'whatever it is' } });
    expect(refused.status).toBe(401);
    expect(refused.body).not.toContain('<script>alert(1)</script>');
    expect(refused.body).toContain('value="&quot;&gt;&lt;script&gt;alert(1)&lt;/script&gt;@example.test"');
  });

  it('completes the authorization code flow with PKCE and issues an ID token signed by its JWKS', async () => {
    const browser = new CookieJarFetch();
    const flow = await signInAndExchange(browser, ALICE);
    expect(flow.reached.searchParams.get('state')).toBe(flow.request.state);
    // RFC 9207: the iss response parameter names the issuer.
    expect(flow.reached.searchParams.get('iss')).toBe(standIn.issuer);

    // The relying party's callback server is reached with the code.
    const landed = await browser.request(flow.reached.href);
    expect(landed.status).toBe(200);
    expect(callback.calls.at(-1)?.searchParams.get('code')).toBe(flow.code);

    expect(flow.tokens.status).toBe(200);
    expect(flow.tokens.body.token_type).toBe('Bearer');
    const idToken = String(flow.tokens.body.id_token);
    const { payload } = decodeJwt(idToken);
    // OpenID Connect Core 1.0 section 3.1.3.7: iss, aud and nonce must match the request.
    expect(payload.iss).toBe(standIn.issuer);
    expect(payload.aud).toBe(client().clientId);
    expect(payload.nonce).toBe(flow.request.nonce);
    expect(payload.email).toBe(ALICE.email);
    expect(payload.email_verified).toBe(true);
    expect(payload.name).toBe(ALICE.displayName);
    expect(payload.sub).toMatch(/^[0-9a-f-]{36}$/);
    expect(Number(payload.exp)).toBeGreaterThan(Date.now() / 1000);

    const jwks = (await (await fetch(String(discovery.jwks_uri))).json()) as { keys: JsonWebKey[] };
    expect(verifyRs256(idToken, jwks.keys)).toBe(true);
    const [header, , signature] = idToken.split('.');
    const tampered = [header, Buffer.from(JSON.stringify({ ...payload, sub: 'someone-else' })).toString('base64url'), signature].join('.');
    expect(tampered).not.toBe(idToken);
    expect(verifyRs256(tampered, jwks.keys)).toBe(false);

    const userinfo = await fetch(String(discovery.userinfo_endpoint), { headers: { authorization: `Bearer ${String(flow.tokens.body.access_token)}` } });
    expect(await userinfo.json()).toMatchObject({ sub: payload.sub, email: ALICE.email, name: ALICE.displayName });
  });

  it('refuses to exchange a code without the PKCE verifier', async () => {
    const flow = await signIn(new CookieJarFetch(), ALICE);
    const tokens = await exchangeCode(String(discovery.token_endpoint), client(), {
      code: flow.reached.searchParams.get('code') ?? '',
      redirectUri: callback.redirectUri,
    });
    expect(tokens.status).toBe(400);
    expect(tokens.body.error).toBe('invalid_grant');
  });

  it('refuses an authorization request without a code_challenge', async () => {
    const browser = new CookieJarFetch();
    const { request } = newAuthRequest(client());
    const hop = await browser.request(authorizeUrl(standIn.issuer, { ...request, challenge: undefined }));
    // RFC 7636 section 4.4.1: the error goes back to the client as invalid_request.
    expect(hop.status).toBe(303);
    const location = new URL(hop.location ?? '');
    expect(`${location.origin}${location.pathname}`).toBe(callback.redirectUri);
    expect(location.searchParams.get('error')).toBe('invalid_request');
    expect(location.searchParams.get('error_description')).toMatch(/PKCE/);
    expect(location.searchParams.has('code')).toBe(false);
    expect(browser.cookieNames()).not.toContain('standin_interaction');
  });

  it('refuses a sign-in form posted without its form token', async () => {
    const browser = new CookieJarFetch();
    const { request } = newAuthRequest(client());
    const opened = await openAuthorization(browser, standIn.issuer, request, callback.redirectUri);
    const form = readForm(opened.last.body, opened.last.url);
    const posted = await browser.request(form.action, { form: { email: ALICE.email, password: ALICE.password } });
    expect(posted.status).toBe(403);
    expect(posted.location).toBeUndefined();
    expect(posted.body).toContain('This form has expired');
  });

  it('refuses a sign-in form posted from a browser without the interaction cookie (cross-site post)', async () => {
    const victim = new CookieJarFetch();
    const { request } = newAuthRequest(client());
    const opened = await openAuthorization(victim, standIn.issuer, request, callback.redirectUri);
    const form = readForm(opened.last.body, opened.last.url);
    // Same URL and even the right form token, but the cookie that SameSite=Lax keeps off cross-site posts is missing.
    const posted = await new CookieJarFetch().request(form.action, { form: { ...form.hidden, email: ALICE.email, password: ALICE.password } });
    expect(posted.status).toBe(400);
    expect(posted.location).toBeUndefined();
    expect(posted.body).toContain('This sign-in page has expired');
  });

  it('signs up a new account, signs it in at once, and lets it sign in again later', async () => {
    const newcomer = { email: 'Bruno.Kelp@Example.test', password: 'ebb tide over the mussel lines', displayName: 'Bruno Kelp' };
    const browser = new CookieJarFetch();
    const { request, verifier } = newAuthRequest(client());
    const opened = await openAuthorization(browser, standIn.issuer, request, callback.redirectUri);
    const signUpPage = await browser.request(`${opened.last.url}/signup`);
    expect(signUpPage.status).toBe(200);
    expect(signUpPage.body).toContain('Create your Planktide account');

    const tooShort = await submitForm(browser, signUpPage, { ...newcomer, password: 'short pw' }, toCallback);
    expect(tooShort.posted.status).toBe(400);
    expect(tooShort.posted.body).toContain('at least 10 characters');
    const badEmail = await submitForm(browser, signUpPage, { ...newcomer, email: 'not-an-address' }, toCallback);
    expect(badEmail.posted.status).toBe(400);
    expect(badEmail.posted.body).toContain('Enter an e-mail address');

    const created = await submitForm(browser, signUpPage, newcomer, toCallback);
    expect(created.posted.status).toBe(303);
    const reached = new URL(created.stoppedAt ?? '');
    const tokens = await exchangeCode(String(discovery.token_endpoint), client(), {
      code: reached.searchParams.get('code') ?? '',
      redirectUri: callback.redirectUri,
      verifier,
    });
    const claims = decodeJwt(String(tokens.body.id_token)).payload;
    expect(claims.email).toBe('bruno.kelp@example.test');
    expect(claims.name).toBe('Bruno Kelp');
    // The stand-in sends no confirmation e-mail, so a self-made account is not verified.
    expect(claims.email_verified).toBe(false);

    const again = await signInAndExchange(new CookieJarFetch(), { email: 'bruno.kelp@example.test', password: newcomer.password });
    expect(decodeJwt(String(again.tokens.body.id_token)).payload.sub).toBe(claims.sub);

    const duplicate = new CookieJarFetch();
    const reopened = await openAuthorization(duplicate, standIn.issuer, newAuthRequest(client()).request, callback.redirectUri);
    const duplicatePage = await duplicate.request(`${reopened.last.url}/signup`);
    const taken = await submitForm(duplicate, duplicatePage, { ...newcomer, email: 'BRUNO.kelp@example.test' }, toCallback);
    expect(taken.posted.status).toBe(409);
    expect(taken.stoppedAt).toBeUndefined();
  });

  it('ends the provider session at the end-session endpoint without a click and redirects to the client', async () => {
    const browser = new CookieJarFetch();
    const flow = await signInAndExchange(browser, ALICE);
    const idToken = String(flow.tokens.body.id_token);

    // While signed in, a new authorization request gets a code straight away (no sign-in page).
    const silent = await openAuthorization(browser, standIn.issuer, newAuthRequest(client()).request, callback.redirectUri);
    expect(silent.stoppedAt).toMatch(/[?&]code=/);

    const endSession = new URL(String(discovery.end_session_endpoint));
    endSession.searchParams.set('id_token_hint', idToken);
    endSession.searchParams.set('post_logout_redirect_uri', callback.postLogoutUri);
    endSession.searchParams.set('state', 'bye-123');
    const page = await browser.request(endSession.href);
    expect(page.status).toBe(200);
    // The page submits itself: an inline script allowed by hash in the CSP, no button to click.
    expect(page.body).toContain("document.getElementById('sign-out').submit();");
    expect(page.headers.get('content-security-policy')).toMatch(/script-src 'sha256-[\w+/=]+'/);
    const form = readForm(page.body, page.url);
    expect(form.hidden).toMatchObject({ logout: 'yes' });
    expect(form.hidden.xsrf).toMatch(/^[0-9a-f]{48}$/);

    // What the script does: post the form.
    const confirmed = await browser.request(form.action, { form: form.hidden });
    expect(confirmed.status).toBe(303);
    expect(confirmed.location).toBe(`${callback.postLogoutUri}?state=bye-123`);
    expect(browser.cookieNames()).not.toContain('standin_session');

    const afterwards = await openAuthorization(browser, standIn.issuer, newAuthRequest(client()).request, callback.redirectUri);
    expect(afterwards.stoppedAt).toBeUndefined();
    expect(afterwards.last.status).toBe(200);
    expect(afterwards.last.body).toContain('Sign in to Planktide');
  });

  it('asks before signing out when the request carries no ID token of the signed-in person', async () => {
    const browser = new CookieJarFetch();
    await signIn(browser, ALICE);
    const endSession = new URL(String(discovery.end_session_endpoint));
    endSession.searchParams.set('client_id', client().clientId);
    endSession.searchParams.set('post_logout_redirect_uri', callback.postLogoutUri);
    const page = await browser.request(endSession.href);
    expect(page.status).toBe(200);
    expect(page.body).toContain('Sign out of Planktide?');
    expect(page.body).not.toContain('<script>');
    expect(browser.cookieNames()).toContain('standin_session');
  });

  it('never writes passwords, codes, tokens or cookies to its log', async () => {
    const browser = new CookieJarFetch();
    const flow = await signInAndExchange(browser, ALICE);
    await browser.request(flow.reached.href);
    const logged = log.text();
    expect(logged).toContain('signed in');
    const secrets = [
      ALICE.password,
      flow.code,
      flow.verifier,
      String(flow.tokens.body.access_token),
      String(flow.tokens.body.id_token),
      client().clientSecret,
      ...TEST_COOKIE_KEYS,
      ...browser.cookieValues(),
    ];
    expect(secrets.every((s) => s.length >= 8)).toBe(true);
    for (const secret of secrets) expect(logged).not.toContain(secret);
  });
});
