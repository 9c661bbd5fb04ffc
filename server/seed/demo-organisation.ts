import type { Db } from '../db/connect.ts';
import type { Role } from '../db/schema.ts';
import { organismParamsSchema, type OrganismParamsInput } from '../../shared/schemas/organism.schema.ts';

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

/**
 * Invented demo organisms with values inside published ranges (docs/organisms.md): sinking rates of
 * living cells 0–30 m/d, most under 1–2 m/d (Smayda 1970); a 40 µm cyst of density 1200 kg/m³ sinks
 * about 10 m/d (Stokes); dinoflagellates swim 0.5–2 m/h (Hand et al. 1965). Triggers are examples a
 * farm would set itself, not legal limits.
 */
export const DEMO_PROFILES: { name: string; taxon: string; params: OrganismParamsInput }[] = [
  {
    name: 'Slow-sinking chain diatom',
    taxon: 'Pseudo-nitzschia spp. (demo values)',
    params: {
      settlingVelocityMPerDay: 0.5,
      growth: { maxRatePerDay: null, temperatureC: 12, lightAttenuationPerM: 0.25, lightSaturationUmol: 150 },
      mortalityPerDay: 0.15,
      initialCellsPerL: 40_000,
      triggerCellsPerL: 150_000,
    },
  },
  {
    name: 'Heavy resting cyst',
    taxon: 'Alexandrium spp. cysts (demo values)',
    params: {
      settlingVelocityMPerDay: 10,
      bedExchange: { criticalStressPa: 0.15, erosionRate: 0.002 },
      initialCellsPerL: 300,
      triggerCellsPerL: 100,
    },
  },
  {
    name: 'Swimming dinoflagellate',
    taxon: 'Dinophysis spp. (demo values)',
    params: {
      settlingVelocityMPerDay: 0.2,
      swimming: { speedMPerHour: 1, schedule: { type: 'sun' }, minDepthM: 1, maxDepthM: 15 },
      growth: { maxRatePerDay: null, temperatureC: 12, lightAttenuationPerM: 0.25, lightSaturationUmol: 100 },
      mortalityPerDay: 0.1,
      initialCellsPerL: 300,
      triggerCellsPerL: 100,
    },
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
    const sites = await trx
      .insertInto('sites')
      .values(DEMO_SITES.map((site) => ({ ...site, organisation_id: org.id })))
      .returning('id')
      .execute();
    for (const demo of DEMO_PROFILES) {
      const profile = await trx.insertInto('organism_profiles').values({ organisation_id: org.id, name: demo.name, taxon: demo.taxon }).returning('id').executeTakeFirstOrThrow();
      await trx
        .insertInto('organism_profile_versions')
        .values({ profile_id: profile.id, organisation_id: org.id, version: 1, params: JSON.stringify(organismParamsSchema.parse(demo.params)), note: 'Demo profile' })
        .execute();
      await trx.insertInto('site_organisms').values(sites.map((site) => ({ site_id: site.id, profile_id: profile.id }))).execute();
    }
    return true;
  });
}
