import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startIdentityStandIn } from '../../server/identity-standin/start.ts';
import { quietLogger } from '../helpers/quiet-logger.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';
import { newAuthRequest, authorizeUrl, TEST_COOKIE_KEYS } from './oidc-test-kit.ts';

const CLIENT = {
  clientId: 'planktide-options-test',
  clientSecret: 'options-test-secret-0123456789',
  redirectUris: ['http://127.0.0.1:9/callback'],
  postLogoutRedirectUris: ['http://127.0.0.1:9/signed-out'],
};

describe('starting the identity stand-in', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase();
  });
  afterAll(async () => {
    await database?.drop();
  });

  it('takes a connection string and port 0, names the port it got in the issuer, and closes cleanly', async () => {
    const standIn = await startIdentityStandIn({ port: 0, db: database.url, clients: [CLIENT], cookieKeys: TEST_COOKIE_KEYS, logger: quietLogger() });
    try {
      expect(standIn.issuer).toMatch(/^http:\/\/127\.0\.0\.1:[1-9]\d*$/);
      const discovery = (await (await fetch(`${standIn.issuer}/.well-known/openid-configuration`)).json()) as { issuer: string };
      expect(discovery.issuer).toBe(standIn.issuer);
    } finally {
      await standIn.close();
    }
    await expect(fetch(`${standIn.issuer}/.well-known/openid-configuration`)).rejects.toThrow();
  });

  it('sets its cookies HttpOnly and SameSite=Lax, and not Secure, on plain http', async () => {
    const standIn = await startIdentityStandIn({ port: 0, db: database.db, clients: [CLIENT], cookieKeys: TEST_COOKIE_KEYS, logger: quietLogger() });
    try {
      const { request } = newAuthRequest(CLIENT);
      const response = await fetch(authorizeUrl(standIn.issuer, request), { redirect: 'manual' });
      const cookies = response.headers.getSetCookie();
      expect(cookies.map((c) => c.split('=')[0])).toEqual(expect.arrayContaining(['standin_interaction', 'standin_resume']));
      for (const cookie of cookies) {
        expect(cookie.toLowerCase()).toContain('httponly');
        expect(cookie.toLowerCase()).toContain('samesite=lax');
        expect(cookie.toLowerCase()).not.toContain('secure');
      }
    } finally {
      await standIn.close();
    }
  });

  it('refuses options without cookie keys or with a short client secret, naming what is wrong', async () => {
    await expect(startIdentityStandIn({ port: 0, db: database.db, clients: [CLIENT], cookieKeys: [] })).rejects.toThrow(/cookieKeys/);
    await expect(
      startIdentityStandIn({ port: 0, db: database.db, clients: [{ ...CLIENT, clientSecret: 'short' }], cookieKeys: TEST_COOKIE_KEYS }),
    ).rejects.toThrow(/client secrets need at least 16 characters/);
  });
});
