import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACCESS_CACHE_MS } from '../../server/auth/access-cache.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

/**
 * Who is calling and their membership are kept for a moment between requests (server/auth/access-cache.ts).
 * A change made through the app must count at the very next request; one made behind its back, within
 * ACCESS_CACHE_MS.
 */
describe('access decisions kept between requests', () => {
  let world: TeamWorld;

  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => world?.close());

  it('takes a removed member out at their next request', async () => {
    const crew = await world.as('crewA');
    const owner = await world.as('ownerA');
    expect((await crew.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites`)).status).toBe(200);
    expect((await owner.api(world.baseUrl, 'DELETE', `/orgs/${world.orgA}/members/${world.userIds.crewA}`)).status).toBe(204);
    expect((await crew.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites`)).status).toBe(404);
  });

  it('applies a lowered role at the next request', async () => {
    const manager = await world.as('managerA');
    const owner = await world.as('ownerA');
    const site = `/orgs/${world.orgA}/sites/${world.siteA}`;
    expect((await manager.api(world.baseUrl, 'GET', site)).status).toBe(200);
    expect((await owner.api(world.baseUrl, 'PATCH', `/orgs/${world.orgA}/members/${world.userIds.managerA}`, { role: 'crew' })).status).toBe(204);
    // Crew may not edit sites (the authorisation table): refused, and the site unchanged.
    expect((await manager.api(world.baseUrl, 'PATCH', site, { name: 'Renamed by crew' })).status).toBe(403);
    expect(await world.database.db.selectFrom('sites').select('name').where('id', '=', world.siteA).executeTakeFirstOrThrow()).not.toEqual({ name: 'Renamed by crew' });
  });

  it('counts a membership removed behind the app (in SQL) within the moment it keeps answers', async () => {
    const biologist = await world.as('biologistA');
    expect((await biologist.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/profiles`)).status).toBe(200);
    await world.database.db.deleteFrom('memberships').where('organisation_id', '=', world.orgA).where('user_id', '=', world.userIds.biologistA!).execute();
    const removedAt = Date.now();
    let status = 200;
    while (status === 200 && Date.now() - removedAt < ACCESS_CACHE_MS + 3000) {
      status = (await biologist.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/profiles`)).status;
      if (status === 200) await new Promise((r) => setTimeout(r, 100));
    }
    expect(status).toBe(404);
    // Not later than the kept moment (plus one polling interval and a request's time).
    expect(Date.now() - removedAt).toBeLessThanOrEqual(ACCESS_CACHE_MS + 1000);
  });

  it('does not keep a refusal: a membership added behind the app counts at once', async () => {
    const ownerB = await world.as('ownerB');
    expect((await ownerB.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites`)).status).toBe(404);
    await world.database.db.insertInto('memberships').values({ organisation_id: world.orgA, user_id: world.userIds.ownerB!, role: 'crew' }).execute();
    expect((await ownerB.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites`)).status).toBe(200);
  });
});
