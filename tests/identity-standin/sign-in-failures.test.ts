import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedStandInAccounts } from '../../server/identity-standin/accounts.ts';
import type { SignInLimits } from '../../server/identity-standin/sign-in-limits.ts';
import { startIdentityStandIn, type RunningIdentityStandIn } from '../../server/identity-standin/start.ts';
import { freePort } from '../helpers/free-port.ts';
import { quietLogger } from '../helpers/quiet-logger.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';
import { alertText, CookieJarFetch, readForm, type Hop } from './cookie-jar-fetch.ts';
import { newAuthRequest, openAuthorization, startCallbackServer, TEST_COOKIE_KEYS, testClient, type CallbackServer } from './oidc-test-kit.ts';

const CAROL = { email: 'carol.ness@example.test', password: 'flood tide by the pier', displayName: 'Carol Ness' };
const DAVE = { email: 'dave.sound@example.test', password: 'mooring line inspection', displayName: 'Dave Sound' };
const FIONA = { email: 'fiona.firth@example.test', password: 'longline buoy count', displayName: 'Fiona Firth' };
const GREG = { email: 'greg.loch@example.test', password: 'secchi depth reading', displayName: 'Greg Loch' };

// Smaller numbers than the defaults (3 free attempts, +500 ms each, at most 5 s, 429 after 20) so the test
// stays short; the step is well above the few hundred ms a sign-in takes here, so delays stand out of noise.
const LIMITS: SignInLimits = { windowMs: 60_000, freeAttempts: 2, delayStepMs: 600, maxDelayMs: 1_500, maxAttempts: 6 };

describe('identity stand-in: failed sign-ins', () => {
  let database: TestDatabase;
  let callback: CallbackServer;
  let standIn: RunningIdentityStandIn;

  beforeAll(async () => {
    database = await createTestDatabase();
    await seedStandInAccounts(database.db, [CAROL, DAVE, FIONA, GREG]);
    callback = await startCallbackServer();
    standIn = await startIdentityStandIn({
      port: await freePort(),
      db: database.db,
      clients: [testClient(callback)],
      cookieKeys: TEST_COOKIE_KEYS,
      logger: quietLogger(),
      signInLimits: LIMITS,
    });
  });
  afterAll(async () => {
    await standIn?.close();
    await callback?.close();
    await database?.drop();
  });

  /** A browser on the sign-in page of a fresh authorization request. */
  async function onSignInPage(): Promise<{ browser: CookieJarFetch; page: Hop }> {
    const browser = new CookieJarFetch();
    const opened = await openAuthorization(browser, standIn.issuer, newAuthRequest(testClient(callback)).request, callback.redirectUri);
    expect(opened.last.status).toBe(200);
    return { browser, page: opened.last };
  }

  async function attempt(session: { browser: CookieJarFetch; page: Hop }, email: string, password: string) {
    const form = readForm(session.page.body, session.page.url);
    const started = performance.now();
    const hop = await session.browser.request(form.action, { form: { ...form.hidden, email, password } });
    return { hop, ms: performance.now() - started };
  }

  const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)] ?? NaN;

  it('answers a wrong password and an unknown e-mail with the same status, message and page', async () => {
    const session = await onSignInPage();
    const wrongPassword = await attempt(session, CAROL.email, 'not the right one');
    const unknownEmail = await attempt(session, 'nobody.here@example.test', 'not the right one');
    expect(wrongPassword.hop.status).toBe(401);
    expect(unknownEmail.hop.status).toBe(401);
    expect(alertText(wrongPassword.hop.body)).toBe('E-mail or password is not right.');
    expect(alertText(unknownEmail.hop.body)).toBe(alertText(wrongPassword.hop.body));
    // Apart from the e-mail echoed back into its field, the two pages are the same bytes.
    expect(unknownEmail.hop.body.replace('nobody.here@example.test', 'EMAIL')).toBe(wrongPassword.hop.body.replace(CAROL.email, 'EMAIL'));
  });

  it('takes about as long for an unknown e-mail as for a wrong password', async () => {
    const session = await onSignInPage();
    const known: number[] = [];
    const unknown: number[] = [];
    // Two per e-mail stays within the free attempts, so no delay is added; alternate to share any drift.
    for (let i = 0; i < 2; i += 1) {
      known.push((await attempt(session, DAVE.email, `wrong password ${i}`)).ms);
      unknown.push((await attempt(session, `ghost${i}@example.test`, 'wrong password')).ms);
      unknown.push((await attempt(session, `phantom${i}@example.test`, 'wrong password')).ms);
    }
    // Both run one scrypt verification (tens of ms); without the dummy hash the unknown e-mail would
    // answer after only a database look-up (a few ms, a ratio near 0.05). Tolerance: a factor of three either way.
    const ratio = median(unknown) / median(known);
    expect(ratio).toBeGreaterThan(1 / 3);
    expect(ratio).toBeLessThan(3);
  });

  it('slows down repeated failures for one e-mail, then refuses them with 429 until the window passes', async () => {
    const session = await onSignInPage();
    const times: number[] = [];
    const statuses: number[] = [];
    for (let i = 0; i < LIMITS.maxAttempts; i += 1) {
      const { hop, ms } = await attempt(session, FIONA.email, `guess number ${i}`);
      statuses.push(hop.status);
      times.push(ms);
    }
    expect(statuses).toEqual(Array(LIMITS.maxAttempts).fill(401));
    const free = Math.max(times[0] ?? 0, times[1] ?? 0);
    // Attempts 3 to 6 wait 600, 1200, 1500 and 1500 ms (capped) on top of the normal work.
    expect(times[2]).toBeGreaterThan(free + 400);
    expect(times[3]).toBeGreaterThan(free + 1_000);
    expect(times[4]).toBeGreaterThan(free + 1_300);
    expect(times[5]).toBeGreaterThan(free + 1_300);
    expect(times[5]).toBeLessThan(free + 1_500 + 1_000);

    const refused = await attempt(session, FIONA.email, FIONA.password);
    expect(refused.hop.status).toBe(429);
    expect(refused.hop.location).toBeUndefined();
    expect(refused.hop.body).toContain('Too many failed sign-ins for this e-mail. Wait 1 minute, then try again.');
    expect(Number(refused.hop.headers.get('retry-after'))).toBeGreaterThan(0);
  }, 30_000);

  it('counts failures per e-mail, so another person signing in from the same address is not refused', async () => {
    const session = await onSignInPage();
    for (let i = 0; i <= LIMITS.maxAttempts; i += 1) await attempt(session, CAROL.email, `another guess ${i}`);
    expect((await attempt(session, CAROL.email, CAROL.password)).hop.status).toBe(429);
    const other = await attempt(await onSignInPage(), GREG.email, GREG.password);
    expect(other.hop.status).toBe(303);
  }, 30_000);

  it('does not count successful sign-ins towards the limits', async () => {
    const account = { email: 'erin.eddy@example.test', password: 'settling velocity of cells', displayName: 'Erin Eddy' };
    await seedStandInAccounts(database.db, [account]);
    const results: { status: number; ms: number }[] = [];
    for (let i = 0; i < LIMITS.maxAttempts + 2; i += 1) {
      const { hop, ms } = await attempt(await onSignInPage(), account.email, account.password);
      results.push({ status: hop.status, ms });
    }
    expect(results.map((r) => r.status)).toEqual(Array(LIMITS.maxAttempts + 2).fill(303));
    // Counted, the later ones would also wait up to maxDelayMs before the refusals began.
    expect(Math.max(...results.map((r) => r.ms))).toBeLessThan(LIMITS.maxDelayMs);
  }, 30_000);
});
