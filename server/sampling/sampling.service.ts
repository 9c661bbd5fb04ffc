import { z } from 'zod';
import { dayAdviceSchema } from '../../shared/forecast/advice.ts';
import { DEFAULT_WINDOW_SETTINGS, parseWindowSettings } from '../../shared/forecast/window-settings.ts';
import {
  checkMergedSample,
  type ForecastSettings,
  type FromAdviceInput,
  type PlannedSample,
  type SampleInput,
  type SampleUpdate,
  type TakenInput,
} from '../../shared/schemas/sampling.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentUser } from '../http/request-context.ts';
import { findSite } from '../sites/sites.repository.ts';
import { samplesFromAdvice } from './from-advice.ts';
import * as repo from './sampling.repository.ts';

type SiteRow = NonNullable<Awaited<ReturnType<typeof findSite>>>;

async function siteOr404(db: Parameters<typeof findSite>[0], organisationId: string, siteId: string): Promise<SiteRow> {
  const site = await findSite(db, organisationId, siteId);
  if (!site) throw new AppError('not_found', 'No such site in this organisation.');
  return site;
}

function invalid(details: { path: string; message: string }[]): never {
  throw new AppError('validation_failed', `The sample has problems: ${details.map((d) => `${d.path}: ${d.message}`).join('; ')}. Correct them and send again.`, details);
}

/** Depths must lie in the water column of the site. */
function checkDepths(site: SiteRow, sample: Pick<SampleInput, 'depthM' | 'topM' | 'bottomM'>): void {
  const details: { path: string; message: string }[] = [];
  const limit = site.water_depth_m;
  for (const key of ['depthM', 'topM', 'bottomM'] as const) {
    const value = sample[key];
    if (value != null && value > limit) details.push({ path: key, message: `must not be deeper than the site's water depth (${limit} m)` });
  }
  if (details.length) invalid(details);
}

export async function createSample(db: Db, actor: CurrentUser, organisationId: string, siteId: string, input: SampleInput): Promise<PlannedSample> {
  return db.transaction().execute(async (trx) => {
    const site = await siteOr404(trx, organisationId, siteId);
    checkDepths(site, input);
    const [id] = await repo.insertSamples(trx, [
      {
        organisation_id: organisationId,
        site_id: siteId,
        planned_at: input.plannedAt,
        method: input.method,
        depth_m: input.depthM,
        top_m: input.topM,
        bottom_m: input.bottomM,
        reason: input.reason,
        created_by: actor.id,
      },
    ]);
    if (!id) throw new AppError('conflict', 'The sample could not be stored.');
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'sample.planned', subject: site.name, details: { sampleId: id, plannedAt: input.plannedAt, method: input.method } });
    return (await repo.findSample(trx, organisationId, id))!;
  });
}

export async function updateSample(db: Db, actor: CurrentUser, organisationId: string, sampleId: string, changes: SampleUpdate): Promise<PlannedSample> {
  return db.transaction().execute(async (trx) => {
    const row = await repo.findSampleRow(trx, organisationId, sampleId);
    if (!row) throw new AppError('not_found', 'No such planned sample in this organisation.');
    if (row.taken_at) throw new AppError('conflict', 'This sample has been taken already; its record is kept as it was taken.');
    const merged = {
      plannedAt: changes.plannedAt ?? row.planned_at.toISOString(),
      method: changes.method ?? row.method,
      depthM: changes.depthM !== undefined ? changes.depthM : row.depth_m,
      topM: changes.topM !== undefined ? changes.topM : row.top_m,
      bottomM: changes.bottomM !== undefined ? changes.bottomM : row.bottom_m,
      reason: changes.reason ?? row.reason,
    };
    // Changing the method drops the other method's depths unless they are given.
    if (changes.method === 'bottle' && changes.topM === undefined && changes.bottomM === undefined) Object.assign(merged, { topM: null, bottomM: null });
    if (changes.method === 'hose' && changes.depthM === undefined) merged.depthM = null;
    const checked = checkMergedSample(merged);
    if (!checked.success) invalid(checked.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })));
    const sample = checked.data;
    const site = await siteOr404(trx, organisationId, row.site_id);
    checkDepths(site, sample);
    await repo.updateSample(trx, organisationId, sampleId, {
      planned_at: sample.plannedAt,
      method: sample.method,
      depth_m: sample.depthM,
      top_m: sample.topM,
      bottom_m: sample.bottomM,
      reason: sample.reason,
    });
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'sample.changed', subject: site.name, details: { sampleId, fields: Object.keys(changes) } });
    return (await repo.findSample(trx, organisationId, sampleId))!;
  });
}

export async function deleteSample(db: Db, actor: CurrentUser, organisationId: string, sampleId: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const row = await repo.findSampleRow(trx, organisationId, sampleId);
    if (!row) throw new AppError('not_found', 'No such planned sample in this organisation.');
    if (row.taken_at) throw new AppError('conflict', 'This sample has been taken; its record is kept and cannot be deleted.');
    await repo.deleteSample(trx, organisationId, sampleId);
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'sample.deleted', subject: sampleId, details: { siteId: row.site_id, plannedAt: row.planned_at.toISOString() } });
  });
}

export async function markTaken(db: Db, actor: CurrentUser, organisationId: string, sampleId: string, input: TakenInput): Promise<PlannedSample> {
  return db.transaction().execute(async (trx) => {
    const row = await repo.findSampleRow(trx, organisationId, sampleId);
    if (!row) throw new AppError('not_found', 'No such planned sample in this organisation.');
    if (row.taken_at) throw new AppError('conflict', `This sample was marked taken already, at ${row.taken_at.toISOString()}.`);
    const takenAt = input.takenAt ? new Date(input.takenAt) : new Date();
    await repo.updateSample(trx, organisationId, sampleId, { taken_at: takenAt, taken_by: actor.id, notes: input.notes || null });
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'sample.taken', subject: sampleId, details: { siteId: row.site_id, takenAt: takenAt.toISOString() } });
    return (await repo.findSample(trx, organisationId, sampleId))!;
  });
}

/** Turns a forecast's daily advice into planned samples in one go; advice planned before is skipped. */
export async function addFromAdvice(db: Db, actor: CurrentUser, organisationId: string, siteId: string, input: FromAdviceInput): Promise<{ samples: PlannedSample[]; skipped: number }> {
  return db.transaction().execute(async (trx) => {
    const site = await siteOr404(trx, organisationId, siteId);
    const forecast = await trx
      .selectFrom('forecasts')
      .select(['id', 'advice'])
      .where('organisation_id', '=', organisationId)
      .where('site_id', '=', siteId)
      .where('id', '=', input.forecastId)
      .executeTakeFirst();
    if (!forecast) throw new AppError('validation_failed', 'forecastId: no forecast of this site has this id.', [{ path: 'forecastId', message: 'no forecast of this site has this id' }]);
    const days = z.array(dayAdviceSchema).parse(forecast.advice);
    if (input.dates) {
      const known = new Set(days.map((d) => d.date));
      const unknown = input.dates.filter((d) => !known.has(d));
      if (unknown.length) throw new AppError('validation_failed', `dates: the forecast has no advice for ${unknown.join(', ')}.`, [{ path: 'dates', message: `no advice for ${unknown.join(', ')}` }]);
    }
    const wanted = samplesFromAdvice(days, input.dates);
    const ids = await repo.insertSamples(
      trx,
      wanted.map((s) => ({
        organisation_id: organisationId,
        site_id: siteId,
        planned_at: new Date(s.plannedAtMs),
        method: s.method,
        depth_m: s.depthM,
        top_m: s.topM,
        bottom_m: s.bottomM,
        reason: s.reason,
        forecast_id: forecast.id,
        advice_kind: s.adviceKind,
        created_by: actor.id,
      })),
    );
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'sample.planned_from_advice', subject: site.name, details: { forecastId: forecast.id, added: ids.length, skipped: wanted.length - ids.length } });
    return { samples: await repo.findSamplesByIds(trx, organisationId, ids), skipped: wanted.length - ids.length };
  });
}

export async function getForecastSettings(db: Db, organisationId: string, siteId: string): Promise<ForecastSettings> {
  const site = await siteOr404(db, organisationId, siteId);
  const parsed = parseWindowSettings(site.window_settings);
  return {
    forecastLocalTime: site.forecast_local_time,
    forecastHorizonDays: site.forecast_horizon_days,
    // A stored value that no longer parses falls back to the defaults the forecasts use then.
    windowSettings: parsed.ok ? parsed.value : { ...DEFAULT_WINDOW_SETTINGS },
  };
}

export async function putForecastSettings(db: Db, actor: CurrentUser, organisationId: string, siteId: string, settings: ForecastSettings): Promise<ForecastSettings> {
  return db.transaction().execute(async (trx) => {
    const site = await siteOr404(trx, organisationId, siteId);
    await trx
      .updateTable('sites')
      .set({
        forecast_local_time: settings.forecastLocalTime,
        forecast_horizon_days: settings.forecastHorizonDays,
        window_settings: JSON.stringify(settings.windowSettings),
        updated_at: new Date(),
      })
      .where('organisation_id', '=', organisationId)
      .where('id', '=', siteId)
      .execute();
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'site.forecast_settings_changed', subject: site.name, details: { siteId, ...settings } });
    return settings;
  });
}
