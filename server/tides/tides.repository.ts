import type { Kysely, Transaction } from 'kysely';
import type { ConstituentSet, CurrentPart, LevelPart, SetFit } from '../../shared/schemas/tides.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';
import type { ConstituentSetRow, NewConstituentSet, SiteTidesTables } from '../db/tables/tides.ts';

type Executor = Db | Transaction<Database>;

/** The executor with the columns the tides migration added to `sites`. */
const withSiteColumns = (db: Executor) => (db as Kysely<Database>).withTables<SiteTidesTables>();

export interface TideSite {
  id: string;
  organisation_id: string;
  name: string;
  latitude_deg: number;
  longitude_deg: number;
  time_zone: string;
  active_constituent_set_id: string | null;
  tide_station_id: string | null;
  tide_station_name: string | null;
}

const SITE_COLUMNS = ['id', 'organisation_id', 'name', 'latitude_deg', 'longitude_deg', 'time_zone', 'active_constituent_set_id', 'tide_station_id', 'tide_station_name'] as const;

/** A site of the organisation with its tide columns, or undefined (never another organisation's). */
export async function findTideSite(db: Executor, organisationId: string, siteId: string): Promise<TideSite | undefined> {
  return withSiteColumns(db).selectFrom('sites').select(SITE_COLUMNS).where('organisation_id', '=', organisationId).where('id', '=', siteId).executeTakeFirst();
}

/** Locks the site row until the transaction ends, so versions are numbered one at a time. */
export async function lockTideSite(trx: Transaction<Database>, organisationId: string, siteId: string): Promise<TideSite | undefined> {
  return withSiteColumns(trx)
    .selectFrom('sites')
    .select(SITE_COLUMNS)
    .where('organisation_id', '=', organisationId)
    .where('id', '=', siteId)
    .forUpdate()
    .executeTakeFirst();
}

export async function nextVersion(trx: Executor, siteId: string): Promise<number> {
  const row = await trx
    .selectFrom('constituent_sets')
    .select((eb) => eb.fn.max('version').as('latest'))
    .where('site_id', '=', siteId)
    .executeTakeFirst();
  return Number(row?.latest ?? 0) + 1;
}

export async function insertSet(trx: Executor, set: NewConstituentSet): Promise<ConstituentSetRow> {
  return trx.insertInto('constituent_sets').values(set).returningAll().executeTakeFirstOrThrow();
}

export async function setActiveSet(trx: Executor, siteId: string, setId: string): Promise<void> {
  await withSiteColumns(trx).updateTable('sites').set({ active_constituent_set_id: setId, updated_at: new Date() }).where('id', '=', siteId).execute();
}

export async function setChosenStation(trx: Executor, siteId: string, stationId: string, stationName: string): Promise<void> {
  await withSiteColumns(trx).updateTable('sites').set({ tide_station_id: stationId, tide_station_name: stationName }).where('id', '=', siteId).execute();
}

export type SetWithCreator = ConstituentSetRow & { creator_name: string | null; creator_email: string | null };

function setsQuery(db: Executor) {
  return db
    .selectFrom('constituent_sets as s')
    .leftJoin('users as u', 'u.id', 's.created_by')
    .selectAll('s')
    .select(['u.display_name as creator_name', 'u.email as creator_email']);
}

export async function listSets(db: Executor, siteId: string): Promise<SetWithCreator[]> {
  return setsQuery(db).where('s.site_id', '=', siteId).orderBy('s.version', 'desc').execute();
}

export async function findSet(db: Executor, siteId: string, setId: string): Promise<SetWithCreator | undefined> {
  return setsQuery(db).where('s.site_id', '=', siteId).where('s.id', '=', setId).executeTakeFirst();
}

/** The latest set of the site from the feed for this station, if any. */
export async function latestFeedSet(db: Executor, siteId: string, stationId: string): Promise<SetWithCreator | undefined> {
  return setsQuery(db)
    .where('s.site_id', '=', siteId)
    .where('s.source', '=', 'feed')
    .where('s.station_id', '=', stationId)
    .orderBy('s.version', 'desc')
    .limit(1)
    .executeTakeFirst();
}

/** The site's active set, or undefined; no organisation check (for jobs that already hold the site id). */
export async function findActiveSet(db: Executor, siteId: string): Promise<SetWithCreator | undefined> {
  const site = await withSiteColumns(db).selectFrom('sites').select('active_constituent_set_id').where('id', '=', siteId).executeTakeFirst();
  if (!site?.active_constituent_set_id) return undefined;
  return findSet(db, siteId, site.active_constituent_set_id);
}

export function toSetDto(row: SetWithCreator, activeSetId: string | null): ConstituentSet {
  const current: CurrentPart | null = row.current_constituents ? { axisDeg: row.current_axis_deg, constituents: row.current_constituents } : null;
  const level: LevelPart | null = row.level_constituents ? { datumM: row.level_datum_m ?? 0, constituents: row.level_constituents } : null;
  return {
    id: row.id,
    siteId: row.site_id,
    version: row.version,
    source: row.source,
    kind: row.kind,
    stationId: row.station_id,
    stationName: row.station_name,
    label: row.label,
    notes: row.notes,
    current,
    level,
    fit: (row.fit as SetFit | null) ?? null,
    basedOnSetId: row.based_on_set_id,
    createdAt: row.created_at.toISOString(),
    createdBy: row.created_by && row.creator_name !== null ? { id: row.created_by, displayName: row.creator_name, email: row.creator_email ?? '' } : null,
    active: row.id === activeSetId,
  };
}

export interface RefreshRecord {
  organisationId: string;
  siteId: string;
  stationId: string | null;
  attempt: number;
  ok: boolean;
  errorCode?: string | null;
  errorMessage?: string | null;
  setId?: string | null;
  actorUserId: string | null;
}

export async function insertRefresh(db: Executor, r: RefreshRecord): Promise<void> {
  await db
    .insertInto('tide_feed_refreshes')
    .values({
      organisation_id: r.organisationId,
      site_id: r.siteId,
      station_id: r.stationId,
      attempt: r.attempt,
      ok: r.ok,
      error_code: r.errorCode ?? null,
      error_message: r.errorMessage ?? null,
      constituent_set_id: r.setId ?? null,
      actor_user_id: r.actorUserId,
    })
    .execute();
}

export async function listRefreshes(db: Executor, siteId: string, limit = 50) {
  const rows = await db.selectFrom('tide_feed_refreshes').selectAll().where('site_id', '=', siteId).orderBy('attempted_at', 'desc').orderBy('id', 'desc').limit(limit).execute();
  return rows.map((r) => ({
    id: Number(r.id),
    stationId: r.station_id,
    attempt: r.attempt,
    attemptedAt: r.attempted_at.toISOString(),
    ok: r.ok,
    errorCode: r.error_code,
    errorMessage: r.error_message,
    setId: r.constituent_set_id,
  }));
}
