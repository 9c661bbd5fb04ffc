import type { Db } from '../../server/db/connect.ts';
import type { OrganismParamsInput } from '../../shared/schemas/organism.schema.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';

export const SINKING_DIATOM: OrganismParamsInput = {
  settlingVelocityMPerDay: 8,
  initialCellsPerL: 20_000,
  triggerCellsPerL: 25_000,
};

/** An invented M2 + S2 site current along a main axis of 30° (flood toward the north-east). */
export const SITE_CURRENT = {
  axisDeg: 30,
  constituents: [
    { name: 'M2', major: 0.35, phaseDeg: 40, minor: 0.02, inclinationDeg: 30 },
    { name: 'S2', major: 0.12, phaseDeg: 75, minor: 0.0, inclinationDeg: 30 },
  ],
};

export async function insertOrganisation(db: Db, name = 'Fjordline Mussels') {
  return (await db.insertInto('organisations').values({ name }).returning('id').executeTakeFirstOrThrow()).id;
}

/** A site with an active constituent set (source given) watching one new profile; returns ids. */
export async function insertForecastSite(
  db: Db,
  organisationId: string,
  options: { name: string; timeZone: string; source?: 'feed' | 'manual'; params?: OrganismParamsInput; horizonDays?: number; localTime?: string },
) {
  const site = await db
    .insertInto('sites')
    .values({
      organisation_id: organisationId,
      name: options.name,
      latitude_deg: 59.5,
      longitude_deg: 5.5,
      time_zone: options.timeZone,
      water_depth_m: 15,
      bed_roughness_m: 0.02,
      gear_top_m: 2,
      gear_bottom_m: 10,
      forecast_horizon_days: options.horizonDays ?? 3,
      forecast_local_time: options.localTime ?? '04:00',
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  const set = await db
    .insertInto('constituent_sets')
    .values({
      organisation_id: organisationId,
      site_id: site.id,
      version: 1,
      source: options.source ?? 'manual',
      kind: 'current',
      station_id: options.source === 'feed' ? 'NRD-07' : null,
      station_name: options.source === 'feed' ? 'Nordvik Sound' : null,
      current_constituents: JSON.stringify(SITE_CURRENT.constituents),
      current_axis_deg: SITE_CURRENT.axisDeg,
    })
    .returning(['id', 'version'])
    .executeTakeFirstOrThrow();
  await db.updateTable('sites').set({ active_constituent_set_id: set.id, tide_station_id: options.source === 'feed' ? 'NRD-07' : null }).where('id', '=', site.id).execute();
  const profile = await db.insertInto('organism_profiles').values({ organisation_id: organisationId, name: `${options.name} diatom`, taxon: 'Chaetoceros sp.' }).returning('id').executeTakeFirstOrThrow();
  const version = await db
    .insertInto('organism_profile_versions')
    .values({ profile_id: profile.id, organisation_id: organisationId, version: 1, params: JSON.stringify(organismParamsSchema.parse(options.params ?? SINKING_DIATOM)) })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('site_organisms').values({ site_id: site.id, profile_id: profile.id }).execute();
  return { siteId: site.id, setId: set.id, profileId: profile.id, versionId: version.id };
}

export async function waitFor<T>(what: string, probe: () => Promise<T | undefined | null | false>, withinMs = 60_000): Promise<T> {
  const deadline = Date.now() + withinMs;
  while (Date.now() < deadline) {
    const value = await probe();
    if (value) return value;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`Timed out waiting for ${what}`);
}
