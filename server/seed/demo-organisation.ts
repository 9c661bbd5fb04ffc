import type { Db } from '../db/connect.ts';
import type { Role } from '../db/schema.ts';

/**
 * An invented farm business for trying Planktide. Places, people and numbers are made up;
 * the coordinates sit in open water off no real farm.
 */
export const DEMO_ORGANISATION = 'Gullhaven Shellfish (demo)';

/** Password of the demo accounts in the local identity stand-in (never used with a real identity service). */
export const DEMO_PASSWORD = 'gullhaven-demo';

export const DEMO_PEOPLE: { email: string; displayName: string; role: Role }[] = [
  { email: 'owner@gullhaven.test', displayName: 'Maren Tollefsen', role: 'owner' },
  { email: 'manager@gullhaven.test', displayName: 'Idris Calloway', role: 'manager' },
  { email: 'biologist@gullhaven.test', displayName: 'Dr Ana Quintero', role: 'biologist' },
  { email: 'crew@gullhaven.test', displayName: 'Tomas Rey', role: 'crew' },
];

export const DEMO_SITES = [
  {
    name: 'Skerry Narrows mussel lines',
    latitude_deg: 56.412,
    longitude_deg: -5.731,
    time_zone: 'Europe/London',
    water_depth_m: 18,
    bed_roughness_m: 0.02,
    gear_top_m: 2,
    gear_bottom_m: 10,
  },
  {
    name: 'Heron Flats oyster trestles',
    latitude_deg: 53.204,
    longitude_deg: -9.478,
    time_zone: 'Europe/Dublin',
    water_depth_m: 6,
    bed_roughness_m: 0.006,
    gear_top_m: 0.5,
    gear_bottom_m: 3,
  },
  {
    name: 'Eastwick Deep salmon pens',
    latitude_deg: 60.871,
    longitude_deg: 4.912,
    time_zone: 'Europe/Oslo',
    water_depth_m: 45,
    bed_roughness_m: 0.05,
    gear_top_m: 0,
    gear_bottom_m: 20,
  },
];

/** Seeds the demo organisation when the database holds no organisation yet. Returns whether it seeded. */
export async function seedDemoWhenEmpty(db: Db): Promise<boolean> {
  return db.transaction().execute(async (trx) => {
    const existing = await trx.selectFrom('organisations').select('id').limit(1).executeTakeFirst();
    if (existing) return false;
    const org = await trx.insertInto('organisations').values({ name: DEMO_ORGANISATION }).returning('id').executeTakeFirstOrThrow();
    for (const person of DEMO_PEOPLE) {
      const user = await trx
        .insertInto('users')
        .values({ email: person.email, display_name: person.displayName })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx.insertInto('memberships').values({ organisation_id: org.id, user_id: user.id, role: person.role }).execute();
    }
    await trx
      .insertInto('sites')
      .values(DEMO_SITES.map((site) => ({ ...site, organisation_id: org.id })))
      .execute();
    return true;
  });
}
