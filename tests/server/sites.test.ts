import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bedTypeRoughness } from '../../shared/bed-types.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { siteListSchema, siteSchema } from '../../shared/schemas/site.schema.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

const NEW_SITE = { name: 'Quarry Bay rafts', latitudeDeg: 56.9, longitudeDeg: -5.95, timeZone: 'Europe/London', waterDepthM: 14, bedType: 'sand-rippled', gearTopM: 1.5, gearBottomM: 9 };

describe('sites API', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  it('creates a site whose roughness comes from the bed type (ks = 30 z0, Soulsby 1997 Table 7 [from memory])', async () => {
    const manager = await world.as('managerA');
    const created = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, NEW_SITE);
    expect(created.status).toBe(201);
    const site = siteSchema.parse(created.json);
    expect(site.bedRoughnessM).toBeCloseTo(30 * 0.006, 12);
    expect(site.bedRoughnessM).toBe(bedTypeRoughness('sand-rippled'));
    expect(site.organisationId).toBe(world.orgA);
  });

  it('rejects a gear band below the bed with a message naming the field, and stores nothing', async () => {
    const manager = await world.as('managerA');
    const before = (await world.database.db.selectFrom('sites').select('id').execute()).length;
    const answer = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, { ...NEW_SITE, name: 'Too deep', gearBottomM: 20 });
    expect(answer.status).toBe(400);
    const error = apiErrorSchema.parse(answer.json).error;
    expect(error.code).toBe('validation_failed');
    expect(error.message).toContain('gearBottomM: gear bottom must not be deeper than the water depth');
    expect((await world.database.db.selectFrom('sites').select('id').execute()).length).toBe(before);
  });

  it('rejects an unknown time zone and a missing bed description', async () => {
    const manager = await world.as('managerA');
    const answer = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, { ...NEW_SITE, name: 'Nowhere', timeZone: 'Mars/Olympus', bedType: null });
    const error = apiErrorSchema.parse(answer.json).error;
    expect(answer.status).toBe(400);
    expect(error.message).toContain('timeZone: must be an IANA time zone');
    expect(error.message).toContain('bedRoughnessM: give a bed type or a bed roughness');
  });

  it('refuses a second site with the same name in one organisation', async () => {
    const manager = await world.as('managerA');
    const answer = await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, NEW_SITE);
    expect(answer.status).toBe(409);
  });

  it('updates a site, re-checking the merged values', async () => {
    const manager = await world.as('managerA');
    const bad = await manager.api(world.baseUrl, 'PATCH', `/orgs/${world.orgA}/sites/${world.siteA}`, { waterDepthM: 5 });
    expect(bad.status).toBe(400);
    expect(apiErrorSchema.parse(bad.json).error.message).toContain('gear bottom must not be deeper than the water depth');
    const good = await manager.api(world.baseUrl, 'PATCH', `/orgs/${world.orgA}/sites/${world.siteA}`, { bedRoughnessM: 0.05 });
    expect(siteSchema.parse(good.json)).toMatchObject({ bedRoughnessM: 0.05, bedType: null });
  });

  it('archives a site: hidden from the list unless asked for, kept in the database', async () => {
    const manager = await world.as('managerA');
    const created = siteSchema.parse((await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites`, { ...NEW_SITE, name: 'Old lease' })).json);
    const archived = siteSchema.parse((await manager.api(world.baseUrl, 'POST', `/orgs/${world.orgA}/sites/${created.id}/archive`)).json);
    expect(archived.archivedAt).not.toBeNull();
    const listed = siteListSchema.parse((await manager.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites`)).json).sites.map((s) => s.name);
    expect(listed).not.toContain('Old lease');
    const all = siteListSchema.parse((await manager.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites?archived=include`)).json).sites.map((s) => s.name);
    expect(all).toContain('Old lease');
  });

  it('records site changes in the audit log that owners read', async () => {
    const owner = await world.as('ownerA');
    const audit = await owner.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/audit`);
    const actions = (audit.json as { events: { action: string }[] }).events.map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['site.created', 'site.updated', 'site.archived']));
  });
});

describe('organisations and roles', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  it('makes the creator of an organisation its owner, so a user can belong to several', async () => {
    const crew = await world.as('crewA');
    const created = await crew.api(world.baseUrl, 'POST', '/organisations', { name: 'Crew side business' });
    expect(created.status).toBe(201);
    const me = (await crew.api(world.baseUrl, 'GET', '/me')).json as { memberships: { organisationName: string; role: string }[] };
    expect(me.memberships).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ organisationName: 'Alder Shellfish', role: 'crew' }),
        expect.objectContaining({ organisationName: 'Crew side business', role: 'owner' }),
      ]),
    );
  });

  it('keeps at least one owner', async () => {
    const owner = await world.as('ownerA');
    const answer = await owner.api(world.baseUrl, 'PATCH', `/orgs/${world.orgA}/members/${world.userIds.ownerA}`, { role: 'manager' });
    expect(answer.status).toBe(409);
    expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/at least one owner/);
  });

  it('changes a role and logs who did it', async () => {
    const owner = await world.as('ownerA');
    expect((await owner.api(world.baseUrl, 'PATCH', `/orgs/${world.orgA}/members/${world.userIds.crewA}`, { role: 'biologist' })).status).toBe(204);
    const events = ((await owner.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/audit`)).json as { events: { action: string; actor: string; details: unknown }[] }).events;
    expect(events[0]).toMatchObject({ action: 'member.role_changed', actor: 'owner@alder.test', details: { from: 'crew', to: 'biologist' } });
  });

  it('deletes an organisation only when its name is typed, then it is gone for its members', async () => {
    const owner = await world.as('ownerB');
    expect((await owner.api(world.baseUrl, 'DELETE', `/orgs/${world.orgB}`, { confirmName: 'Birch' })).status).toBe(400);
    expect((await owner.api(world.baseUrl, 'DELETE', `/orgs/${world.orgB}`, { confirmName: 'Birch Salmon' })).status).toBe(204);
    expect((await owner.api(world.baseUrl, 'GET', `/orgs/${world.orgB}/sites`)).status).toBe(404);
    const trace = await world.database.db.selectFrom('audit_events').select(['action', 'subject']).where('action', '=', 'organisation.deleted').executeTakeFirst();
    expect(trace).toEqual({ action: 'organisation.deleted', subject: 'Birch Salmon' });
  });
});
