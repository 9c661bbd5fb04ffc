/**
 * Calibration: fits a profile version's settling velocity (and, when asked, its loss rate, the part of
 * net growth a profile can carry) to a site's lab results by bounded least squares on log10 cells/L.
 * Each candidate re-runs the model over the sampled period (buildForecastCase + runCase) from the
 * site's active constituent set, starting from the profile's uniform initial concentration at 00:00 UTC
 * of the first sample's day; the run's grid is read at each sample as the comparison reads forecasts.
 */
import { buildForecastCase } from '../../shared/forecast/case-builder.ts';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import { fitBounded } from '../../shared/lab/fit.ts';
import { gridValueAtSample, type SampleWhereWhen } from '../../shared/lab/sample-value.ts';
import { skill, sumSquaredLogError, type SkillPair } from '../../shared/lab/skill.ts';
import { runCase } from '../../shared/model/run.ts';
import type { Calibration, CalibrationInput, CalibrationResult } from '../../shared/schemas/lab.schema.ts';
import { organismParamsSchema, type OrganismParams } from '../../shared/schemas/organism.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { getActiveConstituentSet } from '../tides/tides.service.ts';
import * as repo from './lab.repository.ts';

export interface CalibrationDeps {
  db: Db;
  /** Model resolution of the candidate runs (default 50 layers, 60 s steps, output every 15 min). */
  resolution?: { layers: number; timeStepS: number; outputIntervalS: number };
  /** Candidate bounds (default settling 0–50 m/d, loss rate 0–2 per day). */
  bounds?: { settlingVelocityMPerDay?: [number, number]; mortalityPerDay?: [number, number] };
  /** Coarse-scan points and golden-section steps per parameter (defaults 9 and 40). */
  search?: { scanPoints?: number; maxIterations?: number; sweeps?: number };
  /** Errors of background runs go here (default: stderr). */
  onError?: (error: unknown, calibrationId: string) => void;
}

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
export const MAX_PERIOD_DAYS = 14;
const DEFAULT_RESOLUTION = { layers: 50, timeStepS: 60, outputIntervalS: 900 };
const SETTLING_TOLERANCE = 0.02;
const LOSS_TOLERANCE = 0.002;

export function toCalibrationDto(row: repo.CalibrationView): Calibration {
  return {
    id: row.id,
    siteId: row.site_id,
    siteName: row.site_name,
    profileId: row.profile_id,
    profileName: row.profile_name,
    profileVersionId: row.profile_version_id,
    version: row.version,
    fitGrowth: row.fit_growth,
    status: row.status,
    progress: row.progress,
    error: row.error,
    result: (row.result as CalibrationResult | null) ?? null,
    acceptedVersionId: row.accepted_version_id,
    createdAt: row.created_at.toISOString(),
    finishedAt: row.finished_at ? row.finished_at.toISOString() : null,
  };
}

async function versionOf(db: Db, organisationId: string, versionId: string) {
  return db
    .selectFrom('organism_profile_versions as v')
    .innerJoin('organism_profiles as p', 'p.id', 'v.profile_id')
    .select(['v.id', 'v.profile_id', 'v.version', 'v.params', 'p.name', 'p.taxon'])
    .where('v.organisation_id', '=', organisationId)
    .where('v.id', '=', versionId)
    .executeTakeFirst();
}

/** The site's results of the taxa mapped to the profile, within the period, oldest first. */
async function samplesFor(db: Db, organisationId: string, siteId: string, profileId: string, from: Date | null, to: Date | null) {
  const taxa = await repo.mappedTaxa(db, organisationId, profileId);
  const rows = taxa.length ? await repo.listResults(db, organisationId, { siteId, taxa }) : [];
  return rows
    .filter((r) => (!from || r.sampled_at >= from) && (!to || r.sampled_at <= to))
    .sort((a, b) => a.sampled_at.getTime() - b.sampled_at.getTime());
}

/** Start of the run (00:00 UTC of the first sample's day) and its length in hours, covering the last sample. */
export function calibrationPeriod(firstMs: number, lastMs: number): { startMs: number; hours: number } {
  const startMs = Math.floor(firstMs / DAY_MS) * DAY_MS;
  return { startMs, hours: Math.max(1, Math.ceil((lastMs - startMs) / HOUR_MS) + 1) };
}

/** Checks the request and queues a calibration (status queued). */
export async function queueCalibration(db: Db, actor: { id: string }, organisationId: string, input: CalibrationInput): Promise<Calibration> {
  const version = await versionOf(db, organisationId, input.profileVersionId);
  if (!version) throw new AppError('validation_failed', 'profileVersionId: no such organism profile version in this organisation.', [{ path: 'profileVersionId', message: 'no such profile version' }]);
  const site = await db.selectFrom('sites').select(['id', 'name']).where('organisation_id', '=', organisationId).where('id', '=', input.siteId).executeTakeFirst();
  if (!site) throw new AppError('validation_failed', 'siteId: no such site in this organisation.', [{ path: 'siteId', message: 'no such site' }]);
  const set = await getActiveConstituentSet(db, site.id);
  if (!set?.current) throw new AppError('validation_failed', `${site.name} has no active current constituents; add them on the site's tides screen before calibrating.`);
  const from = input.from ? new Date(input.from) : null;
  const to = input.to ? new Date(input.to) : null;
  const samples = await samplesFor(db, organisationId, site.id, version.profile_id, from, to);
  if (samples.length < 3) {
    throw new AppError('validation_failed', `Calibration needs at least 3 lab results at ${site.name} of a taxon mapped to ${version.name} (found ${samples.length}). Map the lab's taxon to the profile under "Taxa", or upload more results.`);
  }
  const span = (samples[samples.length - 1]!.sampled_at.getTime() - samples[0]!.sampled_at.getTime()) / DAY_MS;
  if (span > MAX_PERIOD_DAYS) {
    throw new AppError('validation_failed', `The results span ${span.toFixed(1)} days; calibrate over at most ${MAX_PERIOD_DAYS} days at a time (give from and to).`);
  }
  const row = await db
    .insertInto('calibrations')
    .values({ organisation_id: organisationId, site_id: site.id, profile_version_id: version.id, fit_growth: input.fitGrowth, period_from: from, period_to: to, requested_by: actor.id })
    .returning('id')
    .executeTakeFirstOrThrow();
  return toCalibrationDto((await repo.findCalibration(db, organisationId, row.id))!);
}

/**
 * Runs a queued calibration to the end, storing progress as it goes. Returns the final status; a
 * calibration that is not queued (taken by another runner, or finished) is left alone.
 */
export async function runCalibration(deps: CalibrationDeps, calibrationId: string): Promise<'done' | 'failed' | 'skipped'> {
  const { db } = deps;
  const claimed = await db
    .updateTable('calibrations')
    .set({ status: 'running', started_at: new Date(), progress: 0, error: null })
    .where('id', '=', calibrationId)
    .where('status', '=', 'queued')
    .returningAll()
    .executeTakeFirst();
  if (!claimed) return 'skipped';
  try {
    const result = await fit(deps, claimed);
    await db.updateTable('calibrations').set({ status: 'done', progress: 1, result: JSON.stringify(result), finished_at: new Date() }).where('id', '=', calibrationId).execute();
    return 'done';
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    await db.updateTable('calibrations').set({ status: 'failed', error: message, finished_at: new Date() }).where('id', '=', calibrationId).execute();
    return 'failed';
  }
}

async function fit(deps: CalibrationDeps, row: { id: string; organisation_id: string; site_id: string; profile_version_id: string; fit_growth: boolean; period_from: Date | null; period_to: Date | null }): Promise<CalibrationResult> {
  const { db } = deps;
  const version = await versionOf(db, row.organisation_id, row.profile_version_id);
  if (!version) throw new Error('The profile version no longer exists.');
  const params = organismParamsSchema.parse(version.params);
  const site = await db.selectFrom('sites').selectAll().where('id', '=', row.site_id).executeTakeFirstOrThrow();
  const set = await getActiveConstituentSet(db, site.id);
  if (!set?.current) throw new Error(`${site.name} has no active current constituents.`);
  const current = set.current;
  const rows = await samplesFor(db, row.organisation_id, site.id, version.profile_id, row.period_from, row.period_to);
  if (rows.length < 3) throw new Error(`Only ${rows.length} lab results remain for this calibration; at least 3 are needed.`);
  const samples: (SampleWhereWhen & { observed: number; detectionLimit: number })[] = rows.map((r) => ({
    timeMs: r.sampled_at.getTime(),
    depthTopM: r.depth_top_m,
    depthBottomM: r.depth_bottom_m,
    method: r.method,
    observed: r.cells_per_l,
    detectionLimit: r.detection_limit,
  }));
  const period = calibrationPeriod(samples[0]!.timeMs, samples[samples.length - 1]!.timeMs);
  const resolution = deps.resolution ?? DEFAULT_RESOLUTION;

  const pairsFor = (candidate: OrganismParams): SkillPair[] => {
    const caseInput = buildForecastCase({
      site: { latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg, waterDepthM: site.water_depth_m, bedRoughnessM: site.bed_roughness_m },
      organism: { name: version.name, params: candidate },
      current: { constituents: current.constituents, axisDeg: current.axisDeg },
      startMs: period.startMs,
      horizonDays: period.hours / 24,
      layers: resolution.layers,
      timeStepS: resolution.timeStepS,
      outputIntervalS: resolution.outputIntervalS,
    });
    const outcome = runCase(caseInput);
    if (!outcome.ok) throw new Error(`The calibration case is not valid: ${outcome.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
    if (outcome.result.status !== 'ok') throw new Error(`The model stopped: ${outcome.result.status}.`);
    const grid = gridFromModelResult(outcome.result, { startMs: period.startMs, waterDepthM: site.water_depth_m, organismIndex: 0, schmidtNumber: candidate.schmidtNumber });
    return samples.flatMap((s) => {
      const value = gridValueAtSample(grid, s);
      return value === null ? [] : [{ forecast: value, observed: s.observed, detectionLimit: s.detectionLimit }];
    });
  };
  const withParams = (x: readonly number[]): OrganismParams => ({
    ...params,
    settlingVelocityMPerDay: x[0]!,
    ...(row.fit_growth ? { mortalityPerDay: x[1]! } : {}),
  });

  const settlingBounds = deps.bounds?.settlingVelocityMPerDay ?? [0, 50];
  const lossBounds = deps.bounds?.mortalityPerDay ?? [0, 2];
  const bounds = [{ lower: settlingBounds[0], upper: settlingBounds[1] }, ...(row.fit_growth ? [{ lower: lossBounds[0], upper: lossBounds[1] }] : [])];
  const scanPoints = deps.search?.scanPoints ?? 9;
  const maxIterations = deps.search?.maxIterations ?? 40;
  const sweeps = deps.search?.sweeps ?? 2;
  // Expected evaluations, for progress: per search the scan, two interior points and the golden steps.
  const goldenSteps = (width: number, tolerance: number) => Math.min(maxIterations, Math.ceil(Math.log(tolerance / width) / Math.log((Math.sqrt(5) - 1) / 2)));
  const perSearch = (b: { lower: number; upper: number }, tolerance: number) => scanPoints + 2 + goldenSteps((2 * (b.upper - b.lower)) / (scanPoints - 1), tolerance);
  const expected = row.fit_growth ? 1 + sweeps * (perSearch(bounds[0]!, SETTLING_TOLERANCE) + perSearch(bounds[1]!, LOSS_TOLERANCE)) : perSearch(bounds[0]!, SETTLING_TOLERANCE);

  let lastStored = 0;
  const found = await fitBounded(
    async (x) => sumSquaredLogError(pairsFor(withParams(x))),
    bounds,
    [params.settlingVelocityMPerDay, ...(row.fit_growth ? [params.mortalityPerDay] : [])],
    {
      tolerance: row.fit_growth ? [SETTLING_TOLERANCE, LOSS_TOLERANCE] : [SETTLING_TOLERANCE],
      scanPoints,
      maxIterations,
      sweeps,
      onEvaluation: async (_x, _value, evaluations) => {
        const progress = Math.min(0.95, evaluations / (expected + 2));
        if (progress - lastStored >= 0.02) {
          lastStored = progress;
          await db.updateTable('calibrations').set({ progress: Math.round(progress * 100) / 100 }).where('id', '=', row.id).execute();
        } else await new Promise((resolve) => setImmediate(resolve)); // let HTTP and other work run between model runs
      },
    },
  );
  const proposed = organismParamsSchema.parse(withParams(found.x));
  const before = skill(pairsFor(params));
  const after = skill(pairsFor(proposed));
  return {
    samples: samples.length,
    periodStart: new Date(period.startMs).toISOString(),
    periodEnd: new Date(period.startMs + period.hours * HOUR_MS).toISOString(),
    evaluations: found.evaluations,
    bounds: { settlingVelocityMPerDay: settlingBounds, mortalityPerDay: row.fit_growth ? lossBounds : null },
    fitted: { settlingVelocityMPerDay: found.x[0]!, mortalityPerDay: row.fit_growth ? found.x[1]! : null },
    atBound: found.atBound.flatMap((at, i) => (at ? [i === 0 ? 'settlingVelocityMPerDay' : 'mortalityPerDay'] : [])),
    before,
    after,
    proposedParams: proposed,
  };
}

/** Makes the proposed parameters the profile's newest version (version = max + 1). */
export async function acceptCalibration(db: Db, actor: { id: string }, organisationId: string, calibrationId: string): Promise<{ calibration: Calibration; versionId: string; version: number }> {
  const outcome = await db.transaction().execute(async (trx) => {
    const row = await trx.selectFrom('calibrations').selectAll().where('organisation_id', '=', organisationId).where('id', '=', calibrationId).forUpdate().executeTakeFirst();
    if (!row) throw new AppError('not_found', 'No such calibration in this organisation.');
    if (row.status !== 'done') throw new AppError('conflict', `This calibration is ${row.status}; only a finished one (done) can be accepted.`);
    const result = row.result as CalibrationResult;
    const base = await trx.selectFrom('organism_profile_versions').select(['profile_id', 'version']).where('id', '=', row.profile_version_id).executeTakeFirstOrThrow();
    // Lock the profile so that two new versions cannot take the same number.
    await trx.selectFrom('organism_profiles').select('id').where('id', '=', base.profile_id).forUpdate().executeTakeFirst();
    const latest = await trx.selectFrom('organism_profile_versions').select((eb) => eb.fn.max('version').as('v')).where('profile_id', '=', base.profile_id).executeTakeFirstOrThrow();
    const next = Number(latest.v ?? 0) + 1;
    const site = await trx.selectFrom('sites').select('name').where('id', '=', row.site_id).executeTakeFirstOrThrow();
    const fitted = result.fitted;
    const note = `Calibrated from version ${base.version} against ${result.samples} lab results at ${site.name}: settling velocity ${fitted.settlingVelocityMPerDay.toFixed(2)} m/day${fitted.mortalityPerDay !== null ? `, loss rate ${fitted.mortalityPerDay.toFixed(3)} per day` : ''}; RMSE of log10 cells/L ${result.before.rmse?.toFixed(3) ?? '–'} → ${result.after.rmse?.toFixed(3) ?? '–'}.`.slice(0, 500);
    const version = await trx
      .insertInto('organism_profile_versions')
      .values({ profile_id: base.profile_id, organisation_id: organisationId, version: next, params: JSON.stringify(result.proposedParams), note, created_by: actor.id })
      .returning('id')
      .executeTakeFirstOrThrow();
    await trx.updateTable('calibrations').set({ status: 'accepted', accepted_version_id: version.id, decided_at: new Date(), decided_by: actor.id }).where('id', '=', row.id).execute();
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'profile.calibration_accepted', subject: calibrationId, details: { profileId: base.profile_id, versionId: version.id, version: next } });
    return { versionId: version.id, version: next };
  });
  return { calibration: toCalibrationDto((await repo.findCalibration(db, organisationId, calibrationId))!), ...outcome };
}

export async function discardCalibration(db: Db, actor: { id: string }, organisationId: string, calibrationId: string): Promise<Calibration> {
  const row = await repo.findCalibration(db, organisationId, calibrationId);
  if (!row) throw new AppError('not_found', 'No such calibration in this organisation.');
  const updated = await db
    .updateTable('calibrations')
    .set({ status: 'discarded', decided_at: new Date(), decided_by: actor.id })
    .where('id', '=', calibrationId)
    .where('status', 'in', ['done', 'failed'])
    .returning('id')
    .executeTakeFirst();
  if (!updated) throw new AppError('conflict', `This calibration is ${row.status}; only a finished (done or failed) one can be discarded.`);
  return toCalibrationDto((await repo.findCalibration(db, organisationId, calibrationId))!);
}
