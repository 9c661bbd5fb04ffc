import type PgBoss from 'pg-boss';
import type { Db } from '../db/connect.ts';
import { watchedVersions } from '../profiles/profiles.repository.ts';
import { enqueueRun } from './queue.ts';
import type { TideSource } from './tide-source.ts';

export interface PrepareDeps {
  db: Db;
  boss: PgBoss;
  tides: TideSource;
}

export interface PrepareRequest {
  organisationId: string;
  siteId: string;
  forecastStartMs: number;
  trigger: 'schedule' | 'manual';
  requestedBy?: string | null;
  /** Default: every profile the site watches. */
  profileVersionIds?: string[];
  /** Default: the site's setting. */
  horizonDays?: number;
}

/**
 * The first step of a site's forecast: refresh its tides (keeping the last good set when the feed
 * fails), then make one run per watched profile and queue it. A run's identity is the site, profile
 * version, constituent set and forecast start, so a retry or a second scheduler adds no run.
 * Returns the ids of the runs for this request (new or already there).
 */
export async function prepareSiteRuns(deps: PrepareDeps, request: PrepareRequest): Promise<string[]> {
  const { db } = deps;
  const site = await db
    .selectFrom('sites')
    .select(['id', 'forecast_horizon_days', 'archived_at'])
    .where('id', '=', request.siteId)
    .where('organisation_id', '=', request.organisationId)
    .executeTakeFirst();
  if (!site || site.archived_at) return [];
  const versions = request.profileVersionIds ?? (await watchedVersions(db, site.id)).map((v) => v.id);
  if (versions.length === 0) return [];

  const refreshed = await deps.tides.refresh(request.organisationId, site.id);
  const active = await deps.tides.active(site.id);
  const note = refreshed.note;
  const start = new Date(request.forecastStartMs);
  const ids: string[] = [];
  for (const versionId of versions) {
    const inserted = await db
      .insertInto('forecast_runs')
      .values({
        organisation_id: request.organisationId,
        site_id: site.id,
        profile_version_id: versionId,
        constituent_set_id: active?.id ?? null,
        forecast_start: start,
        horizon_days: request.horizonDays ?? site.forecast_horizon_days,
        trigger: request.trigger,
        requested_by: request.requestedBy ?? null,
        tide_note: note,
      })
      .onConflict((oc) => oc.doNothing())
      .returning('id')
      .executeTakeFirst();
    const id =
      inserted?.id ??
      (
        await db
          .selectFrom('forecast_runs')
          .select('id')
          .where('site_id', '=', site.id)
          .where('profile_version_id', '=', versionId)
          .where('forecast_start', '=', start)
          .where((eb) => (active ? eb('constituent_set_id', '=', active.id) : eb('constituent_set_id', 'is', null)))
          .executeTakeFirstOrThrow()
      ).id;
    if (inserted) await enqueueRun(deps.boss, id);
    ids.push(id);
  }
  return ids;
}
