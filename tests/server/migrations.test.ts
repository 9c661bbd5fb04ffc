import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../server/db/connect.ts';
import { migrateToLatest, migrateToNothing } from '../../server/db/migrate.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

async function tableNames(db: Db): Promise<string[]> {
  const result = await sql<{ table_name: string }>`
    select table_name from information_schema.tables
    where table_schema in ('public', 'identity_standin') and table_name not like 'kysely_%' order by table_name`.execute(db);
  return result.rows.map((r) => r.table_name);
}

describe('migrations', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase({ migrate: false });
  });
  afterAll(async () => {
    await database.drop();
  });

  it('go up on an empty database and create the first tables', async () => {
    const applied = await migrateToLatest(database.db);
    expect(applied.length).toBeGreaterThan(0);
    expect(applied.every((r) => r.status === 'Success')).toBe(true);
    expect(await tableNames(database.db)).toEqual([
      'accounts', 'alerts', 'app_sessions', 'audit_events', 'billing_accounts', 'billing_events', 'calibrations', 'constituent_sets', 'forecast_runs', 'forecasts',
      'invitations', 'lab_results', 'lab_uploads', 'mail_log', 'mail_settings', 'memberships', 'organisations', 'organism_profile_versions', 'organism_profiles',
      'planned_samples', 'schedule_slots', 'site_organisms', 'sites', 'taxon_mappings', 'tide_feed_refreshes', 'users',
    ]);
  });

  it('go down to nothing, leaving no table behind', async () => {
    await migrateToNothing(database.db);
    expect(await tableNames(database.db)).toEqual([]);
  });

  it('go up again after going down', async () => {
    await migrateToLatest(database.db);
    expect(await tableNames(database.db)).toContain('sites');
    expect(await migrateToLatest(database.db)).toEqual([]);
  });

  it('return numeric columns as numbers, not strings', async () => {
    const org = await database.db.insertInto('organisations').values({ name: 'Numbers test' }).returning('id').executeTakeFirstOrThrow();
    await database.db
      .insertInto('sites')
      .values({
        organisation_id: org.id,
        name: 'Test lease',
        latitude_deg: 51.5,
        longitude_deg: -4.25,
        time_zone: 'Europe/London',
        water_depth_m: 12.5,
        bed_roughness_m: 0.01,
        gear_top_m: 1,
        gear_bottom_m: 8,
      })
      .execute();
    const site = await database.db.selectFrom('sites').selectAll().executeTakeFirstOrThrow();
    expect(site.water_depth_m).toBe(12.5);
    const count = await database.db.selectFrom('sites').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow();
    expect(count.n).toBe(1);
    const exact = await sql<{ v: number }>`select 2.75::numeric as v`.execute(database.db);
    expect(exact.rows[0]?.v).toBe(2.75);
  });

  it('reject a gear band deeper than the water', async () => {
    const org = await database.db.selectFrom('organisations').select('id').executeTakeFirstOrThrow();
    await expect(
      database.db
        .insertInto('sites')
        .values({
          organisation_id: org.id,
          name: 'Too deep gear',
          latitude_deg: 51.5,
          longitude_deg: -4.25,
          time_zone: 'Europe/London',
          water_depth_m: 5,
          bed_roughness_m: 0.01,
          gear_top_m: 1,
          gear_bottom_m: 8,
        })
        .execute(),
    ).rejects.toThrow(/sites_gear_band_check/);
  });
});
