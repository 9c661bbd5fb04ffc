import type { AppDeps } from '../../server/app.ts';
import { seedStandInAccounts } from '../../server/identity-standin/accounts.ts';
import { startIdentityStandIn, type RunningIdentityStandIn } from '../../server/identity-standin/start.ts';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.ts';
import type { Role } from '../../shared/schemas/common.schema.ts';
import { Browser } from './browser.ts';
import { freePort } from './free-port.ts';
import { startTestApp, TEST_CLIENT_ID, TEST_CLIENT_SECRET } from './test-app.ts';
import { createTestDatabase, type TestDatabase } from './test-database.ts';

export const PASSWORD = 'correct-horse-battery';

export interface Person {
  key: string;
  email: string;
  role: Role;
  organisation: 'A' | 'B';
}

/** Organisation A has one person per role; organisation B is the neighbour whose data A must never see. */
export const PEOPLE: Person[] = [
  { key: 'ownerA', email: 'owner@alder.test', role: 'owner', organisation: 'A' },
  { key: 'managerA', email: 'manager@alder.test', role: 'manager', organisation: 'A' },
  { key: 'biologistA', email: 'biologist@alder.test', role: 'biologist', organisation: 'A' },
  { key: 'crewA', email: 'crew@alder.test', role: 'crew', organisation: 'A' },
  { key: 'ownerB', email: 'owner@birch.test', role: 'owner', organisation: 'B' },
];

export const SITE_VALUES = {
  latitude_deg: 57.1,
  longitude_deg: -6.2,
  time_zone: 'Europe/London',
  water_depth_m: 15,
  bed_roughness_m: 0.02,
  gear_top_m: 1,
  gear_bottom_m: 8,
};

export interface TeamWorld {
  database: TestDatabase;
  baseUrl: string;
  orgA: string;
  orgB: string;
  siteA: string;
  siteB: string;
  userIds: Record<string, string>;
  smtp: SmtpStandIn;
  identity: RunningIdentityStandIn;
  /** Restarts the app on the same port with other deps (sessions live in the database and survive). */
  restartApp(extra: Partial<AppDeps>): Promise<void>;
  /** A browser signed in as that person (cached per key). */
  as(key: string): Promise<Browser>;
  close(): Promise<void>;
}

/** Two organisations with members, sites, a running identity stand-in, SMTP stand-in and the app. */
export async function startTeamWorld(extra: Partial<AppDeps> = {}): Promise<TeamWorld> {
  const database = await createTestDatabase();
  const { db } = database;
  const userIds: Record<string, string> = {};
  const orgs: Record<'A' | 'B', string> = { A: '', B: '' };
  for (const [key, name] of [['A', 'Alder Shellfish'], ['B', 'Birch Salmon']] as const) {
    orgs[key] = (await db.insertInto('organisations').values({ name }).returning('id').executeTakeFirstOrThrow()).id;
  }
  for (const person of PEOPLE) {
    const user = await db.insertInto('users').values({ email: person.email, display_name: person.key }).returning('id').executeTakeFirstOrThrow();
    userIds[person.key] = user.id;
    await db.insertInto('memberships').values({ organisation_id: orgs[person.organisation], user_id: user.id, role: person.role }).execute();
  }
  const accounts = [...PEOPLE.map((p) => p.email), 'outsider@nowhere.test', 'newcomer@alder.test', 'second@alder.test'];
  await seedStandInAccounts(db, accounts.map((email) => ({ email, password: PASSWORD, displayName: email.split('@')[0]! })));
  const siteA = (await db.insertInto('sites').values({ ...SITE_VALUES, organisation_id: orgs.A, name: 'Alder north line' }).returning('id').executeTakeFirstOrThrow()).id;
  const siteB = (await db.insertInto('sites').values({ ...SITE_VALUES, organisation_id: orgs.B, name: 'Birch pen 3' }).returning('id').executeTakeFirstOrThrow()).id;

  const appPort = await freePort();
  const baseUrl = `http://127.0.0.1:${appPort}`;
  const smtp = await startSmtpStandIn(0);
  const identity = await startIdentityStandIn({
    port: await freePort(),
    db,
    cookieKeys: ['identity-test-cookie-key-0123456789'],
    clients: [{ clientId: TEST_CLIENT_ID, clientSecret: TEST_CLIENT_SECRET, redirectUris: [`${baseUrl}/auth/callback`], postLogoutRedirectUris: [`${baseUrl}/`] }],
  });
  let app = await startTestApp(db, { port: appPort, issuerUrl: identity.issuer, smtpUrl: smtp.url, extra });

  const browsers = new Map<string, Browser>();
  return {
    database,
    baseUrl,
    orgA: orgs.A,
    orgB: orgs.B,
    siteA,
    siteB,
    userIds,
    smtp,
    identity,
    async as(key) {
      const cached = browsers.get(key);
      if (cached) return cached;
      const email = PEOPLE.find((p) => p.key === key)?.email ?? key;
      const browser = new Browser();
      await browser.signIn(baseUrl, email, PASSWORD);
      browsers.set(key, browser);
      return browser;
    },
    async restartApp(next) {
      await app.close();
      app.mailerClose();
      app = await startTestApp(db, { port: appPort, issuerUrl: identity.issuer, smtpUrl: smtp.url, extra: { ...extra, ...next } });
    },
    async close() {
      await app.close();
      app.mailerClose();
      await identity.close();
      await smtp.close().catch(() => {});
      await database.drop();
    },
  };
}
