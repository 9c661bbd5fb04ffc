import type { Transaction } from 'kysely';
import type { Site } from '../../shared/schemas/site.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Database, NewSite, Site as SiteRow, SiteUpdate } from '../db/schema.ts';

type Executor = Db | Transaction<Database>;

export function toSiteDto(row: SiteRow): Site {
  return {
    id: row.id,
    organisationId: row.organisation_id,
    name: row.name,
    latitudeDeg: row.latitude_deg,
    longitudeDeg: row.longitude_deg,
    timeZone: row.time_zone,
    waterDepthM: row.water_depth_m,
    bedType: row.bed_type as Site['bedType'],
    bedRoughnessM: row.bed_roughness_m,
    gearTopM: row.gear_top_m,
    gearBottomM: row.gear_bottom_m,
    archivedAt: row.archived_at ? row.archived_at.toISOString() : null,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

export async function listSites(db: Executor, organisationId: string, includeArchived: boolean) {
  let query = db.selectFrom('sites').selectAll().where('organisation_id', '=', organisationId);
  if (!includeArchived) query = query.where('archived_at', 'is', null);
  return query.orderBy('name').execute();
}

/** A site of the organisation, or undefined; never another organisation's. */
export async function findSite(db: Executor, organisationId: string, siteId: string) {
  return db.selectFrom('sites').selectAll().where('organisation_id', '=', organisationId).where('id', '=', siteId).executeTakeFirst();
}

export async function insertSite(trx: Executor, site: NewSite) {
  return trx.insertInto('sites').values(site).returningAll().executeTakeFirstOrThrow();
}

export async function updateSite(trx: Executor, organisationId: string, siteId: string, changes: SiteUpdate) {
  return trx
    .updateTable('sites')
    .set({ ...changes, updated_at: new Date() })
    .where('organisation_id', '=', organisationId)
    .where('id', '=', siteId)
    .returningAll()
    .executeTakeFirstOrThrow();
}
