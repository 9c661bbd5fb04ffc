import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { meSchema } from '../../shared/schemas/team.schema.ts';
import { Browser } from '../helpers/browser.ts';
import { PASSWORD, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

const SESSION_COOKIE = 'planktide_session';

describe('sign-in through the identity stand-in (OpenID Connect, code flow with PKCE)', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  });
  afterAll(async () => {
    await world.close();
  });

  it('refuses the protected API to an anonymous caller', async () => {
    const anonymous = new Browser();
    const me = await anonymous.api(world.baseUrl, 'GET', '/me');
    expect(me.status).toBe(401);
  });

  it('signs in over real redirects with PKCE and reaches /api/me as the right user and role', async () => {
    const browser = new Browser();
    await browser.signIn(world.baseUrl, 'manager@alder.test', PASSWORD);

    const authorize = browser.visited.map((u) => new URL(u)).find((u) => u.origin === world.identity.issuer && u.pathname.endsWith('/auth'));
    expect(authorize, 'the app sent the browser to the provider').toBeDefined();
    expect(authorize!.searchParams.get('response_type')).toBe('code');
    expect(authorize!.searchParams.get('code_challenge_method')).toBe('S256');
    expect(authorize!.searchParams.get('code_challenge')).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(browser.visited.some((u) => u.startsWith(`${world.baseUrl}/auth/callback?code=`))).toBe(true);
    expect(browser.cookie('127.0.0.1', SESSION_COOKIE)).toBeTruthy();

    const me = await browser.api(world.baseUrl, 'GET', '/me');
    expect(me.status).toBe(200);
    const body = meSchema.parse(me.json);
    expect(body.email).toBe('manager@alder.test');
    expect(body.id).toBe(world.userIds.managerA);
    expect(body.memberships).toEqual([{ organisationId: world.orgA, organisationName: 'Alder Shellfish', role: 'manager' }]);
  });

  it('creates the user at the first sign-in of someone the app has never seen', async () => {
    const browser = new Browser();
    await browser.signIn(world.baseUrl, 'outsider@nowhere.test', PASSWORD);
    const me = meSchema.parse((await browser.api(world.baseUrl, 'GET', '/me')).json);
    expect(me.email).toBe('outsider@nowhere.test');
    expect(me.memberships).toEqual([]);
    const row = await world.database.db.selectFrom('users').select(['oidc_subject']).where('email', '=', 'outsider@nowhere.test').executeTakeFirstOrThrow();
    expect(row.oidc_subject).toBeTruthy();
  });

  it('renews the session id at sign-in, so a session id planted before sign-in is worthless', async () => {
    const browser = new Browser();
    const planted = 'attacker-chosen-session-id-0123456789';
    browser.setCookie('127.0.0.1', SESSION_COOKIE, planted);
    await browser.signIn(world.baseUrl, 'crew@alder.test', PASSWORD);
    const issued = browser.cookie('127.0.0.1', SESSION_COOKIE)!;
    expect(issued).not.toContain(planted);

    const replay = await fetch(`${world.baseUrl}/api/me`, { headers: { cookie: `${SESSION_COOKIE}=${planted}` } });
    expect(replay.status).toBe(401);
  });

  it('gives a new session id when another person signs in on the same browser', async () => {
    const browser = new Browser();
    await browser.signIn(world.baseUrl, 'crew@alder.test', PASSWORD);
    const first = browser.cookie('127.0.0.1', SESSION_COOKIE)!;
    await browser.signOut(world.baseUrl);
    await browser.signIn(world.baseUrl, 'owner@alder.test', PASSWORD);
    expect(browser.cookie('127.0.0.1', SESSION_COOKIE)).not.toBe(first);
    expect(meSchema.parse((await browser.api(world.baseUrl, 'GET', '/me')).json).email).toBe('owner@alder.test');
    const replay = await fetch(`${world.baseUrl}/api/me`, { headers: { cookie: `${SESSION_COOKIE}=${first}` } });
    expect(replay.status).toBe(401);
  });

  it('signs out of both the app and the provider; the old cookie is dead server-side', async () => {
    const browser = new Browser();
    await browser.signIn(world.baseUrl, 'biologist@alder.test', PASSWORD);
    const cookie = browser.cookie('127.0.0.1', SESSION_COOKIE)!;
    expect((await browser.api(world.baseUrl, 'GET', '/me')).status).toBe(200);

    const out = await browser.signOut(world.baseUrl);
    expect(browser.visited.some((u) => u.startsWith(world.identity.issuer))).toBe(true);
    expect(out.url.startsWith(world.baseUrl)).toBe(true);
    expect((await browser.api(world.baseUrl, 'GET', '/me')).status).toBe(401);

    const replay = await fetch(`${world.baseUrl}/api/me`, { headers: { cookie: `${SESSION_COOKIE}=${cookie}` } });
    expect(replay.status).toBe(401);
    const rows = await world.database.db.selectFrom('app_sessions').select('sid').execute();
    expect(rows.map((r) => r.sid)).not.toContain(decodeURIComponent(cookie).split('.')[0]);

    // The provider's session ended too: signing in again asks for the password.
    const again = await browser.navigate(`${world.baseUrl}/auth/login`);
    expect(again.body).toContain('name="password"');
  });
});
