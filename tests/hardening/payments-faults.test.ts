import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPaymentsClient } from '../../server/billing/payments-client.ts';
import { requireActiveSubscription } from '../../server/billing/subscription-gate.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { fingerprint } from '../helpers/db-fingerprint.ts';
import { freePort } from '../helpers/free-port.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

/**
 * The payments service slow (accepts connections, never answers) or down (nothing listening). The
 * product says so on the billing actions that need it and saves nothing, while what does not need it
 * (the subscription already mirrored in our database, and the forecasts it unlocks) keeps working.
 */
describe.each([
  ['slow', true],
  ['down', false],
])('the payments service %s', (_name, listening) => {
  let world: TeamWorld;
  let silent: net.Server | undefined;
  const sockets = new Set<net.Socket>();

  beforeAll(async () => {
    const port = await freePort();
    if (listening) {
      silent = net.createServer((socket) => {
        sockets.add(socket);
        socket.on('close', () => sockets.delete(socket));
      });
      await new Promise<void>((resolve) => silent!.listen(port, '127.0.0.1', resolve));
    }
    // A short timeout, so that the test does not wait the product's 15 s; one network retry as in production.
    const stripe = createPaymentsClient({ secretKey: 'sk_test_faults', url: `http://127.0.0.1:${port}`, timeoutMs: 400 });
    world = await startTeamWorld({ billing: { stripe, webhookSecret: 'whsec_test_faults' } });
    await world.restartApp({ forecasts: { forecastGate: requireActiveSubscription(world.database.db) } });
    // Organisation A subscribed earlier: its subscription is mirrored in our database.
    await world.database.db
      .insertInto('billing_accounts')
      .values({ organisation_id: world.orgA, customer_id: 'cus_faults', subscription_id: 'sub_faults', status: 'active', plan_id: 'longline', quantity: 1 })
      .execute();
  }, 60_000);
  afterAll(async () => {
    await world?.close();
    for (const socket of sockets) socket.destroy();
    await new Promise((resolve) => (silent ? silent.close(resolve) : resolve(undefined)));
  });

  it('answers checkout and the portal with 503 saying the payments service did not answer, and changes nothing', async () => {
    await world.as('ownerA');
    await world.as('ownerB'); // signed in before the fingerprint: a first sign-in records the user
    const before = await fingerprint(world.database.db);
    // Organisation B subscribes for the first time; A's owner opens the portal of A's subscription.
    for (const [key, org, path, body] of [
      ['ownerB', world.orgB, 'checkout', { plan: 'longline', interval: 'month' }],
      ['ownerA', world.orgA, 'portal', undefined],
    ] as const) {
      const owner = await world.as(key);
      const answer = await owner.api(world.baseUrl, 'POST', `/orgs/${org}/billing/${path}`, body);
      expect(answer.status).toBe(503);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/payments service did not answer/);
    }
    expect(await fingerprint(world.database.db)).toEqual(before);
  });

  it('still shows the mirrored subscription and serves the forecasts it unlocks', async () => {
    const crew = await world.as('crewA');
    const status = await crew.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/billing`);
    expect(status.status).toBe(200);
    expect(status.json).toMatchObject({ forecastsUnlocked: true });
    // Not 402: the gate reads our mirror, not the payments service (404: no forecast has been made yet).
    const latest = await crew.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites/${world.siteA}/forecasts/latest?profileId=00000000-0000-4000-8000-000000000000`);
    expect(latest.status).toBe(404);
  });
});
