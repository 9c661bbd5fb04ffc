import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCalibration } from '../../server/lab/calibration.service.ts';
import { buildForecastCase } from '../../shared/forecast/case-builder.ts';
import { gridFromModelResult } from '../../shared/forecast/from-model.ts';
import { gridValueAtSample } from '../../shared/lab/sample-value.ts';
import { runCase } from '../../shared/model/run.ts';
import { calibrationSchema, uploadResultSchema } from '../../shared/schemas/lab.schema.ts';
import { organismParamsSchema, type OrganismParamsInput } from '../../shared/schemas/organism.schema.ts';
import { SITE_CURRENT } from '../helpers/forecast-fixture.ts';
import { SITE_VALUES, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';
import { csvLines, labPath, subscribe } from './lab-support.ts';
import { gaussian, seededRandom, uploadCsv } from './tides-support.ts';

const TRUE_SETTLING_M_PER_DAY = 6;
const HOUR_MS = 3_600_000;
/** Midnight UTC three days ago: results must not lie in the future. */
const START_MS = (Math.floor(Date.now() / 86_400_000) - 3) * 86_400_000;
const TAXON = 'Twinia cystica';

/**
 * A resting-cyst-like organism over a depositing bed: cells that settle onto a calm bed leave the water,
 * so the counts fall at a rate set by the settling velocity (about ws/h per day). Over a closed bed,
 * strong tidal mixing would leave only a faint vertical gradient for the fit to see.
 */
const twinParams = (settlingVelocityMPerDay: number): OrganismParamsInput => ({
  settlingVelocityMPerDay,
  initialCellsPerL: 10_000,
  triggerCellsPerL: 5_000,
  bedExchange: { criticalStressPa: 0.1, erosionRate: 0.0005 },
});

/**
 * The synthetic twin: the model itself (forecast resolution: 50 layers, 30 s steps, 15-minute outputs)
 * with the true settling velocity, sampled every 3 h over two days with bottles at 1, 5, 9 and 13 m and
 * a 0–10 m hose, each count multiplied by lognormal noise (σ = 0.15 in ln, seeded).
 */
function twinCsv(siteName: string): string {
  const params = organismParamsSchema.parse(twinParams(TRUE_SETTLING_M_PER_DAY));
  const caseInput = buildForecastCase({
    site: { latitudeDeg: SITE_VALUES.latitude_deg, longitudeDeg: SITE_VALUES.longitude_deg, waterDepthM: SITE_VALUES.water_depth_m, bedRoughnessM: SITE_VALUES.bed_roughness_m },
    organism: { name: 'twin', params },
    current: SITE_CURRENT,
    startMs: START_MS,
    horizonDays: 2,
  });
  const outcome = runCase(caseInput);
  if (!outcome.ok || outcome.result.status !== 'ok') throw new Error('the twin run failed');
  const grid = gridFromModelResult(outcome.result, { startMs: START_MS, waterDepthM: SITE_VALUES.water_depth_m, organismIndex: 0 });
  const noise = gaussian(seededRandom(20261201));
  const rows: (string | number)[][] = [['Sample', 'Station', 'Date/time (UTC)', 'Depth (m)', 'Gear', 'Species', 'Cells/L', 'LOD']];
  for (let hour = 3; hour <= 45; hour += 3) {
    const timeMs = START_MS + hour * HOUR_MS + 17 * 60_000;
    for (const [top, bottom] of [[1, 1], [5, 5], [9, 9], [13, 13], [0, 10]] as const) {
      const method = top === bottom ? 'bottle' : 'hose';
      const value = gridValueAtSample(grid, { timeMs, depthTopM: top, depthBottomM: bottom, method })!;
      const counted = Math.round(value * Math.exp(0.15 * noise()));
      rows.push([`TW-${hour}-${top}-${bottom}`, siteName, new Date(timeMs).toISOString(), method === 'hose' ? `${top}-${bottom}` : top, method, TAXON, counted, 40]);
    }
  }
  return csvLines(rows);
}

describe('calibration against a synthetic twin', () => {
  let world: TeamWorld;
  let versionId = '';
  let profileId = '';

  beforeAll(async () => {
    world = await startTeamWorld({
      lab: { calibrationRunner: 'manual', calibration: { resolution: { layers: 50, timeStepS: 60, outputIntervalS: 3600 } } },
    });
    const db = world.database.db;
    await subscribe(world);
    const set = await db
      .insertInto('constituent_sets')
      .values({ organisation_id: world.orgA, site_id: world.siteA, version: 1, source: 'manual', kind: 'current', current_constituents: JSON.stringify(SITE_CURRENT.constituents), current_axis_deg: SITE_CURRENT.axisDeg })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.updateTable('sites').set({ active_constituent_set_id: set.id }).where('id', '=', world.siteA).execute();
    // The profile starts from a poor guess of 1 m/day.
    const profile = await db.insertInto('organism_profiles').values({ organisation_id: world.orgA, name: 'Twin cyst', taxon: TAXON }).returning('id').executeTakeFirstOrThrow();
    profileId = profile.id;
    versionId = (
      await db
        .insertInto('organism_profile_versions')
        .values({ profile_id: profile.id, organisation_id: world.orgA, version: 1, params: JSON.stringify(organismParamsSchema.parse(twinParams(1))) })
        .returning('id')
        .executeTakeFirstOrThrow()
    ).id;

    const biologist = await world.as('biologistA');
    const uploaded = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, twinCsv('Alder north line'), {}, 'twin.csv');
    expect(uploaded.status, JSON.stringify(uploaded.json).slice(0, 600)).toBe(201);
    expect(uploadResultSchema.parse(uploaded.json).imported).toBe(75);
    const mapped = await biologist.api(world.baseUrl, 'PUT', `${labPath(world)}/taxa`, { mappings: [{ taxon: TAXON, profileId }] });
    expect(mapped.status).toBe(200);
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  async function calibrate(fitGrowth: boolean) {
    const biologist = await world.as('biologistA');
    const queued = await biologist.api(world.baseUrl, 'POST', `${labPath(world)}/calibrations`, { profileVersionId: versionId, siteId: world.siteA, fitGrowth });
    expect(queued.status).toBe(202);
    const calibration = calibrationSchema.parse(queued.json);
    expect(calibration.status).toBe('queued');
    expect(await runCalibration({ db: world.database.db, resolution: { layers: 50, timeStepS: 60, outputIntervalS: 3600 } }, calibration.id)).toBe('done');
    const done = await biologist.api(world.baseUrl, 'GET', `${labPath(world)}/calibrations/${calibration.id}`);
    return calibrationSchema.parse(done.json);
  }

  it('recovers the true settling velocity within 15 % and improves the skill', async () => {
    const started = Date.now();
    const calibration = await calibrate(false);
    expect(calibration).toMatchObject({ status: 'done', progress: 1 });
    const result = calibration.result!;
    // Must-show 2: the fitted settling velocity is within 15 % of the velocity the twin was made with.
    const fitted = result.fitted.settlingVelocityMPerDay;
    console.info(`twin: true ${TRUE_SETTLING_M_PER_DAY} m/d, fitted ${fitted.toFixed(3)} m/d from ${result.samples} results in ${result.evaluations} runs, ${((Date.now() - started) / 1000).toFixed(1)} s; RMSE log10 ${result.before.rmse?.toFixed(3)} -> ${result.after.rmse?.toFixed(3)}`);
    expect(Math.abs(fitted - TRUE_SETTLING_M_PER_DAY) / TRUE_SETTLING_M_PER_DAY).toBeLessThan(0.15);
    expect(result.atBound).toEqual([]);
    expect(result.after.rmse!).toBeLessThan(result.before.rmse!);
    // With σ = 0.15 in ln, the residual RMSE in log10 is near 0.15 / ln 10 ≈ 0.065 when the fit is right.
    expect(result.after.rmse!).toBeLessThan(0.1);
    expect(result.proposedParams.settlingVelocityMPerDay).toBe(fitted);
  }, 60_000);

  it('is refused to crew, who may only read', async () => {
    const crew = await world.as('crewA');
    const answer = await crew.api(world.baseUrl, 'POST', `${labPath(world)}/calibrations`, { profileVersionId: versionId, siteId: world.siteA });
    expect(answer.status).toBe(403);
  });

  it('makes the accepted proposal the profile\'s next version, and refuses a second decision', async () => {
    const calibration = await calibrate(false);
    const biologist = await world.as('biologistA');
    const accepted = await biologist.api(world.baseUrl, 'POST', `${labPath(world)}/calibrations/${calibration.id}/accept`);
    expect(accepted.status).toBe(200);
    const body = accepted.json as { versionId: string; version: number; calibration: unknown };
    expect(calibrationSchema.parse(body.calibration)).toMatchObject({ status: 'accepted', acceptedVersionId: body.versionId });
    const stored = await world.database.db.selectFrom('organism_profile_versions').selectAll().where('id', '=', body.versionId).executeTakeFirstOrThrow();
    const latest = await world.database.db.selectFrom('organism_profile_versions').select((eb) => eb.fn.max('version').as('v')).where('profile_id', '=', profileId).executeTakeFirstOrThrow();
    expect(stored.version).toBe(Number(latest.v));
    expect(stored.version).toBe(2);
    expect(organismParamsSchema.parse(stored.params).settlingVelocityMPerDay).toBeCloseTo(calibration.result!.fitted.settlingVelocityMPerDay, 10);
    const again = await biologist.api(world.baseUrl, 'POST', `${labPath(world)}/calibrations/${calibration.id}/discard`);
    expect(again.status).toBe(409);
  }, 60_000);

  it('marks a discarded proposal discarded and adds no version', async () => {
    const before = await world.database.db.selectFrom('organism_profile_versions').select('id').where('profile_id', '=', profileId).execute();
    const calibration = await calibrate(false);
    const manager = await world.as('managerA');
    const discarded = await manager.api(world.baseUrl, 'POST', `${labPath(world)}/calibrations/${calibration.id}/discard`);
    expect(discarded.status).toBe(200);
    expect(calibrationSchema.parse(discarded.json).status).toBe('discarded');
    const after = await world.database.db.selectFrom('organism_profile_versions').select('id').where('profile_id', '=', profileId).execute();
    expect(after.length).toBe(before.length);
  }, 60_000);

  it('fits the settling velocity together with the loss rate when asked, still within 15 %', async () => {
    const calibration = await calibrate(true);
    const result = calibration.result!;
    console.info(`twin with loss rate: fitted ${result.fitted.settlingVelocityMPerDay.toFixed(3)} m/d, loss ${result.fitted.mortalityPerDay?.toFixed(4)} /d, ${result.evaluations} runs`);
    expect(Math.abs(result.fitted.settlingVelocityMPerDay - TRUE_SETTLING_M_PER_DAY) / TRUE_SETTLING_M_PER_DAY).toBeLessThan(0.15);
    // The twin has no losses besides settling: the fitted loss rate stays small (≤ 0.1 per day).
    expect(result.fitted.mortalityPerDay!).toBeLessThan(0.1);
  }, 60_000);
});
