import { sql, type Transaction } from 'kysely';
import { organismParamsSchema, type OrganismParams, type Profile, type ProfileDetail, type ProfileVersion } from '../../shared/schemas/organism.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';

type Executor = Db | Transaction<Database>;

interface VersionRow {
  id: string;
  profile_id: string;
  version: number;
  params: unknown;
  note: string;
  created_at: Date;
  first_used_at: Date | null;
  created_by_email: string | null;
}

export function toVersionDto(row: VersionRow): ProfileVersion {
  return {
    id: row.id,
    profileId: row.profile_id,
    version: row.version,
    params: organismParamsSchema.parse(row.params),
    note: row.note,
    createdAt: row.created_at.toISOString(),
    createdBy: row.created_by_email,
    used: row.first_used_at !== null,
  };
}

const versionColumns = ['v.id', 'v.profile_id', 'v.version', 'v.params', 'v.note', 'v.created_at', 'v.first_used_at', 'u.email as created_by_email'] as const;

/** The organisation's profiles, each with its latest version. */
export async function listProfiles(db: Executor, organisationId: string): Promise<Profile[]> {
  const rows = await db
    .selectFrom('organism_profiles as p')
    .innerJoin('organism_profile_versions as v', 'v.profile_id', 'p.id')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['p.id as pid', 'p.name', 'p.taxon', ...versionColumns])
    .where('p.organisation_id', '=', organisationId)
    .where('p.archived_at', 'is', null)
    .where(({ eb, selectFrom }) =>
      eb('v.version', '=', selectFrom('organism_profile_versions as v2').select(({ fn }) => fn.max('v2.version').as('m')).whereRef('v2.profile_id', '=', 'p.id')),
    )
    .orderBy('p.name')
    .execute();
  return rows.map((r) => ({ id: r.pid, name: r.name, taxon: r.taxon, latest: toVersionDto(r) }));
}

/** One profile of the organisation (archived ones too) with every version, newest first. */
export async function findProfileDetail(db: Executor, organisationId: string, profileId: string): Promise<ProfileDetail | undefined> {
  const profile = await db
    .selectFrom('organism_profiles')
    .select(['id', 'name', 'taxon', 'archived_at'])
    .where('organisation_id', '=', organisationId)
    .where('id', '=', profileId)
    .executeTakeFirst();
  if (!profile) return undefined;
  const rows = await db
    .selectFrom('organism_profile_versions as v')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select([...versionColumns])
    .where('v.profile_id', '=', profileId)
    .orderBy('v.version', 'desc')
    .execute();
  const versions = rows.map(toVersionDto);
  return { id: profile.id, name: profile.name, taxon: profile.taxon, archivedAt: profile.archived_at?.toISOString() ?? null, latest: versions[0]!, versions };
}

export async function insertProfile(trx: Executor, input: { organisationId: string; name: string; taxon: string; params: OrganismParams; note: string; createdBy: string | null }) {
  const profile = await trx.insertInto('organism_profiles').values({ organisation_id: input.organisationId, name: input.name, taxon: input.taxon }).returning('id').executeTakeFirstOrThrow();
  const version = await trx
    .insertInto('organism_profile_versions')
    .values({ profile_id: profile.id, organisation_id: input.organisationId, version: 1, params: JSON.stringify(input.params), note: input.note, created_by: input.createdBy })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { profileId: profile.id, versionId: version.id };
}

/**
 * Locks the profile row for the rest of the transaction (so two edits of one profile run one after
 * the other) and returns it with its latest version.
 */
export async function lockProfileForEdit(trx: Transaction<Database>, organisationId: string, profileId: string) {
  const profile = await trx
    .selectFrom('organism_profiles')
    .select(['id', 'name', 'taxon', 'archived_at'])
    .where('organisation_id', '=', organisationId)
    .where('id', '=', profileId)
    .forUpdate()
    .executeTakeFirst();
  if (!profile) return undefined;
  const latest = await trx
    .selectFrom('organism_profile_versions')
    .select(['id', 'version', 'params', 'note', 'first_used_at'])
    .where('profile_id', '=', profileId)
    .orderBy('version', 'desc')
    .limit(1)
    .forUpdate()
    .executeTakeFirstOrThrow();
  return { profile, latest };
}

/** Whether a forecast run is queued or running with this version: it must not change under the run. */
export async function versionHasPendingRun(trx: Executor, versionId: string): Promise<boolean> {
  const row = await trx
    .selectFrom('forecast_runs')
    .select(sql<number>`1`.as('one'))
    .where('profile_version_id', '=', versionId)
    .where('status', 'in', ['queued', 'running'])
    .limit(1)
    .executeTakeFirst();
  return row !== undefined;
}

export async function updateProfileFields(trx: Executor, profileId: string, fields: { name?: string; taxon?: string }): Promise<void> {
  if (fields.name === undefined && fields.taxon === undefined) return;
  await trx.updateTable('organism_profiles').set(fields).where('id', '=', profileId).execute();
}

export async function updateVersionInPlace(trx: Executor, versionId: string, fields: { params: OrganismParams; note: string }): Promise<void> {
  await trx.updateTable('organism_profile_versions').set({ params: JSON.stringify(fields.params), note: fields.note }).where('id', '=', versionId).where('first_used_at', 'is', null).execute();
}

export async function insertVersion(trx: Executor, input: { organisationId: string; profileId: string; version: number; params: OrganismParams; note: string; createdBy: string | null }) {
  return trx
    .insertInto('organism_profile_versions')
    .values({ profile_id: input.profileId, organisation_id: input.organisationId, version: input.version, params: JSON.stringify(input.params), note: input.note, created_by: input.createdBy })
    .returning(['id', 'version'])
    .executeTakeFirstOrThrow();
}

export async function archiveProfile(trx: Executor, profileId: string): Promise<void> {
  await trx.updateTable('organism_profiles').set({ archived_at: new Date() }).where('id', '=', profileId).where('archived_at', 'is', null).execute();
}

/** A profile version with its profile's name and taxon, scoped to the organisation. */
export async function findVersion(db: Executor, organisationId: string, versionId: string) {
  return db
    .selectFrom('organism_profile_versions as v')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .leftJoin('users as u', 'u.id', 'v.created_by')
    .select(['p.name', 'p.taxon', ...versionColumns])
    .where('v.organisation_id', '=', organisationId)
    .where('v.id', '=', versionId)
    .executeTakeFirst();
}

/** The latest version of each profile the site watches. */
export async function watchedVersions(db: Executor, siteId: string) {
  return db
    .selectFrom('site_organisms as so')
    .innerJoin('organism_profiles as p', 'p.id', 'so.profile_id')
    .innerJoin('organism_profile_versions as v', 'v.profile_id', 'p.id')
    .select(['v.id', 'p.name'])
    .where('so.site_id', '=', siteId)
    .where('p.archived_at', 'is', null)
    .where(({ eb, selectFrom }) =>
      eb('v.version', '=', selectFrom('organism_profile_versions as v2').select(({ fn }) => fn.max('v2.version').as('m')).whereRef('v2.profile_id', '=', 'p.id')),
    )
    .orderBy('p.name')
    .execute();
}

export async function markVersionUsed(db: Executor, versionId: string): Promise<void> {
  await db.updateTable('organism_profile_versions').set({ first_used_at: new Date() }).where('id', '=', versionId).where('first_used_at', 'is', null).execute();
}
