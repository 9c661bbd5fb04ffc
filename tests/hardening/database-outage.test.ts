import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, ensureDatabase, type Db } from '../../server/db/connect.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { seedStandInAccounts } from '../../server/identity-standin/accounts.ts';
import { startIdentityStandIn, type RunningIdentityStandIn } from '../../server/identity-standin/start.ts';
import { startCluster, type RunningCluster } from '../../server/postgres/cluster.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { Browser } from '../helpers/browser.ts';
import { freePort } from '../helpers/free-port.ts';
import type { RunningServer } from '../helpers/http.ts';
import { startTestApp, TEST_CLIENT_ID, TEST_CLIENT_SECRET } from '../helpers/test-app.ts';

const SITE = { latitudeDeg: 57, longitudeDeg: -6, timeZone: 'Europe/London', waterDepthM: 12, bedType: 'mud', gearTopM: 1, gearBottomM: 6 };

describe('PostgreSQL stopped and restarted while people use the API', () => {
  let dir: string;
  let pgPort: number;
  let cluster: RunningCluster;
  let db: Db;
  let identity: RunningIdentityStandIn;
  let app: RunningServer & { mailerClose(): void };
  let browser: Browser;
  let orgId: string;
  const start = () => startCluster({ dataDir: path.join(dir, 'data'), port: pgPort, throwaway: true });

  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'planktide-outage-'));
    chmodSync(dir, 0o755);
    pgPort = await freePort();
    cluster = start();
    await ensureDatabase(cluster.adminUrl, 'planktide');
    db = createDb(cluster.urlFor('planktide'), 4);
    await migrateToLatest(db);
    orgId = (await db.insertInto('organisations').values({ name: 'Outage Oysters' }).returning('id').executeTakeFirstOrThrow()).id;
    const user = await db.insertInto('users').values({ email: 'm@outage.test', display_name: 'M' }).returning('id').executeTakeFirstOrThrow();
    await db.insertInto('memberships').values({ organisation_id: orgId, user_id: user.id, role: 'manager' }).execute();
    await seedStandInAccounts(db, [{ email: 'm@outage.test', password: 'outage-password-1', displayName: 'M' }]);
    const appPort = await freePort();
    identity = await startIdentityStandIn({
      port: await freePort(),
      db: cluster.urlFor('planktide'),
      cookieKeys: ['outage-cookie-key-0123456789'],
      clients: [{ clientId: TEST_CLIENT_ID, clientSecret: TEST_CLIENT_SECRET, redirectUris: [`http://127.0.0.1:${appPort}/auth/callback`], postLogoutRedirectUris: [`http://127.0.0.1:${appPort}/`] }],
    });
    app = await startTestApp(db, { port: appPort, issuerUrl: identity.issuer });
    browser = new Browser();
    await browser.signIn(app.baseUrl, 'm@outage.test', 'outage-password-1');
  }, 90_000);

  afterAll(async () => {
    await app.close();
    app.mailerClose();
    await identity.close();
    await db.destroy();
    cluster.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('answers 503 with Retry-After during the outage, keeps people signed in, loses no acknowledged write, and recovers without a restart', async () => {
    const before = await browser.api(app.baseUrl, 'POST', `/orgs/${orgId}/sites`, { ...SITE, name: 'Before the outage' });
    expect(before.status).toBe(201);

    cluster.stop();
    const statuses: number[] = [];
    const attempts = await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        browser.api(app.baseUrl, i % 2 ? 'GET' : 'POST', `/orgs/${orgId}/sites`, i % 2 ? undefined : { ...SITE, name: `During ${i}` }),
      ),
    );
    for (const a of attempts) statuses.push(a.status);
    expect(new Set(statuses)).toEqual(new Set([503]));
    expect(apiErrorSchema.parse(attempts[0]!.json).error.message).toMatch(/database is not reachable/);
    const retryAfter = await browser.request(`${app.baseUrl}/api/orgs/${orgId}/sites`);
    expect(retryAfter.headers.get('retry-after')).toBe('30');

    cluster = start();
    const after = await browser.api(app.baseUrl, 'POST', `/orgs/${orgId}/sites`, { ...SITE, name: 'After the outage' });
    expect(after.status).toBe(201);
    const names = (await db.selectFrom('sites').select('name').orderBy('name').execute()).map((r) => r.name);
    // Every write that was acknowledged is there; none of the refused ones half-happened.
    expect(names).toEqual(['After the outage', 'Before the outage']);
  }, 90_000);
});
