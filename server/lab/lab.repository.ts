import { sql, type Transaction } from 'kysely';
import type { LabResult } from '../../shared/schemas/lab.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';
import type { NewLabResult } from '../db/tables/lab.ts';

type Executor = Db | Transaction<Database>;

export async function organisationSites(db: Executor, organisationId: string) {
  return db.selectFrom('sites').select(['id', 'name', 'latitude_deg', 'longitude_deg', 'time_zone', 'archived_at']).where('organisation_id', '=', organisationId).orderBy('name').execute();
}

/** Sample id + taxon pairs (taxon lower-cased) already stored for the organisation, of those asked. */
export async function storedSampleTaxa(db: Executor, organisationId: string, sampleIds: string[]): Promise<Map<string, string | null>> {
  const found = new Map<string, string | null>();
  if (sampleIds.length === 0) return found;
  const rows = await db
    .selectFrom('lab_results as r')
    .innerJoin('lab_uploads as u', 'u.id', 'r.upload_id')
    .select(['r.sample_id', 'r.taxon', 'u.file_name'])
    .where('r.organisation_id', '=', organisationId)
    .where('r.sample_id', 'in', [...new Set(sampleIds)])
    .execute();
  for (const r of rows) found.set(`${r.sample_id}\u0000${r.taxon.toLowerCase()}`, r.file_name);
  return found;
}

export async function insertUpload(trx: Executor, values: { organisationId: string; source: 'upload' | 'manual'; fileName: string | null; rowCount: number; createdBy: string | null }) {
  return trx
    .insertInto('lab_uploads')
    .values({ organisation_id: values.organisationId, source: values.source, file_name: values.fileName, row_count: values.rowCount, created_by: values.createdBy })
    .returning('id')
    .executeTakeFirstOrThrow();
}

export async function insertResults(trx: Executor, rows: NewLabResult[]): Promise<string[]> {
  const ids: string[] = [];
  for (let i = 0; i < rows.length; i += 500) {
    const inserted = await trx.insertInto('lab_results').values(rows.slice(i, i + 500)).returning('id').execute();
    ids.push(...inserted.map((r) => r.id));
  }
  return ids;
}

const resultColumns = [
  'r.id',
  'r.site_id',
  's.name as site_name',
  's.latitude_deg',
  's.longitude_deg',
  'r.sample_id',
  'r.sampled_at',
  'r.depth_top_m',
  'r.depth_bottom_m',
  'r.method',
  'r.taxon',
  'r.cells_per_l',
  'r.detection_limit',
  'r.analyst',
  'r.lab',
  'r.upload_id',
  'u.file_name',
  'r.created_at',
  'c.email as created_by_email',
] as const;

export async function listResults(db: Executor, organisationId: string, filters: { siteId?: string; taxa?: string[]; ids?: string[] } = {}) {
  let query = db
    .selectFrom('lab_results as r')
    .innerJoin('sites as s', 's.id', 'r.site_id')
    .innerJoin('lab_uploads as u', 'u.id', 'r.upload_id')
    .leftJoin('users as c', 'c.id', 'r.created_by')
    .select(resultColumns)
    .where('r.organisation_id', '=', organisationId);
  if (filters.siteId) query = query.where('r.site_id', '=', filters.siteId);
  if (filters.taxa) {
    if (filters.taxa.length === 0) return [];
    const lowered = filters.taxa.map((t) => t.trim().toLowerCase());
    query = query.where(sql<string>`lower(r.taxon)`, 'in', lowered);
  }
  if (filters.ids) query = query.where('r.id', 'in', filters.ids);
  return query.orderBy('r.sampled_at', 'desc').orderBy('r.sample_id').orderBy('r.taxon').execute();
}

export type ResultRow = Awaited<ReturnType<typeof listResults>>[number];

export function toResultDto(r: ResultRow): LabResult {
  return {
    id: r.id,
    siteId: r.site_id,
    siteName: r.site_name,
    sampleId: r.sample_id,
    sampledAt: r.sampled_at.toISOString(),
    depthTopM: r.depth_top_m,
    depthBottomM: r.depth_bottom_m,
    method: r.method,
    taxon: r.taxon,
    cellsPerL: r.cells_per_l,
    detectionLimit: r.detection_limit,
    belowDetection: r.cells_per_l < r.detection_limit,
    analyst: r.analyst,
    lab: r.lab,
    uploadId: r.upload_id,
    fileName: r.file_name,
    createdAt: r.created_at.toISOString(),
    createdBy: r.created_by_email,
  };
}

/** Every taxon seen in results or mapped, with its profile and number of results. */
export async function listTaxa(db: Executor, organisationId: string) {
  const counts = await db
    .selectFrom('lab_results')
    .select(['taxon', (eb) => eb.fn.countAll<string>().as('n')])
    .where('organisation_id', '=', organisationId)
    .groupBy('taxon')
    .execute();
  const mappings = await db.selectFrom('taxon_mappings').select(['taxon', 'profile_id']).where('organisation_id', '=', organisationId).execute();
  const byTaxon = new Map<string, { taxon: string; profileId: string | null; resultCount: number }>();
  for (const c of counts) byTaxon.set(c.taxon, { taxon: c.taxon, profileId: null, resultCount: Number(c.n) });
  for (const m of mappings) byTaxon.set(m.taxon, { taxon: m.taxon, profileId: m.profile_id, resultCount: byTaxon.get(m.taxon)?.resultCount ?? 0 });
  return [...byTaxon.values()].sort((a, b) => a.taxon.localeCompare(b.taxon));
}

export async function mappedTaxa(db: Executor, organisationId: string, profileId: string): Promise<string[]> {
  const rows = await db.selectFrom('taxon_mappings').select('taxon').where('organisation_id', '=', organisationId).where('profile_id', '=', profileId).orderBy('taxon').execute();
  return rows.map((r) => r.taxon);
}

export async function findProfile(db: Executor, organisationId: string, profileId: string) {
  return db.selectFrom('organism_profiles').select(['id', 'name', 'taxon']).where('organisation_id', '=', organisationId).where('id', '=', profileId).executeTakeFirst();
}

/** Forecasts of a site for any version of the profile (no grids), newest made first. */
export async function forecastsOf(db: Executor, organisationId: string, siteId: string, profileId: string) {
  return db
    .selectFrom('forecasts as f')
    .innerJoin('organism_profile_versions as v', 'v.id', 'f.profile_version_id')
    .select(['f.id', 'f.profile_version_id', 'v.version', 'f.forecast_start', 'f.horizon_days', 'f.created_at'])
    .where('f.organisation_id', '=', organisationId)
    .where('f.site_id', '=', siteId)
    .where('v.profile_id', '=', profileId)
    .orderBy('f.created_at', 'desc')
    .orderBy('f.forecast_start', 'desc')
    .execute();
}

export async function forecastGridBytes(db: Executor, forecastId: string): Promise<Buffer | undefined> {
  return (await db.selectFrom('forecasts').select('grid').where('id', '=', forecastId).executeTakeFirst())?.grid;
}

// ---- Calibrations ----

export async function findCalibration(db: Executor, organisationId: string, calibrationId: string) {
  return db
    .selectFrom('calibrations as c')
    .innerJoin('sites as s', 's.id', 'c.site_id')
    .innerJoin('organism_profile_versions as v', 'v.id', 'c.profile_version_id')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .selectAll('c')
    .select(['s.name as site_name', 'p.id as profile_id', 'p.name as profile_name', 'v.version'])
    .where('c.organisation_id', '=', organisationId)
    .where('c.id', '=', calibrationId)
    .executeTakeFirst();
}

export async function listCalibrations(db: Executor, organisationId: string, limit = 50) {
  return db
    .selectFrom('calibrations as c')
    .innerJoin('sites as s', 's.id', 'c.site_id')
    .innerJoin('organism_profile_versions as v', 'v.id', 'c.profile_version_id')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .selectAll('c')
    .select(['s.name as site_name', 'p.id as profile_id', 'p.name as profile_name', 'v.version'])
    .where('c.organisation_id', '=', organisationId)
    .orderBy('c.created_at', 'desc')
    .limit(limit)
    .execute();
}

export type CalibrationView = NonNullable<Awaited<ReturnType<typeof findCalibration>>>;
