import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { profileDetailSchema, profileEditResultSchema, profileSchema, profileVersionSchema, type OrganismParamsInput } from '../../shared/schemas/organism.schema.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

const PARAMS: OrganismParamsInput = { settlingVelocityMPerDay: 1, initialCellsPerL: 500, triggerCellsPerL: 1000 };
let counter = 0;

describe('organism profiles API', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world?.close();
  });

  const base = () => `/orgs/${world.orgA}/profiles`;

  async function createProfile(as = 'biologistA', params: OrganismParamsInput = PARAMS) {
    const browser = await world.as(as);
    const { status, json } = await browser.api(world.baseUrl, 'POST', base(), { name: `Test diatom ${counter++}`, taxon: 'Skeletonema sp.', params, note: 'first' });
    expect(status).toBe(201);
    return profileSchema.parse(json);
  }

  async function detail(profileId: string) {
    const browser = await world.as('crewA');
    const { status, json } = await browser.api(world.baseUrl, 'GET', `${base()}/${profileId}`);
    expect(status).toBe(200);
    return profileDetailSchema.parse(json);
  }

  /** What the forecast pipeline does when a forecast has used the version. */
  const markUsed = (versionId: string) => world.database.db.updateTable('organism_profile_versions').set({ first_used_at: new Date() }).where('id', '=', versionId).execute();

  async function auditActions(): Promise<string[]> {
    const rows = await world.database.db.selectFrom('audit_events').select('action').where('organisation_id', '=', world.orgA).execute();
    return rows.map((r) => r.action);
  }

  it('returns a profile with all its versions to any member', async () => {
    const created = await createProfile();
    const got = await detail(created.id);
    expect(got.name).toBe(created.name);
    expect(got.versions.map((v) => v.version)).toEqual([1]);
    expect(got.latest.params.settlingVelocityMPerDay).toBe(1);
    expect(got.archivedAt).toBeNull();
  });

  it('changes an unused latest version in place, making no new version', async () => {
    const created = await createProfile();
    const browser = await world.as('biologistA');
    const { status, json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { params: { ...PARAMS, settlingVelocityMPerDay: 2.5 }, note: 'faster' });
    expect(status).toBe(200);
    const result = profileEditResultSchema.parse(json);
    expect(result.versionChange).toBe('updated_in_place');
    expect(result.profile.versions).toHaveLength(1);
    expect(result.profile.latest.id).toBe(created.latest.id);
    expect(result.profile.latest.params.settlingVelocityMPerDay).toBe(2.5);
    expect(result.profile.latest.note).toBe('faster');
  });

  it('adds version 2 when the latest has been used and leaves version 1 as it was', async () => {
    const created = await createProfile();
    await markUsed(created.latest.id);
    const browser = await world.as('managerA');
    const { status, json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { params: { ...PARAMS, settlingVelocityMPerDay: 4 }, note: 'from lab settling columns' });
    expect(status).toBe(200);
    const result = profileEditResultSchema.parse(json);
    expect(result.versionChange).toBe('new_version');
    expect(result.profile.versions.map((v) => v.version)).toEqual([2, 1]);
    const [v2, v1] = result.profile.versions;
    expect(v2!.params.settlingVelocityMPerDay).toBe(4);
    expect(v2!.used).toBe(false);
    expect(v1!.id).toBe(created.latest.id);
    expect(v1!.params).toEqual(created.latest.params);
    expect(v1!.note).toBe('first');
    expect(v1!.used).toBe(true);
    expect(await auditActions()).toContain('profile.updated');
  });

  it('adds a version when a forecast run is waiting on the unused latest version', async () => {
    const created = await createProfile();
    await world.database.db
      .insertInto('forecast_runs')
      .values({ organisation_id: world.orgA, site_id: world.siteA, profile_version_id: created.latest.id, forecast_start: new Date(Date.UTC(2026, 11, 1, counter)), horizon_days: 3, trigger: 'manual' })
      .execute();
    const browser = await world.as('biologistA');
    const { json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { params: { ...PARAMS, mortalityPerDay: 0.2 } });
    const result = profileEditResultSchema.parse(json);
    expect(result.versionChange).toBe('new_version');
    expect(result.profile.versions.find((v) => v.version === 1)!.params.mortalityPerDay).toBe(0);
  });

  it('renames a used profile without making a version', async () => {
    const created = await createProfile();
    await markUsed(created.latest.id);
    const browser = await world.as('ownerA');
    const { status, json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { name: `${created.name} (renamed)` });
    expect(status).toBe(200);
    const result = profileEditResultSchema.parse(json);
    expect(result.versionChange).toBe('none');
    expect(result.profile.name).toBe(`${created.name} (renamed)`);
    expect(result.profile.versions).toHaveLength(1);
  });

  it('always adds a version on POST versions, even when the latest is unused', async () => {
    const created = await createProfile();
    const browser = await world.as('biologistA');
    const { status, json } = await browser.api(world.baseUrl, 'POST', `${base()}/${created.id}/versions`, { params: { ...PARAMS, settlingVelocityMPerDay: 0.3 }, note: 'What-if at the north line' });
    expect(status).toBe(201);
    const got = profileDetailSchema.parse(json);
    expect(got.versions.map((v) => [v.version, v.params.settlingVelocityMPerDay])).toEqual([
      [2, 0.3],
      [1, 1],
    ]);
    const one = await browser.api(world.baseUrl, 'GET', `${base()}/${created.id}/versions/${got.versions[1]!.id}`);
    expect(one.status).toBe(200);
    expect(profileVersionSchema.parse(one.json).version).toBe(1);
  });

  it('refuses crew edits with 403 and changes nothing', async () => {
    const created = await createProfile();
    const crew = await world.as('crewA');
    const { status } = await crew.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { params: { ...PARAMS, settlingVelocityMPerDay: 9 } });
    expect(status).toBe(403);
    expect((await detail(created.id)).latest.params.settlingVelocityMPerDay).toBe(1);
  });

  it('lets biologists, managers and owners edit, and crew only read', async () => {
    const created = await createProfile();
    const statuses: Record<string, number> = {};
    for (const who of ['crewA', 'biologistA', 'managerA', 'ownerA']) {
      const browser = await world.as(who);
      statuses[who] = (await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { note: `note by ${who}` })).status;
    }
    expect(statuses).toEqual({ crewA: 403, biologistA: 200, managerA: 200, ownerA: 200 });
    const crew = await world.as('crewA');
    expect((await crew.api(world.baseUrl, 'GET', `${base()}/${created.id}`)).status).toBe(200);
  });

  it('hides profiles of another organisation behind 404', async () => {
    const created = await createProfile();
    const neighbour = await world.as('ownerB');
    expect((await neighbour.api(world.baseUrl, 'GET', `/orgs/${world.orgB}/profiles/${created.id}`)).status).toBe(404);
    expect((await neighbour.api(world.baseUrl, 'PATCH', `/orgs/${world.orgB}/profiles/${created.id}`, { note: 'x' })).status).toBe(404);
  });

  it('answers a bad settling velocity with 400 naming the field, unit and typical range, and changes nothing', async () => {
    const created = await createProfile();
    const browser = await world.as('biologistA');
    const before = await detail(created.id);
    const { status, json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { name: 'Should not stick', params: { ...PARAMS, settlingVelocityMPerDay: 500 } });
    expect(status).toBe(400);
    const body = apiErrorSchema.parse(json);
    const details = body.error.details as { path: string; message: string }[];
    const issue = details.find((d) => d.path === 'params.settlingVelocityMPerDay');
    expect(issue?.message).toMatch(/settling velocity must be at most 200 m\/day/);
    expect(issue?.message).toMatch(/0–30 m\/day, Smayda 1970/);
    expect(await detail(created.id)).toEqual(before);
  });

  it('answers a swimming speed given as text with 400 naming the field and its unit', async () => {
    const created = await createProfile();
    const browser = await world.as('biologistA');
    const { status, json } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, {
      params: { ...PARAMS, swimming: { speedMPerHour: 'fast', schedule: { type: 'sun' } } },
    });
    expect(status).toBe(400);
    const details = apiErrorSchema.parse(json).error.details as { path: string; message: string }[];
    expect(details).toContainEqual({ path: 'params.swimming.speedMPerHour', message: 'swimming speed must be a number of m/h' });
  });

  it('refuses a name another profile has with 409 and keeps the old name', async () => {
    const first = await createProfile();
    const second = await createProfile();
    const browser = await world.as('biologistA');
    const { status } = await browser.api(world.baseUrl, 'PATCH', `${base()}/${second.id}`, { name: first.name, params: { ...PARAMS, settlingVelocityMPerDay: 7 } });
    expect(status).toBe(409);
    const after = await detail(second.id);
    expect(after.name).toBe(second.name);
    expect(after.latest.params.settlingVelocityMPerDay).toBe(1);
  });

  it('archives a profile: gone from the list, still readable, no longer editable', async () => {
    const created = await createProfile();
    const browser = await world.as('biologistA');
    const archived = await browser.api(world.baseUrl, 'POST', `${base()}/${created.id}/archive`);
    expect(archived.status).toBe(200);
    expect(profileDetailSchema.parse(archived.json).archivedAt).not.toBeNull();
    const list = await browser.api(world.baseUrl, 'GET', base());
    expect((list.json as { profiles: { id: string }[] }).profiles.map((p) => p.id)).not.toContain(created.id);
    expect((await browser.api(world.baseUrl, 'PATCH', `${base()}/${created.id}`, { note: 'late' })).status).toBe(409);
    expect(await auditActions()).toContain('profile.archived');
  });
});
