import { createTidePredictor } from '@neaps/tide-predictor';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { refreshSiteTidesFromFeed } from '../../server/tides/tides.service.ts';
import { createTideFeedClient } from '../../server/tides/tide-feed.client.ts';
import { startTideFeedStandIn, type TideFeedStandIn } from '../../server/tides/tide-feed-standin.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import {
  activeSetSchema,
  analysisResultSchema,
  constituentSetListSchema,
  constituentSetSchema,
  feedFetchResultSchema,
  feedRefreshListSchema,
  feedStationListSchema,
  previewAnswerSchema,
  setFromRecordResultSchema,
  uploadProblemSchema,
} from '../../shared/schemas/tides.schema.ts';
import { predictCurrent, regularTimes, type CurrentConstituent } from '../../shared/tides/predict.ts';
import { SITE_VALUES, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';
import { crossings, gaussian, seededRandom, uploadCsv } from './tides-support.ts';

const KEY = 'tides-api-test-key';
const MINUTE = 60_000;
const HOUR = 3_600_000;
const DAY = 24 * HOUR;

const tidesPath = (w: TeamWorld, siteId = w.siteA) => `/orgs/${w.orgA}/sites/${siteId}/tides`;

async function newSite(w: TeamWorld, name: string): Promise<string> {
  return (await w.database.db.insertInto('sites').values({ ...SITE_VALUES, organisation_id: w.orgA, name }).returning('id').executeTakeFirstOrThrow()).id;
}

async function setCount(w: TeamWorld, siteId: string): Promise<number> {
  return (await w.database.db.selectFrom('constituent_sets').select('id').where('site_id', '=', siteId).execute()).length;
}

describe('site tides API', () => {
  let world: TeamWorld;
  let feed: TideFeedStandIn;

  beforeAll(async () => {
    feed = await startTideFeedStandIn({ port: 0, apiKey: KEY, slowMs: 5000 });
    const client = createTideFeedClient({ baseUrl: feed.url, apiKey: KEY, timeoutMs: 300 });
    world = await startTeamWorld({ tides: { feed: client, feedRetry: { attempts: 3, backoffMs: 20 } } });
  }, 60_000);
  afterAll(async () => {
    await world.close();
    await feed.close();
  });

  describe('the tide feed', () => {
    it('lists feed stations near the site, nearest first', async () => {
      const crew = await world.as('crewA');
      const answer = await crew.api(world.baseUrl, 'GET', `${tidesPath(world)}/feed/stations`);
      expect(answer.status).toBe(200);
      const { stations, chosenStationId } = feedStationListSchema.parse(answer.json);
      expect(chosenStationId).toBeNull();
      expect(stations[0]?.id).toBe('CMS-01');
    });

    it('fetches the nearest station into version 1, makes it active and remembers the station', async () => {
      const manager = await world.as('managerA');
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/feed/fetch`, {});
      expect(answer.status).toBe(201);
      const result = feedFetchResultSchema.parse(answer.json);
      expect(result).toMatchObject({ outcome: 'created', attempts: 1, activated: true });
      expect(result.set).toMatchObject({ version: 1, source: 'feed', kind: 'both', stationId: 'CMS-01', active: true });
      expect(result.set.createdBy?.email).toBe('manager@alder.test');
      const stations = feedStationListSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/feed/stations`)).json);
      expect(stations.chosenStationId).toBe('CMS-01');
    });

    it('stores no new version when the feed sends the same constituents again', async () => {
      const manager = await world.as('managerA');
      const before = await setCount(world, world.siteA);
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/feed/fetch`, {});
      expect(answer.status).toBe(200);
      expect(feedFetchResultSchema.parse(answer.json)).toMatchObject({ outcome: 'unchanged', set: { version: 1 } });
      expect(await setCount(world, world.siteA)).toBe(before);
    });

    it('fetches another station as the next version, keeping the old one', async () => {
      const manager = await world.as('managerA');
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/feed/fetch`, { stationId: 'LRS-02' });
      expect(answer.status).toBe(201);
      expect(feedFetchResultSchema.parse(answer.json).set).toMatchObject({ version: 2, stationId: 'LRS-02', active: true });
      const list = constituentSetListSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/sets`)).json);
      expect(list.sets.map((s) => s.version)).toEqual([2, 1]);
      expect(list.activeSetId).toBe(list.sets[0]!.id);
    });

    it('refuses a station the feed does not know, with a 400 that says to choose from the list', async () => {
      const manager = await world.as('managerA');
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/feed/fetch`, { stationId: 'NOPE-1' });
      expect(answer.status).toBe(400);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/Choose a station/);
    });

    // Must-show 6: with the stand-in failing, the refresh retries, records the failure, and the site keeps its last good set.
    for (const [fault, code] of [['error', 'unavailable'], ['slow', 'timeout'], ['malformed', 'bad_answer']] as const) {
      it(`retries a feed that fails (${fault}) three times, records each failure and keeps the last good set`, async () => {
        const manager = await world.as('managerA');
        const activeBefore = activeSetSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/active`)).json).set;
        const setsBefore = await setCount(world, world.siteA);
        feed.setFault(fault);
        feed.resetRequestCount();
        try {
          const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/feed/fetch`, { stationId: 'SKN-01' });
          expect(answer.status).toBe(503);
          const error = apiErrorSchema.parse(answer.json).error;
          expect(error.message).toContain('after 3 tries');
          expect(error.message).toContain(`keeps its active set (version ${activeBefore!.version})`);
        } finally {
          feed.setFault('none');
        }
        expect(feed.requestCount()).toBe(3);
        const refreshes = feedRefreshListSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/feed/refreshes`)).json).refreshes;
        expect(refreshes.slice(0, 3).map((r) => [r.attempt, r.ok, r.errorCode, r.stationId])).toEqual([
          [3, false, code, 'SKN-01'],
          [2, false, code, 'SKN-01'],
          [1, false, code, 'SKN-01'],
        ]);
        const activeAfter = activeSetSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/active`)).json).set;
        expect(activeAfter?.id).toBe(activeBefore!.id);
        expect(await setCount(world, world.siteA)).toBe(setsBefore);
      });
    }

    it('does not retry a refused API key, and records the one failure', async () => {
      const siteId = await newSite(world, 'Key test line');
      const wrongKey = createTideFeedClient({ baseUrl: feed.url, apiKey: 'wrong-key', timeoutMs: 300 });
      feed.resetRequestCount();
      await expect(refreshSiteTidesFromFeed({ db: world.database.db, feed: wrongKey, feedRetry: { attempts: 3, backoffMs: 1 } }, world.orgA, siteId, null)).rejects.toMatchObject({ status: 503 });
      expect(feed.requestCount()).toBe(1);
      const rows = await world.database.db.selectFrom('tide_feed_refreshes').select(['ok', 'error_code']).where('site_id', '=', siteId).execute();
      expect(rows).toEqual([{ ok: false, error_code: 'unauthorised' }]);
    });

    it('succeeds on a later try when the feed recovers, as a scheduled refresh with no actor', async () => {
      const siteId = await newSite(world, 'Recovery line');
      const flaky = createTideFeedClient({ baseUrl: feed.url, apiKey: KEY, timeoutMs: 300 });
      feed.setFault('error');
      const recover = setTimeout(() => feed.setFault('none'), 60);
      try {
        const result = await refreshSiteTidesFromFeed({ db: world.database.db, feed: flaky, feedRetry: { attempts: 3, backoffMs: 100 } }, world.orgA, siteId, null);
        expect(result.outcome).toBe('created');
        expect(result.attempts).toBeGreaterThan(1);
        expect(result.set).toMatchObject({ version: 1, createdBy: null, active: true });
      } finally {
        clearTimeout(recover);
        feed.setFault('none');
      }
      const rows = await world.database.db.selectFrom('tide_feed_refreshes').select(['attempt', 'ok']).where('site_id', '=', siteId).orderBy('id').execute();
      expect(rows.at(-1)).toMatchObject({ ok: true });
      expect(rows.slice(0, -1).every((r) => !r.ok)).toBe(true);
    });
  });

  describe('constituent table uploads', () => {
    const GOOD = ['name,amplitude,phase_deg', 'M2,1.31,150.5', 'S2,0.47,183', 'K1,0.27,78', 'O1,0.22,328'].join('\n');

    it('stores a level table as a new version that keeps the active current constituents', async () => {
      const manager = await world.as('managerA');
      const activeBefore = activeSetSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/active`)).json).set!;
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, GOOD, { kind: 'level', datumM: '2.35' }, 'harbour.csv');
      expect(answer.status).toBe(201);
      const set = constituentSetSchema.parse(answer.json);
      expect(set).toMatchObject({ source: 'upload', kind: 'both', label: 'harbour.csv', active: true, basedOnSetId: activeBefore.id });
      expect(set.level).toEqual({ datumM: 2.35, constituents: [
        { name: 'M2', amplitude: 1.31, phaseDeg: 150.5 },
        { name: 'S2', amplitude: 0.47, phaseDeg: 183 },
        { name: 'K1', amplitude: 0.27, phaseDeg: 78 },
        { name: 'O1', amplitude: 0.22, phaseDeg: 328 },
      ] });
      expect(set.current).toEqual(activeBefore.current);
    });

    it('reads a current table with units in the header and a kind column', async () => {
      const manager = await world.as('managerA');
      const csv = ['Constituent;Kind;Major (cm/s);Phase (deg);Minor (cm/s);Inclination (deg)', 'm2;current;31.5;140;2;35', 'S2;current;10.2;172;0.5;37'].join('\r\n');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, csv, { activate: 'false' });
      expect(answer.status).toBe(201);
      const set = constituentSetSchema.parse(answer.json);
      expect(set.active).toBe(false);
      // cm/s read as m/s / 100; the canonical spelling M2 is stored; the axis is the inclination of the largest.
      expect(set.current).toEqual({ axisDeg: 35, constituents: [
        { name: 'M2', major: 0.315, phaseDeg: 140, minor: 0.02, inclinationDeg: 35 },
        { name: 'S2', major: 0.102, phaseDeg: 172, minor: 0.005, inclinationDeg: 37 },
      ] });
    });

    it('refuses a table with bad rows, naming row and column of each problem, and stores nothing', async () => {
      const manager = await world.as('managerA');
      const before = await setCount(world, world.siteA);
      const csv = ['name,amplitude,phase_deg', 'M2,1.2,150', 'X9,0.4,10', 'S2,"0,42",183', 'K1,-0.1,78', 'M2,1.1,151', 'O1,0.2'].join('\n');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, csv, { kind: 'level' });
      expect(answer.status).toBe(400);
      const error = apiErrorSchema.parse(answer.json).error;
      expect(error.code).toBe('validation_failed');
      expect(error.message).toContain('Nothing was stored');
      const problems = uploadProblemSchema.array().parse(error.details);
      expect(problems.map((p) => [p.row, p.column])).toEqual([
        [7, null],
        [3, 'name'],
        [4, 'amplitude'],
        [5, 'amplitude'],
        [6, 'name'],
      ]);
      expect(problems[2]!.message).toContain('write decimals with a point');
      expect(problems[4]!.message).toContain('also row 2');
      expect(problems[0]!.message).toContain('has 2 fields but the header has 3');
      expect(await setCount(world, world.siteA)).toBe(before);
    });

    it('reports a constituent given twice, with both rows', async () => {
      const manager = await world.as('managerA');
      const csv = ['name,amplitude,phase_deg', 'M2,1.2,150', 'S2,0.4,183', 'm2,1.1,151'].join('\n');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, csv, { kind: 'level' });
      expect(answer.status).toBe(400);
      const [problem] = uploadProblemSchema.array().parse(apiErrorSchema.parse(answer.json).error.details);
      expect(problem).toMatchObject({ row: 4, column: 'name' });
      expect(problem!.message).toContain('also row 2');
    });

    it('refuses a table without a phase column and says which names are accepted', async () => {
      const manager = await world.as('managerA');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, 'name,amplitude\nM2,1', { kind: 'level' });
      expect(answer.status).toBe(400);
      const [problem] = uploadProblemSchema.array().parse(apiErrorSchema.parse(answer.json).error.details);
      expect(problem).toMatchObject({ row: 1, column: 'phase_deg' });
      expect(problem!.message).toContain('phase_deg, phase');
    });

    it('refuses a file over the size limit with 413', async () => {
      const manager = await world.as('managerA');
      const big = `name,amplitude,phase_deg\n${'M2,1,1\n'.repeat(1_300_000)}`;
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, big, { kind: 'level' });
      expect(answer.status).toBe(413);
    });

    it('refuses an upload without a file', async () => {
      const manager = await world.as('managerA');
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/uploads/constituents`, { kind: 'level' });
      expect(answer.status).toBe(400);
      expect(apiErrorSchema.parse(answer.json).error.message).toContain('form field "file"');
    });

    it('lets crew read the sets but not upload', async () => {
      const crew = await world.as('crewA');
      expect((await crew.api(world.baseUrl, 'GET', `${tidesPath(world)}/sets`)).status).toBe(200);
      expect((await uploadCsv(crew, world.baseUrl, `${tidesPath(world)}/uploads/constituents`, GOOD, { kind: 'level' })).status).toBe(403);
    });
  });

  describe('record analysis', () => {
    // The generating ellipses; inclinations in [0°, 180°), the range the analysis reports.
    const TRUTH: CurrentConstituent[] = [
      { name: 'M2', major: 0.3, minor: 0.03, inclinationDeg: 40, phaseDeg: 120 },
      { name: 'S2', major: 0.1, minor: 0.01, inclinationDeg: 42, phaseDeg: 150 },
      { name: 'N2', major: 0.06, minor: 0.004, inclinationDeg: 38, phaseDeg: 100 },
      { name: 'K1', major: 0.07, minor: -0.01, inclinationDeg: 45, phaseDeg: 80 },
      { name: 'O1', major: 0.05, minor: 0.005, inclinationDeg: 35, phaseDeg: 330 },
      { name: 'M4', major: 0.03, minor: 0.002, inclinationDeg: 40, phaseDeg: 200 },
    ];
    const START = Date.parse('2026-01-05T00:00:00Z');

    /** 30 days at 10 min with N(0, 0.01 m/s) noise on u and v, a 12-hour gap and 5 % of rows missing. */
    function syntheticRecord(days: number, format: 'uv' | 'speed-direction') {
      const times = regularTimes(START, START + days * DAY, 10 * MINUTE);
      const predicted = predictCurrent(TRUTH, times);
      if (!predicted.ok) throw new Error(predicted.message);
      const uniform = seededRandom(20261201);
      const noise = gaussian(uniform);
      const lines = [format === 'uv' ? 'time,u,v' : 'time,zone,speed_m_s,direction_deg'];
      const gapStart = START + 11 * DAY;
      for (let i = 0; i < times.length; i++) {
        const t = times[i]!;
        if ((t >= gapStart && t < gapStart + 12 * HOUR) || uniform() < 0.05) continue;
        const u = predicted.east![i]! + 0.01 * noise();
        const v = predicted.north![i]! + 0.01 * noise();
        if (format === 'uv') lines.push(`${new Date(t).toISOString()},${u.toFixed(5)},${v.toFixed(5)}`);
        else {
          // January in London is GMT: the local time equals UTC; the zone column says so.
          const local = new Date(t).toISOString().slice(0, 19);
          const direction = ((Math.atan2(u, v) * 180) / Math.PI + 360) % 360;
          lines.push(`${local},Europe/London,${Math.hypot(u, v).toFixed(5)},${direction.toFixed(3)}`);
        }
      }
      return lines.join('\n');
    }

    function expectTruth(fitted: { name: string; major: number; phaseDeg: number; inclinationDeg?: number }[]) {
      // Must-show 4's tolerances: amplitudes within 2 %, phases within 2° (the record is synthetic:
      // made with predictCurrent from TRUTH, so TRUTH is the reference).
      for (const truth of TRUTH) {
        const found = fitted.find((c) => c.name === truth.name);
        expect(found, truth.name).toBeDefined();
        expect(Math.abs(found!.major - truth.major) / truth.major, `${truth.name} major`).toBeLessThan(0.02);
        const dPhase = ((found!.phaseDeg - truth.phaseDeg + 540) % 360) - 180;
        expect(Math.abs(dPhase), `${truth.name} phase`).toBeLessThan(2);
        expect(Math.abs(found!.inclinationDeg! - truth.inclinationDeg!), `${truth.name} inclination`).toBeLessThan(2);
      }
    }

    it('fits a 30-day current record of u and v and shows observed against predicted', async () => {
      const manager = await world.as('managerA');
      const before = await setCount(world, world.siteA);
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/analyses`, syntheticRecord(30, 'uv'), {}, 'adcp-jan.csv');
      expect(answer.status).toBe(200);
      const analysis = analysisResultSchema.parse(answer.json);
      expect(analysis.kind).toBe('current');
      expectTruth(analysis.current!.constituents);
      // 30 days cannot separate K2 from S2 nor P1 from K1 (Rayleigh: 182.6 days each, IHO speeds).
      expect(analysis.fit.dropped.map((d) => d.name).sort()).toEqual(['K2', 'P1']);
      expect(analysis.fit.varianceExplained).toBeGreaterThan(0.99);
      expect(analysis.fit.missingFraction).toBeGreaterThan(0.05);
      const residuals = analysis.series.residual.filter((r): r is number => r !== null);
      const rms = Math.sqrt(residuals.reduce((s, r) => s + r * r, 0) / residuals.length);
      // Along-axis residual is the along-axis share of the N(0, 0.01) noise: rms ≈ 0.01 m/s.
      expect(rms).toBeGreaterThan(0.007);
      expect(rms).toBeLessThan(0.013);
      expect(analysis.series.observed.length).toBeLessThanOrEqual(1500);
      expect(await setCount(world, world.siteA)).toBe(before);
    });

    it('saves the fit of a speed-and-direction record with a zone column as a versioned analysis set', async () => {
      const manager = await world.as('managerA');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/sets/from-record`, syntheticRecord(30, 'speed-direction'), { label: 'ADCP January' }, 'adcp.csv');
      expect(answer.status).toBe(201);
      const { set } = setFromRecordResultSchema.parse(answer.json);
      expect(set).toMatchObject({ source: 'analysis', label: 'ADCP January', active: true, kind: 'both' });
      expectTruth(set.current!.constituents);
      expect(set.fit).toMatchObject({ recordKind: 'current', fileName: 'adcp.csv' });
      expect(set.fit!.spanHours).toBeCloseTo(30 * 24, -1);
      expect(set.current!.axisDeg).toBeCloseTo(40, 0);
    });

    it('refuses a record whose times have no zone, naming the row, and stores nothing', async () => {
      const manager = await world.as('managerA');
      const before = await setCount(world, world.siteA);
      const csv = ['time,level', '2026-01-05T00:00:00Z,1.2', '2026-01-05 00:10:00,1.3', '2026-01-05T00:20:00+01:00,abc'].join('\n');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/sets/from-record`, csv);
      expect(answer.status).toBe(400);
      const problems = uploadProblemSchema.array().parse(apiErrorSchema.parse(answer.json).error.details);
      expect(problems.map((p) => [p.row, p.column])).toEqual([
        [3, 'time'],
        [4, 'level'],
      ]);
      expect(problems[0]!.message).toContain('has no time zone');
      expect(await setCount(world, world.siteA)).toBe(before);
    });

    it('refuses a record too short to analyse and says why', async () => {
      const manager = await world.as('managerA');
      const csv = ['time,level', ...Array.from({ length: 30 }, (_, i) => `${new Date(START + i * 10 * MINUTE).toISOString()},${Math.cos(i / 10).toFixed(3)}`)].join('\n');
      const answer = await uploadCsv(manager, world.baseUrl, `${tidesPath(world)}/analyses`, csv);
      expect(answer.status).toBe(400);
      expect(apiErrorSchema.parse(answer.json).error.message).toMatch(/cannot be analysed: the record spans 4\.8 h; at least 24\.0 h are needed/);
    });
  });

  describe('activation and preview', () => {
    it('activates an older version and records it in the audit log', async () => {
      const manager = await world.as('managerA');
      const list = constituentSetListSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/sets`)).json);
      const first = list.sets.find((s) => s.version === 1)!;
      const answer = await manager.api(world.baseUrl, 'POST', `${tidesPath(world)}/sets/${first.id}/activate`);
      expect(answer.status).toBe(200);
      expect(constituentSetSchema.parse(answer.json).active).toBe(true);
      const active = activeSetSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world)}/active`)).json).set;
      expect(active?.id).toBe(first.id);
      const owner = await world.as('ownerA');
      const audit = (await owner.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/audit`)).json as { events: { action: string }[] };
      expect(audit.events.map((e) => e.action)).toEqual(expect.arrayContaining(['tides.set_created', 'tides.set_activated']));
    });

    it('answers a preview of null for a site without an active set', async () => {
      const manager = await world.as('managerA');
      const siteId = await newSite(world, 'Empty line');
      const answer = previewAnswerSchema.parse((await manager.api(world.baseUrl, 'GET', `${tidesPath(world, siteId)}/preview`)).json);
      expect(answer.preview).toBeNull();
    });

    it('marks slack water in the 7-day preview within 2 minutes of the zero crossings of @neaps/tide-predictor', async () => {
      // Reference: the along-axis current from @neaps/tide-predictor 0.11.0 (Schureman nodal option),
      // every 60 s, zero crossings by linear interpolation (must-show 5's tolerance, 2 minutes).
      const manager = await world.as('managerA');
      const siteId = await newSite(world, 'Preview line');
      const current = [
        { name: 'M2', major: 0.3, phaseDeg: 100 },
        { name: 'S2', major: 0.1, phaseDeg: 140 },
        { name: 'K1', major: 0.06, phaseDeg: 80 },
        { name: 'O1', major: 0.05, phaseDeg: 330 },
        { name: 'M4', major: 0.02, phaseDeg: 200 },
      ];
      const level = { datumM: 2.2, constituents: [{ name: 'M2', amplitude: 1.2, phaseDeg: 90 }, { name: 'S2', amplitude: 0.4, phaseDeg: 125 }, { name: 'K1', amplitude: 0.2, phaseDeg: 70 }, { name: 'O1', amplitude: 0.15, phaseDeg: 320 }] };
      const created = await manager.api(world.baseUrl, 'POST', `${tidesPath(world, siteId)}/sets`, { label: 'Typed in', current: { axisDeg: 30, constituents: current }, level });
      expect(created.status).toBe(201);
      expect(constituentSetSchema.parse(created.json)).toMatchObject({ source: 'manual', kind: 'both', active: true });

      const start = '2026-03-02T00:00:00.000Z';
      const crew = await world.as('crewA');
      const answer = await crew.api(world.baseUrl, 'GET', `${tidesPath(world, siteId)}/preview?start=${start}&days=7`);
      expect(answer.status).toBe(200);
      const preview = previewAnswerSchema.parse(answer.json).preview!;
      expect(preview.times).toHaveLength(7 * 144 + 1);
      expect(preview.end).toBe('2026-03-09T00:00:00.000Z');

      const startMs = Date.parse(start);
      const reference = createTidePredictor(current.map((c) => ({ name: c.name, amplitude: c.major, phase: c.phaseDeg })), { nodeCorrections: 'schureman' }).getTimelinePrediction({
        start: new Date(startMs),
        end: new Date(startMs + 7 * DAY),
        timeFidelity: 60,
      });
      const zeros = crossings(reference.map((p) => p.time.getTime()), reference.map((p) => p.level));
      const slacks = preview.current!.slacks.map((s) => Date.parse(s.time));
      expect(slacks.length).toBe(zeros.length);
      slacks.forEach((t, k) => expect(Math.abs(t - zeros[k]!)).toBeLessThan(2 * MINUTE));
      // About four slacks a day for a mainly semidiurnal current (two per M2 cycle of 12.42 h).
      expect(slacks.length).toBeGreaterThanOrEqual(26);
      expect(preview.level!.highLow.length).toBeGreaterThanOrEqual(26);
      expect(preview.formFactor).toMatchObject({ of: 'current', type: 'mixed, mainly semidiurnal' });
    });

    it('keeps the sets of organisation B out of reach of organisation A', async () => {
      const ownerA = await world.as('ownerA');
      expect((await ownerA.api(world.baseUrl, 'GET', `/orgs/${world.orgA}/sites/${world.siteB}/tides/sets`)).status).toBe(404);
      expect((await ownerA.api(world.baseUrl, 'GET', `/orgs/${world.orgB}/sites/${world.siteB}/tides/sets`)).status).toBe(404);
    });
  });
});
