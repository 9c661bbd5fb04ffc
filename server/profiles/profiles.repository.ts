import type { Transaction } from 'kysely';
import { organismParamsSchema, type OrganismParams, type Profile, type ProfileVersion } from '../../shared/schemas/organism.schema.ts';
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

export async function insertProfile(trx: Executor, input: { organisationId: string; name: string; taxon: string; params: OrganismParams; note: string; createdBy: string | null }) {
  const profile = await trx.insertInto('organism_profiles').values({ organisation_id: input.organisationId, name: input.name, taxon: input.taxon }).returning('id').executeTakeFirstOrThrow();
  const version = await trx
    .insertInto('organism_profile_versions')
    .values({ profile_id: profile.id, organisation_id: input.organisationId, version: 1, params: JSON.stringify(input.params), note: input.note, created_by: input.createdBy })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { profileId: profile.id, versionId: version.id };
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
