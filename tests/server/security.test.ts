import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { Browser } from '../helpers/browser.ts';
import { PASSWORD, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

const SITE = { name: 'Forged line', latitudeDeg: 57.2, longitudeDeg: -6.1, timeZone: 'Europe/London', waterDepthM: 12, bedType: 'mud', gearTopM: 1, gearBottomM: 6 };

describe('cross-site request forgery defence and security headers', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  async function forgedPost(headers: Record<string, string>) {
    const manager = await world.as('managerA');
    return manager.request(`${world.baseUrl}/api/orgs/${world.orgA}/sites`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...headers },
      body: JSON.stringify(SITE),
    });
  }

  const siteCount = async () => (await world.database.db.selectFrom('sites').select('id').where('name', '=', SITE.name).execute()).length;

  it('refuses a cookie-authenticated write without the anti-forgery header, changing nothing', async () => {
    const response = await forgedPost({ origin: 'https://evil.example' });
    expect(response.status).toBe(403);
    expect(apiErrorSchema.parse(await response.json()).error.message).toMatch(/Cross-site request refused/);
    expect(await siteCount()).toBe(0);
  });

  it('refuses a write whose Origin is another site even with the header', async () => {
    const response = await forgedPost({ 'x-planktide-csrf': '1', origin: 'https://evil.example' });
    expect(response.status).toBe(403);
    expect(await siteCount()).toBe(0);
  });

  it('refuses a write the browser marks as cross-site', async () => {
    const response = await forgedPost({ 'x-planktide-csrf': '1', 'sec-fetch-site': 'cross-site' });
    expect(response.status).toBe(403);
    expect(await siteCount()).toBe(0);
  });

  it('accepts the same write from the app itself', async () => {
    const response = await forgedPost({ 'x-planktide-csrf': '1', origin: world.baseUrl, 'sec-fetch-site': 'same-origin' });
    expect(response.status).toBe(201);
    expect(await siteCount()).toBe(1);
  });

  it('sends security headers (OWASP secure headers: CSP, nosniff, no framing) and no x-powered-by', async () => {
    const response = await fetch(`${world.baseUrl}/api/health`);
    const csp = response.headers.get('content-security-policy') ?? '';
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toContain('upgrade-insecure-requests');
    expect(response.headers.get('x-content-type-options')).toBe('nosniff');
    expect(response.headers.get('x-powered-by')).toBeNull();
    expect(response.headers.get('strict-transport-security')).toBeNull();
  });

  it('marks the session cookie HttpOnly and SameSite=Lax, and not Secure on plain-http loopback', async () => {
    const browser = new Browser();
    await browser.signIn(world.baseUrl, 'crew@alder.test', PASSWORD);
    const session = browser.setCookies.find((c) => c.url.includes('/auth/callback') && c.line.startsWith('planktide_session='));
    expect(session, 'the callback sets the session cookie').toBeDefined();
    expect(session!.line).toMatch(/;\s*HttpOnly/i);
    expect(session!.line).toMatch(/;\s*SameSite=Lax/i);
    expect(session!.line).not.toMatch(/;\s*Secure/i);
  });
});

describe('logs', () => {
  it('carry no one-time codes, session cookies or invitation tokens', async () => {
    const { Writable } = await import('node:stream');
    const { createLogger } = await import('../../server/logger.ts');
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk, _encoding, done) {
        lines.push(String(chunk));
        done();
      },
    });
    const world = await startTeamWorld({ logger: createLogger('info', sink) });
    try {
      const browser = new Browser();
      await browser.signIn(world.baseUrl, 'manager@alder.test', PASSWORD);
      const code = new URL(browser.visited.find((u) => u.includes('/auth/callback?code='))!).searchParams.get('code')!;
      const cookie = browser.cookie('127.0.0.1', 'planktide_session')!;
      await browser.api(world.baseUrl, 'GET', '/invitations/abcdefghijklmnopqrstuvwxyz0123456789ABCDEFG');
      const log = lines.join('');
      expect(log).toContain('/auth/callback?code=[redacted]');
      expect(log).toContain('/invitations/[redacted]');
      expect(log).not.toContain(code);
      expect(log).not.toContain(cookie);
      expect(log).not.toContain('abcdefghijklmnopqrstuvwxyz0123456789ABCDEFG');
    } finally {
      await world.close();
    }
  });
});
