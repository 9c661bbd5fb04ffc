import { gzipSync } from 'node:zlib';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DARWIN_CORE_COLUMNS } from '../../server/lab/darwin-core.ts';
import { encodeGrid } from '../../shared/forecast/grid-codec.ts';
import type { ForecastGrid } from '../../shared/forecast/grid.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { comparisonSchema, labResultListSchema, labResultSchema, taxonMappingListSchema, uploadPreviewSchema, uploadProblemSchema, uploadResultSchema } from '../../shared/schemas/lab.schema.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';
import { csvLines, labPath, subscribe } from './lab-support.ts';
import { uploadCsv } from './tides-support.ts';

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
/** Midnight UTC five days ago: every sample lies in the past. */
const T0 = (Math.floor(Date.now() / DAY_MS) - 5) * DAY_MS;
const iso = (ms: number) => new Date(ms).toISOString();

const HEADER = ['Sample', 'Site', 'Sampled', 'Depth (m)', 'Method', 'Taxon', 'Cells/L', 'Detection limit'];
const goodRows = (prefix: string) => [
  [`${prefix}-1`, 'Alder north line', '2026-11-20T09:15:00+00:00', '0-10', 'hose', 'Dinophysis acuta', 1200, 40],
  [`${prefix}-2`, 'Alder north line', '2026-11-20T09:20:00+00:00', 5, 'bottle', 'Dinophysis acuta', 0, 40],
  [`${prefix}-3`, 'Alder north line', '2026-11-20T10:20:00+01:00', 12, 'bottle', 'Dinophysis acuta', 3400, 40],
];

async function resultCount(w: TeamWorld): Promise<number> {
  return (await w.database.db.selectFrom('lab_results').select('id').where('organisation_id', '=', w.orgA).execute()).length;
}

/** A forecast stored as the job stores it, but with a hand-made grid: two 7.5 m layers, hourly outputs. */
async function handForecast(w: TeamWorld, versionId: string, startMs: number, createdAt: number, layer: (i: number, k: number) => number) {
  const db = w.database.db;
  const nt = 73;
  const nz = 2;
  const concentration = new Float32Array(nt * nz);
  for (let i = 0; i < nt; i++) for (let k = 0; k < nz; k++) concentration[i * nz + k] = layer(i, k);
  const grid: ForecastGrid = {
    startMs,
    stepMs: HOUR_MS,
    nt,
    nz,
    waterDepthM: 15,
    depthM: Float64Array.from([3.75, 11.25]),
    thicknessM: Float64Array.from([7.5, 7.5]),
    concentration,
    speed: new Float32Array(nt * nz),
    diffusivity: new Float32Array(nt * nz),
    depthMeanAlong: new Float64Array(nt),
    depthMeanSpeed: new Float64Array(nt),
    bedStressPa: new Float64Array(nt),
  };
  const run = await db
    .insertInto('forecast_runs')
    .values({ organisation_id: w.orgA, site_id: w.siteA, profile_version_id: versionId, constituent_set_id: null, forecast_start: new Date(startMs), horizon_days: 3, trigger: 'manual', status: 'done' })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db
    .insertInto('forecasts')
    .values({
      run_id: run.id,
      organisation_id: w.orgA,
      site_id: w.siteA,
      profile_version_id: versionId,
      constituent_set_id: null,
      forecast_start: new Date(startMs),
      horizon_days: 3,
      engine_version: 'hand-made grid',
      inputs: '{}',
      model_case: '{}',
      grid: gzipSync(encodeGrid(grid)),
      windows: '[]',
      advice: '[]',
      gear_max_cells_per_l: 0,
      created_at: new Date(createdAt),
    })
    .execute();
}

describe('lab results API', () => {
  let world: TeamWorld;

  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  describe('uploads', () => {
    it('refuses a file with one bad row, naming the row and the column, and imports nothing', async () => {
      const biologist = await world.as('biologistA');
      const rows = goodRows('BAD');
      rows[1]![6] = 'about 1200'; // file row 3: words in the count
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csvLines([HEADER, ...rows]), {}, 'week-47.csv');
      expect(answer.status).toBe(400);
      const error = apiErrorSchema.parse(answer.json).error;
      const problems = uploadProblemSchema.array().parse(error.details);
      expect(problems).toHaveLength(1);
      expect(problems[0]).toMatchObject({ row: 3, column: 'Cells/L', path: 'row 3, column Cells/L' });
      expect(problems[0]!.message).toMatch(/"about 1200" is not a number; give the count in cells per litre/);
      expect(error.message).toMatch(/row 3, column Cells\/L/);
      expect(error.message).toMatch(/Nothing was imported/);
      expect(await resultCount(world)).toBe(0);
    });

    it('imports the corrected file, every row, in one batch', async () => {
      const biologist = await world.as('biologistA');
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csvLines([HEADER, ...goodRows('BAD')]), {}, 'week-47.csv');
      expect(answer.status).toBe(201);
      expect(uploadResultSchema.parse(answer.json)).toMatchObject({ fileName: 'week-47.csv', imported: 3 });
      const list = labResultListSchema.parse((await biologist.api(world.baseUrl, 'GET', `${labPath(world)}/results`)).json).results;
      const hose = list.find((r) => r.sampleId === 'BAD-1')!;
      expect(hose).toMatchObject({ method: 'hose', depthTopM: 0, depthBottomM: 10, cellsPerL: 1200, detectionLimit: 40, siteId: world.siteA, belowDetection: false });
      // The +01:00 time is stored in UTC.
      expect(list.find((r) => r.sampleId === 'BAD-3')!.sampledAt).toBe('2026-11-20T09:20:00.000Z');
      expect(list.find((r) => r.sampleId === 'BAD-2')!.belowDetection).toBe(true);
    });

    it('refuses the same samples again, naming the rows, and imports nothing', async () => {
      const biologist = await world.as('biologistA');
      const before = await resultCount(world);
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csvLines([HEADER, ...goodRows('BAD')]));
      expect(answer.status).toBe(400);
      const problems = uploadProblemSchema.array().parse(apiErrorSchema.parse(answer.json).error.details);
      expect(problems.map((p) => p.row)).toEqual([2, 3, 4]);
      expect(problems[0]!.message).toMatch(/stored already \(from week-47\.csv\)/);
      expect(await resultCount(world)).toBe(before);
    });

    it('previews a file whose column names differ: suggests a mapping, lists the columns and each row\'s problems', async () => {
      const biologist = await world.as('biologistA');
      const csv = csvLines([
        ['Ref', 'Where', 'When', 'Zone', 'From (m)', 'To (m)', 'Kind', 'Species', 'Count per litre', 'LOD'],
        ['P-1', 'Alder north line', '2026-11-21 08:00', 'Europe/London', 0, 10, 'Lund tube', 'Alexandrium spp.', 80, 40],
        ['P-2', 'Nowhere bay', '2026-11-21 08:00', 'Europe/London', 4, 4, 'bottle', 'Alexandrium spp.', 80, 40],
      ]);
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads/preview`, csv, {}, 'lab.csv');
      expect(answer.status).toBe(200);
      const preview = uploadPreviewSchema.parse(answer.json);
      expect(preview.columns).toEqual(['Ref', 'Where', 'When', 'Zone', 'From (m)', 'To (m)', 'Kind', 'Species', 'Count per litre', 'LOD']);
      expect(preview.suggestedMapping).toMatchObject({ zone: 'Zone', taxon: 'Species', detectionLimit: 'LOD' });
      // The names the suggestion cannot know make column-level problems.
      expect(preview.fileProblems.some((p) => /Sample id/.test(p.message))).toBe(true);

      const mapping = { sampleId: 'Ref', site: 'Where', sampledAt: 'When', zone: 'Zone', depthTopM: 'From (m)', depthBottomM: 'To (m)', method: 'Kind', taxon: 'Species', cellsPerL: 'Count per litre', detectionLimit: 'LOD' };
      const mapped = uploadPreviewSchema.parse((await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads/preview`, csv, { mapping: JSON.stringify(mapping) })).json);
      expect(mapped.fileProblems).toEqual([]);
      expect(mapped.rows[0]).toMatchObject({ row: 2, problems: [] });
      expect(mapped.rows[1]!.problems).toEqual([expect.objectContaining({ row: 3, column: 'Where', message: expect.stringMatching(/no site of this organisation is named "Nowhere bay"/) })]);
      expect(mapped.rowsWithProblems).toBe(1);
    });

    it('imports through a chosen mapping, reading local times with their zone column', async () => {
      const biologist = await world.as('biologistA');
      const csv = csvLines([
        ['Ref', 'Where', 'When', 'Zone', 'From (m)', 'To (m)', 'Kind', 'Species', 'Count per litre', 'LOD'],
        ['M-1', 'Alder north line', '2026-07-01 08:00', 'Europe/London', 0, 10, 'Lund tube', 'Alexandrium spp.', 80, 40],
      ]);
      const mapping = { sampleId: 'Ref', site: 'Where', sampledAt: 'When', zone: 'Zone', depthTopM: 'From (m)', depthBottomM: 'To (m)', method: 'Kind', taxon: 'Species', cellsPerL: 'Count per litre', detectionLimit: 'LOD' };
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csv, { mapping: JSON.stringify(mapping) });
      expect(answer.status).toBe(201);
      const list = labResultListSchema.parse((await biologist.api(world.baseUrl, 'GET', `${labPath(world)}/results?taxon=Alexandrium%20spp.`)).json).results;
      // British Summer Time in July: 08:00 local is 07:00 UTC.
      expect(list).toEqual([expect.objectContaining({ sampleId: 'M-1', sampledAt: '2026-07-01T07:00:00.000Z', method: 'hose' })]);
    });

    it('names the column of a time without a zone and of a bottle given a range', async () => {
      const biologist = await world.as('biologistA');
      const csv = csvLines([HEADER, ['Z-1', 'Alder north line', '2026-11-20T09:15:00', 5, 'bottle', 'Dinophysis acuta', 10, 40], ['Z-2', 'Alder north line', '2026-11-20T09:15:00Z', '2-6', 'bottle', 'Dinophysis acuta', 10, 40]]);
      const answer = await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csv);
      const problems = uploadProblemSchema.array().parse(apiErrorSchema.parse(answer.json).error.details);
      expect(problems).toEqual([
        expect.objectContaining({ row: 2, column: 'Sampled', message: expect.stringMatching(/has no time zone/) }),
        expect.objectContaining({ row: 3, column: 'Depth (m)', message: expect.stringMatching(/a bottle samples one depth/) }),
      ]);
    });

    it('keeps crew to reading: no upload, no entry, but the list', async () => {
      const crew = await world.as('crewA');
      expect((await uploadCsv(crew, world.baseUrl, `${labPath(world)}/uploads`, csvLines([HEADER, ...goodRows('CREW')]))).status).toBe(403);
      expect((await crew.api(world.baseUrl, 'POST', `${labPath(world)}/results`, {})).status).toBe(403);
      expect((await crew.api(world.baseUrl, 'GET', `${labPath(world)}/results`)).status).toBe(200);
      const other = await world.as('ownerB');
      const theirs = await other.api(world.baseUrl, 'GET', `/orgs/${world.orgB}/lab/results`);
      expect(labResultListSchema.parse(theirs.json).results).toEqual([]);
      expect((await other.api(world.baseUrl, 'GET', `${labPath(world)}/results`)).status).toBe(404);
    });
  });

  describe('manual entry', () => {
    it('stores one result entered by hand', async () => {
      const manager = await world.as('managerA');
      const answer = await manager.api(world.baseUrl, 'POST', `${labPath(world)}/results`, {
        siteId: world.siteA,
        sampleId: 'HAND-1',
        sampledAt: '2026-11-22T07:30:00+00:00',
        depthTopM: 3,
        method: 'bottle',
        taxon: 'Pseudo-nitzschia spp.',
        cellsPerL: 52_000,
        detectionLimit: 40,
        analyst: 'R. Okafor',
        lab: 'Harbour Lab, Unit 4',
      });
      expect(answer.status).toBe(201);
      expect(labResultSchema.parse(answer.json)).toMatchObject({ sampleId: 'HAND-1', depthTopM: 3, depthBottomM: 3, fileName: null, createdBy: 'manager@alder.test' });
    });

    it('refuses a hose sample without a range, naming the field', async () => {
      const biologist = await world.as('biologistA');
      const answer = await biologist.api(world.baseUrl, 'POST', `${labPath(world)}/results`, {
        siteId: world.siteA,
        sampleId: 'HAND-2',
        sampledAt: '2026-11-22T07:30:00Z',
        depthTopM: 0,
        method: 'hose',
        taxon: 'Pseudo-nitzschia spp.',
        cellsPerL: 100,
        detectionLimit: 40,
      });
      expect(answer.status).toBe(400);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/depthBottomM: a hose sample covers a depth range/);
    });
  });

  describe('Darwin Core export', () => {
    it('writes the Darwin Core columns with the site\'s position, RFC 4180 quoting and CRLF line ends', async () => {
      const crew = await world.as('crewA');
      const response = await crew.request(`${world.baseUrl}/api${labPath(world)}/results/export.csv?taxon=Pseudo-nitzschia%20spp.`);
      expect(response.status).toBe(200);
      expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
      const text = await response.text();
      expect(text.split('\r\n')[0]).toBe(DARWIN_CORE_COLUMNS.join(','));
      expect(DARWIN_CORE_COLUMNS).toEqual(expect.arrayContaining(['occurrenceID', 'eventDate', 'minimumDepthInMeters', 'maximumDepthInMeters', 'organismQuantity', 'organismQuantityType', 'samplingProtocol', 'scientificName', 'decimalLatitude', 'decimalLongitude']));
      expect(text.endsWith('\r\n')).toBe(true);
      // The lab's name holds a comma, so its field is quoted.
      expect(text).toContain('"Harbour Lab, Unit 4"');
      const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
      expect(parsed.errors).toEqual([]);
      expect(parsed.data).toEqual([
        expect.objectContaining({
          eventID: 'HAND-1',
          eventDate: '2026-11-22T07:30:00.000Z',
          minimumDepthInMeters: '3',
          maximumDepthInMeters: '3',
          organismQuantity: '52000',
          organismQuantityType: 'cells per litre',
          scientificName: 'Pseudo-nitzschia spp.',
          occurrenceStatus: 'present',
          decimalLatitude: '57.1',
          decimalLongitude: '-6.2',
          identifiedBy: 'R. Okafor',
          institutionCode: 'Harbour Lab, Unit 4',
          samplingProtocol: expect.stringMatching(/^discrete bottle sample at 3 m/),
        }),
      ]);
      expect(parsed.data[0]!.occurrenceID).toMatch(/^urn:uuid:[0-9a-f-]{36}$/);
    });

    it('writes a count under the detection limit as absent, a hose as its range', async () => {
      const biologist = await world.as('biologistA');
      const text = await (await biologist.request(`${world.baseUrl}/api${labPath(world)}/results/export.csv?taxon=Dinophysis%20acuta`)).text();
      const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
      expect(rows.find((r) => r.eventID === 'BAD-2')).toMatchObject({ occurrenceStatus: 'absent', organismQuantity: '0' });
      expect(rows.find((r) => r.eventID === 'BAD-1')).toMatchObject({ minimumDepthInMeters: '0', maximumDepthInMeters: '10', samplingProtocol: expect.stringMatching(/^integrated hose \(tube\) sample 0-10 m/) });
    });
  });

  describe('comparison with forecasts', () => {
    let profileId = '';

    beforeAll(async () => {
      const db = world.database.db;
      const params = JSON.stringify(organismParamsSchema.parse({ settlingVelocityMPerDay: 2, initialCellsPerL: 1000, triggerCellsPerL: 500 }));
      profileId = (await db.insertInto('organism_profiles').values({ organisation_id: world.orgA, name: 'Test dinoflagellate', taxon: 'Testia minor' }).returning('id').executeTakeFirstOrThrow()).id;
      const v1 = (await db.insertInto('organism_profile_versions').values({ profile_id: profileId, organisation_id: world.orgA, version: 1, params }).returning('id').executeTakeFirstOrThrow()).id;
      const v2 = (await db.insertInto('organism_profile_versions').values({ profile_id: profileId, organisation_id: world.orgA, version: 2, params }).returning('id').executeTakeFirstOrThrow()).id;
      // Version 1's forecast: surface layer 1000·(1 + i) at output i (hourly), lower layer 4000; made an hour before it starts.
      await handForecast(world, v1, T0, T0 - HOUR_MS, (i, k) => (k === 0 ? 1000 * (1 + i) : 4000));
      // Version 2's forecast a day later: 500 everywhere.
      await handForecast(world, v2, T0 + DAY_MS, T0 + DAY_MS - HOUR_MS, () => 500);
      const biologist = await world.as('biologistA');
      const csv = csvLines([
        HEADER,
        ['C-1', 'Alder north line', iso(T0 + 2 * HOUR_MS), 2, 'bottle', 'Testia minor', 300, 40],
        ['C-2', 'Alder north line', iso(T0 + 2.5 * HOUR_MS), '0-15', 'hose', 'testia minor', 3750, 40],
        ['C-3', 'Alder north line', iso(T0 + DAY_MS + 2 * HOUR_MS), 10, 'bottle', 'Testia minor', 5000, 40],
        ['C-4', 'Alder north line', iso(T0 + DAY_MS + 3 * HOUR_MS), 10, 'bottle', 'Testia minor', 0, 40],
        ['C-5', 'Alder north line', iso(T0 - DAY_MS), 10, 'bottle', 'Testia minor', 100, 40],
      ]);
      expect((await uploadCsv(biologist, world.baseUrl, `${labPath(world)}/uploads`, csv)).status).toBe(201);
      const mapped = await biologist.api(world.baseUrl, 'PUT', `${labPath(world)}/taxa`, { mappings: [{ taxon: 'Testia minor', profileId }] });
      expect(taxonMappingListSchema.parse(mapped.json).taxa).toContainEqual({ taxon: 'Testia minor', profileId, resultCount: 4 });
    });

    it('is locked without a subscription (forecast output)', async () => {
      const crew = await world.as('crewA');
      expect((await crew.api(world.baseUrl, 'GET', `${labPath(world)}/comparison?profileId=${profileId}`)).status).toBe(402);
    });

    it('matches each result to the forecast current when it was sampled, at its depth or over its range', async () => {
      await subscribe(world);
      const crew = await world.as('crewA');
      const answer = await crew.api(world.baseUrl, 'GET', `${labPath(world)}/comparison?profileId=${profileId}&siteId=${world.siteA}`);
      expect(answer.status).toBe(200);
      const comparison = comparisonSchema.parse(answer.json);
      const bySample = new Map(comparison.pairs.map((p) => [p.sampleId, p]));
      // [CALC] C-1: surface layer at output 2 = 3000. C-2: hose 0–15 m at output 2.5 = mean(3500, 4000) = 3750.
      expect(bySample.get('C-1')).toMatchObject({ forecast: 3000, version: 1, forecastMadeAfterSample: false });
      expect(bySample.get('C-2')!.forecast).toBeCloseTo(3750, 6);
      // C-3 and C-4 fall in both forecasts' spans; version 2's was made later, before the samples: it was current.
      expect(bySample.get('C-3')).toMatchObject({ forecast: 500, version: 2 });
      expect(bySample.get('C-4')).toMatchObject({ forecast: 500, version: 2, belowDetection: true });
      // C-5 predates every forecast.
      expect(bySample.get('C-5')).toMatchObject({ forecast: null, forecastId: null });
    });

    it('gives bias, RMSE and correlation on log10 per version, as computed by hand', async () => {
      const crew = await world.as('crewA');
      const comparison = comparisonSchema.parse((await crew.api(world.baseUrl, 'GET', `${labPath(world)}/comparison?profileId=${profileId}`)).json);
      const [first, second] = comparison.byVersion;
      // [CALC] version 1: d = log10(3000/300) = 1 and log10(3750/3750) = 0 → bias 0.5, RMSE √0.5, r = 1 (two points, both rising).
      expect(first).toMatchObject({ version: 1, skill: { n: 2 } });
      expect(first!.skill.bias).toBeCloseTo(0.5, 9);
      expect(first!.skill.rmse).toBeCloseTo(Math.SQRT1_2, 9);
      expect(first!.skill.correlation).toBeCloseTo(1, 9);
      // [CALC] version 2: d = log10(500/5000) = −1 and log10(500/20) = 1.39794 (0 cells under a limit of 40 count as 20)
      // → bias 0.198970, RMSE √((1 + 1.954243)/2) = 1.215367; the forecast has no spread, so no correlation.
      expect(second).toMatchObject({ version: 2, skill: { n: 2, correlation: null } });
      expect(second!.skill.bias).toBeCloseTo(0.19897, 5);
      expect(second!.skill.rmse).toBeCloseTo(1.215367, 5);
      // [CALC] all four: bias 1.39794/4 = 0.349485, RMSE √((1 + 0 + 1 + 1.954243)/4) = 0.994263.
      expect(comparison.overall.n).toBe(4);
      expect(comparison.overall.bias).toBeCloseTo(0.349485, 5);
      expect(comparison.overall.rmse).toBeCloseTo(0.994263, 5);
      expect(comparison.censoring).toMatch(/half the limit/);
    });
  });
});
