import { gzipSync } from 'node:zlib';
import { adviseDays } from '../../shared/forecast/advice.ts';
import { buildForecastCase, ENGINE_VERSION } from '../../shared/forecast/case-builder.ts';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import { encodeGrid } from '../../shared/forecast/grid-codec.ts';
import { rangeMeanConcentration, type ForecastGrid } from '../../shared/forecast/grid.ts';
import { parseWindowSettings } from '../../shared/forecast/window-settings.ts';
import { findWindows } from '../../shared/forecast/windows.ts';
import { parseCase } from '../../shared/model/case-schema.ts';
import { advanceRun, createRun, finishRun, startRun } from '../../shared/model/run.ts';
import type { Db } from '../db/connect.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';
import { findVersion, markVersionUsed } from '../profiles/profiles.repository.ts';
import type { ActiveCurrentSet, TideSource } from './tide-source.ts';

export interface ForecastJobDeps {
  db: Db;
  tides: Pick<TideSource, 'active'>;
  /** Model resolution (defaults: 50 layers, 30 s steps). */
  resolution?: { layers: number; timeStepS: number };
  /** Called after a forecast is stored (alerts, mail). */
  onStored?: (forecastId: string) => Promise<void>;
  /** Told when onStored fails: the forecast stays stored and its run done (default: ignored). */
  onStoredFailed?: (forecastId: string, error: unknown) => void;
}

/** A failure that retrying cannot mend (bad inputs): the run is marked failed at once. */
export class PermanentRunError extends Error {}

const OUTPUTS_PER_SLICE = 48;

function gearMax(grid: ForecastGrid, top: number, bottom: number): number {
  let max = 0;
  for (let i = 0; i < grid.nt; i++) max = Math.max(max, rangeMeanConcentration(grid, i, top, bottom));
  return max;
}

async function constituentSet(db: Db, tides: Pick<TideSource, 'active'>, siteId: string, setId: string | null): Promise<ActiveCurrentSet> {
  if (!setId) throw new PermanentRunError('The site has no tidal constituents yet. Add them on the site\'s tides screen, then run again.');
  const active = await tides.active(siteId);
  if (active && active.id === setId) return active;
  // The run keeps the set it was made with, even if another set became active since.
  const row = await db.selectFrom('constituent_sets').selectAll().where('id', '=', setId).executeTakeFirst();
  if (!row || !row.current_constituents) throw new PermanentRunError('The constituent set of this run has no current constituents.');
  return { id: row.id, version: row.version, source: row.source, createdAt: row.created_at, constituents: row.current_constituents, axisDeg: row.current_axis_deg };
}

/**
 * One forecast run, as a queue job: builds the case from the site, the profile version and the
 * constituent set, runs the engine (reporting progress), finds windows and advice, and stores the
 * forecast and the run's completion in one transaction. Safe to retry: a finished run is left alone,
 * and nothing of an unfinished attempt is stored.
 */
export async function runForecastJob(deps: ForecastJobDeps, runId: string): Promise<'done' | 'already-done' | 'failed'> {
  const { db } = deps;
  const run = await db.selectFrom('forecast_runs').selectAll().where('id', '=', runId).executeTakeFirst();
  if (!run) return 'failed';
  if (run.status === 'done') return 'already-done';
  await db.updateTable('forecast_runs').set({ status: 'running', started_at: new Date(), attempts: run.attempts + 1, progress: 0, error: null }).where('id', '=', runId).execute();

  try {
    const site = await db.selectFrom('sites').selectAll().where('id', '=', run.site_id).executeTakeFirstOrThrow();
    const version = await findVersion(db, run.organisation_id, run.profile_version_id);
    if (!version) throw new PermanentRunError('The organism profile of this run no longer exists.');
    const params = organismParamsSchema.parse(version.params);
    const tides = await constituentSet(db, deps.tides, site.id, run.constituent_set_id);
    const startMs = run.forecast_start.getTime();

    const caseInput = buildForecastCase({
      site: { latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg, waterDepthM: site.water_depth_m, bedRoughnessM: site.bed_roughness_m },
      organism: { name: version.name, params },
      current: { constituents: tides.constituents, axisDeg: tides.axisDeg },
      startMs,
      horizonDays: run.horizon_days,
      layers: deps.resolution?.layers,
      timeStepS: deps.resolution?.timeStepS,
    });
    const parsed = parseCase(caseInput);
    if (!parsed.ok) throw new PermanentRunError(`The forecast case is not valid: ${parsed.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);

    const model = createRun(parsed.value);
    const cursor = startRun(model);
    let lastReported = 0;
    while (!advanceRun(model, cursor, OUTPUTS_PER_SLICE)) {
      const fraction = (cursor.stored - 1) / (model.result.timeS.length - 1);
      if (fraction - lastReported >= 0.1) {
        lastReported = fraction;
        await db.updateTable('forecast_runs').set({ progress: Math.round(fraction * 100) / 100 }).where('id', '=', runId).execute();
      }
      await new Promise((resolve) => setImmediate(resolve)); // let other work (HTTP, other jobs) run between slices
    }
    const result = finishRun(model, cursor);
    if (result.status !== 'ok') throw new Error(`The model stopped: ${result.status}.`);

    const organism = parsed.value.organisms[0]!;
    const grid = gridFromModelResult(result, {
      startMs,
      waterDepthM: site.water_depth_m,
      organismIndex: 0,
      schmidtNumber: organism.schmidt_number,
      backgroundDiffusivityM2S: organism.background_diffusivity_m2_s,
    });
    const settings = parseWindowSettings(site.window_settings ?? {});
    if (!settings.ok) throw new PermanentRunError(`The site's window settings are not valid: ${settings.issues.map((i) => i.message).join('; ')}`);
    const windows = findWindows(grid, settings.value);
    const advice = adviseDays({
      grid,
      windows,
      site: { timeZone: site.time_zone, gearTopM: site.gear_top_m, gearBottomM: site.gear_bottom_m, waterDepthM: site.water_depth_m },
      triggerCellsPerL: params.triggerCellsPerL,
      settings: settings.value,
    });
    const inputs = {
      site: { name: site.name, waterDepthM: site.water_depth_m, gearTopM: site.gear_top_m, gearBottomM: site.gear_bottom_m, timeZone: site.time_zone, bedRoughnessM: site.bed_roughness_m, latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg },
      profile: { name: version.name, taxon: version.taxon, version: version.version, triggerCellsPerL: params.triggerCellsPerL, params },
      tides: { setId: tides.id, version: tides.version, source: tides.source, madeAt: tides.createdAt.toISOString(), note: run.tide_note },
      engineVersion: ENGINE_VERSION,
      layers: parsed.value.layers,
      timeStepS: parsed.value.time_step_s,
    };

    const forecastId = await db.transaction().execute(async (trx) => {
      const stored = await trx
        .insertInto('forecasts')
        .values({
          run_id: runId,
          organisation_id: run.organisation_id,
          site_id: site.id,
          profile_version_id: run.profile_version_id,
          constituent_set_id: tides.id,
          forecast_start: run.forecast_start,
          horizon_days: run.horizon_days,
          engine_version: ENGINE_VERSION,
          inputs: JSON.stringify(inputs),
          model_case: JSON.stringify(caseInput),
          grid: gzipSync(encodeGrid(grid), { level: 1 }),
          windows: JSON.stringify(windows),
          advice: JSON.stringify(advice),
          gear_max_cells_per_l: gearMax(grid, site.gear_top_m, site.gear_bottom_m),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await markVersionUsed(trx, run.profile_version_id);
      await trx.updateTable('forecast_runs').set({ status: 'done', progress: 1, finished_at: new Date() }).where('id', '=', runId).execute();
      return stored.id;
    });
    // The forecast is stored: what follows (alerts, mail) must not make the run look unfinished.
    await deps.onStored?.(forecastId).catch((error: unknown) => deps.onStoredFailed?.(forecastId, error));
    return 'done';
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const permanent = error instanceof PermanentRunError;
    await db
      .updateTable('forecast_runs')
      .set({ status: permanent ? 'failed' : 'queued', error: message, finished_at: permanent ? new Date() : null })
      .where('id', '=', runId)
      .execute();
    if (permanent) return 'failed';
    throw error; // the queue retries with backoff
  }
}
