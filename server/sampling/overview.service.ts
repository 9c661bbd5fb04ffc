import { DateTime } from 'luxon';
import type { ForecastWindowDto } from '../../shared/schemas/forecast.schema.ts';
import type { Overview, OverviewSite } from '../../shared/schemas/sampling.schema.ts';
import { forecastAccess } from '../billing/subscription-gate.ts';
import type { Db } from '../db/connect.ts';

/** Today and tomorrow in the site's zone (UTC ms). */
function twoDays(nowMs: number, zone: string): { startMs: number; endMs: number } {
  const today = DateTime.fromMillis(nowMs, { zone }).startOf('day');
  return { startMs: today.toMillis(), endMs: today.plus({ days: 2 }).startOf('day').toMillis() };
}

const nextOf = (windows: ForecastWindowDto[], kind: ForecastWindowDto['kind'], nowMs: number) =>
  windows.filter((w) => w.kind === kind && w.endMs > nowMs).sort((a, b) => a.startMs - b.startMs)[0] ?? null;

/**
 * The morning view of every active site: the newest forecast of each watched organism, its windows of
 * today and tomorrow (site-local), the next slack and slump, open alerts and today's planned samples.
 * Forecast content is left out when the subscription does not unlock forecasts.
 */
export async function overview(db: Db, organisationId: string, nowMs = Date.now()): Promise<Overview> {
  const unlocked = (await forecastAccess(db, organisationId)).unlocked;
  // The newest forecast of each watched organism at each site, found on the small columns first.
  const newest = db
    .selectFrom('forecasts as f')
    .innerJoin('organism_profile_versions as v', 'v.id', 'f.profile_version_id')
    .innerJoin('site_organisms as so', (join) => join.onRef('so.site_id', '=', 'f.site_id').onRef('so.profile_id', '=', 'v.profile_id'))
    .distinctOn(['f.site_id', 'v.profile_id'])
    .select('f.id')
    .where('f.organisation_id', '=', organisationId)
    .orderBy('f.site_id')
    .orderBy('v.profile_id')
    .orderBy('f.forecast_start', 'desc')
    .orderBy('f.created_at', 'desc');
  const [sites, forecasts, alerts, planned] = await Promise.all([
    db
      .selectFrom('sites')
      .select(['id', 'name', 'time_zone'])
      .where('organisation_id', '=', organisationId)
      .where('archived_at', 'is', null)
      .orderBy('name')
      .execute(),
    unlocked
      ? db
          .selectFrom('forecasts as f')
          .innerJoin('organism_profile_versions as v', 'v.id', 'f.profile_version_id')
          .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
          .select(['f.id', 'f.site_id', 'p.id as profile_id', 'p.name as profile_name', 'f.forecast_start', 'f.created_at', 'f.horizon_days', 'f.windows'])
          .where('f.id', 'in', newest)
          .execute()
      : Promise.resolve([]),
    db
      .selectFrom('alerts')
      .select(['id', 'site_id', 'kind', 'message', 'created_at'])
      .where('organisation_id', '=', organisationId)
      .where('acknowledged_at', 'is', null)
      .orderBy('created_at', 'desc')
      .limit(200)
      .execute(),
    db
      .selectFrom('planned_samples')
      .select(['site_id', 'planned_at'])
      .where('organisation_id', '=', organisationId)
      .where('taken_at', 'is', null)
      .where('planned_at', '>=', new Date(nowMs - 2 * 86_400_000))
      .where('planned_at', '<', new Date(nowMs + 2 * 86_400_000))
      .execute(),
  ]);

  const out: OverviewSite[] = sites.map((site) => {
    const span = twoDays(nowMs, site.time_zone);
    const todayEnd = DateTime.fromMillis(span.startMs, { zone: site.time_zone }).plus({ days: 1 }).toMillis();
    return {
      id: site.id,
      name: site.name,
      timeZone: site.time_zone,
      todayStart: new Date(span.startMs).toISOString(),
      tomorrowEnd: new Date(span.endMs).toISOString(),
      forecasts: forecasts
        .filter((f) => f.site_id === site.id)
        .sort((a, b) => a.profile_name.localeCompare(b.profile_name))
        .map((f) => {
          const windows = f.windows as ForecastWindowDto[];
          return {
            profileId: f.profile_id,
            profileName: f.profile_name,
            forecastId: f.id,
            forecastStart: f.forecast_start.toISOString(),
            createdAt: f.created_at.toISOString(),
            horizonDays: f.horizon_days,
            windows: windows.filter((w) => w.endMs > span.startMs && w.startMs < span.endMs),
            nextSlack: nextOf(windows, 'slack', nowMs),
            nextSlump: nextOf(windows, 'slump', nowMs),
          };
        }),
      openAlerts: alerts
        .filter((a) => a.site_id === site.id)
        .slice(0, 5)
        .map((a) => ({ id: a.id, kind: a.kind, message: a.message, createdAt: a.created_at.toISOString() })),
      plannedToday: planned.filter((p) => p.site_id === site.id && p.planned_at.getTime() >= span.startMs && p.planned_at.getTime() < todayEnd).length,
    };
  });
  return { forecastsUnlocked: unlocked, now: new Date(nowMs).toISOString(), sites: out };
}
