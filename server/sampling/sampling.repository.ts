import type { Transaction } from 'kysely';
import type { PlannedSample, SampleListQuery } from '../../shared/schemas/sampling.schema.ts';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';
import type { NewPlannedSample, PlannedSampleChanges, PlannedSampleRow } from '../db/tables/sampling.ts';

type Executor = Db | Transaction<Database>;

function joined(db: Executor) {
  return db
    .selectFrom('planned_samples as p')
    .innerJoin('sites as s', 's.id', 'p.site_id')
    .leftJoin('users as c', 'c.id', 'p.created_by')
    .leftJoin('users as t', 't.id', 'p.taken_by')
    .selectAll('p')
    .select(['s.name as site_name', 's.time_zone', 's.latitude_deg', 's.longitude_deg', 'c.display_name as created_by_name', 't.display_name as taken_by_name']);
}

type JoinedRow = Awaited<ReturnType<ReturnType<typeof joined>['executeTakeFirstOrThrow']>>;

/** The one place rows become DTOs. */
export function toSampleDto(row: JoinedRow): PlannedSample {
  return {
    id: row.id,
    siteId: row.site_id,
    siteName: row.site_name,
    timeZone: row.time_zone,
    plannedAt: row.planned_at.toISOString(),
    method: row.method,
    depthM: row.depth_m,
    topM: row.top_m,
    bottomM: row.bottom_m,
    reason: row.reason,
    forecastId: row.forecast_id,
    adviceKind: row.advice_kind,
    createdBy: row.created_by ? { id: row.created_by, displayName: row.created_by_name ?? '' } : null,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
    takenAt: row.taken_at ? row.taken_at.toISOString() : null,
    takenBy: row.taken_by ? { id: row.taken_by, displayName: row.taken_by_name ?? '' } : null,
    notes: row.notes,
  };
}

export interface SampleWithSite {
  dto: PlannedSample;
  latitudeDeg: number;
  longitudeDeg: number;
}

export async function listSamples(db: Executor, organisationId: string, query: SampleListQuery): Promise<SampleWithSite[]> {
  let q = joined(db).where('p.organisation_id', '=', organisationId);
  if (query.siteId) q = q.where('p.site_id', '=', query.siteId);
  if (query.from) q = q.where('p.planned_at', '>=', new Date(query.from));
  if (query.to) q = q.where('p.planned_at', '<', new Date(query.to));
  if (query.status === 'planned') q = q.where('p.taken_at', 'is', null);
  if (query.status === 'taken') q = q.where('p.taken_at', 'is not', null);
  const rows = await q.orderBy('p.planned_at').orderBy('p.id').limit(2000).execute();
  return rows.map((row) => ({ dto: toSampleDto(row), latitudeDeg: row.latitude_deg, longitudeDeg: row.longitude_deg }));
}

export async function findSample(db: Executor, organisationId: string, sampleId: string): Promise<PlannedSample | undefined> {
  const row = await joined(db).where('p.organisation_id', '=', organisationId).where('p.id', '=', sampleId).executeTakeFirst();
  return row ? toSampleDto(row) : undefined;
}

export async function findSampleRow(db: Executor, organisationId: string, sampleId: string): Promise<PlannedSampleRow | undefined> {
  return db.selectFrom('planned_samples').selectAll().where('organisation_id', '=', organisationId).where('id', '=', sampleId).forUpdate().executeTakeFirst();
}

export async function findSamplesByIds(db: Executor, organisationId: string, ids: string[]): Promise<PlannedSample[]> {
  if (ids.length === 0) return [];
  const rows = await joined(db).where('p.organisation_id', '=', organisationId).where('p.id', 'in', ids).orderBy('p.planned_at').execute();
  return rows.map(toSampleDto);
}

/** Inserts samples; advice items already planned (same site, kind and time) are skipped. Returns the new ids. */
export async function insertSamples(trx: Executor, rows: NewPlannedSample[]): Promise<string[]> {
  if (rows.length === 0) return [];
  const inserted = await trx.insertInto('planned_samples').values(rows).onConflict((oc) => oc.doNothing()).returning('id').execute();
  return inserted.map((r) => r.id);
}

export async function updateSample(trx: Executor, organisationId: string, sampleId: string, changes: PlannedSampleChanges): Promise<void> {
  await trx
    .updateTable('planned_samples')
    .set({ ...changes, updated_at: new Date() })
    .where('organisation_id', '=', organisationId)
    .where('id', '=', sampleId)
    .execute();
}

export async function deleteSample(trx: Executor, organisationId: string, sampleId: string): Promise<void> {
  await trx.deleteFrom('planned_samples').where('organisation_id', '=', organisationId).where('id', '=', sampleId).execute();
}
