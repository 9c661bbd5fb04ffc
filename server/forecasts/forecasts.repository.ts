import type { Forecast, ForecastRun } from '../../shared/schemas/forecast.schema.ts';
import type { Db } from '../db/connect.ts';

const FORECAST_COLUMNS = ['f.id', 'f.site_id', 'f.profile_version_id', 'f.forecast_start', 'f.horizon_days', 'f.created_at', 'f.inputs', 'f.windows', 'f.advice', 'r.tide_note'] as const;

export async function findForecast(db: Db, organisationId: string, forecastId: string) {
  return db
    .selectFrom('forecasts as f')
    .innerJoin('forecast_runs as r', 'r.id', 'f.run_id')
    .select(FORECAST_COLUMNS)
    .where('f.organisation_id', '=', organisationId)
    .where('f.id', '=', forecastId)
    .executeTakeFirst();
}

/** The newest forecast of the site for any version of the profile. */
export async function latestForecast(db: Db, organisationId: string, siteId: string, profileId: string) {
  return db
    .selectFrom('forecasts as f')
    .innerJoin('forecast_runs as r', 'r.id', 'f.run_id')
    .innerJoin('organism_profile_versions as v', 'v.id', 'f.profile_version_id')
    .select(FORECAST_COLUMNS)
    .where('f.organisation_id', '=', organisationId)
    .where('f.site_id', '=', siteId)
    .where('v.profile_id', '=', profileId)
    .orderBy('f.forecast_start', 'desc')
    .orderBy('f.created_at', 'desc')
    .limit(1)
    .executeTakeFirst();
}

export async function forecastExists(db: Db, organisationId: string, forecastId: string): Promise<boolean> {
  const row = await db.selectFrom('forecasts').select('id').where('organisation_id', '=', organisationId).where('id', '=', forecastId).executeTakeFirst();
  return row !== undefined;
}

export async function forecastGrid(db: Db, organisationId: string, forecastId: string): Promise<Buffer | undefined> {
  const row = await db.selectFrom('forecasts').select('grid').where('organisation_id', '=', organisationId).where('id', '=', forecastId).executeTakeFirst();
  return row?.grid;
}

export function toForecastDto(row: NonNullable<Awaited<ReturnType<typeof findForecast>>>, orgId: string): Forecast {
  return {
    id: row.id,
    siteId: row.site_id,
    profileVersionId: row.profile_version_id,
    forecastStart: row.forecast_start.toISOString(),
    horizonDays: row.horizon_days,
    createdAt: row.created_at.toISOString(),
    inputs: row.inputs as Forecast['inputs'],
    windows: row.windows as Forecast['windows'],
    advice: row.advice as Forecast['advice'],
    tideNote: row.tide_note,
    gridUrl: `/api/orgs/${orgId}/forecasts/${row.id}/grid`,
  };
}

export async function listRuns(db: Db, organisationId: string, siteId: string, limit = 100): Promise<ForecastRun[]> {
  const rows = await db
    .selectFrom('forecast_runs as r')
    .innerJoin('organism_profile_versions as v', 'v.id', 'r.profile_version_id')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .leftJoin('forecasts as f', 'f.run_id', 'r.id')
    .select(['r.id', 'r.site_id', 'r.profile_version_id', 'p.name', 'r.forecast_start', 'r.trigger', 'r.status', 'r.progress', 'r.attempts', 'r.error', 'r.created_at', 'r.finished_at', 'f.id as forecast_id'])
    .where('r.organisation_id', '=', organisationId)
    .where('r.site_id', '=', siteId)
    .orderBy('r.created_at', 'desc')
    .limit(limit)
    .execute();
  return rows.map((r) => ({
    id: r.id,
    siteId: r.site_id,
    profileVersionId: r.profile_version_id,
    profileName: r.name,
    forecastStart: r.forecast_start.toISOString(),
    trigger: r.trigger,
    status: r.status,
    progress: r.progress,
    attempts: r.attempts,
    error: r.error,
    createdAt: r.created_at.toISOString(),
    finishedAt: r.finished_at ? r.finished_at.toISOString() : null,
    forecastId: r.forecast_id,
  }));
}
