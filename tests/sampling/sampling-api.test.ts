import ICAL from 'ical.js';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notifyOnStored } from '../../server/forecasts/notify.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { dayAdviceSchema } from '../../shared/forecast/advice.ts';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';
import { forecastSettingsSchema, overviewSchema, plannedSampleListSchema, plannedSampleSchema, type PlannedSample } from '../../shared/schemas/sampling.schema.ts';
import { SITE_CURRENT } from '../helpers/forecast-fixture.ts';
import { startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

const BOTTLE = { plannedAt: '2026-12-02T10:30:00Z', method: 'bottle', depthM: 12.5, reason: 'Near-bed check after the slack' };
const HOSE = { plannedAt: '2026-12-02T14:00:00Z', method: 'hose', topM: 0, bottomM: 10, reason: 'Weekly integrated sample, "upper column", 0–10 m' };

describe('sampling plan API', () => {
  let world: TeamWorld;
  let forecastId: string;
  const base = () => `/orgs/${world.orgA}`;
  const api = async (who: string, method: string, path: string, body?: unknown) => (await world.as(who)).api(world.baseUrl, method, path, body);
  const count = async () => Number((await world.database.db.selectFrom('planned_samples').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);
  const text = async (who: string, path: string) => {
    const response = await (await world.as(who)).request(`${world.baseUrl}/api${path}`);
    return { status: response.status, type: response.headers.get('content-type') ?? '', body: await response.text() };
  };

  beforeAll(async () => {
    world = await startTeamWorld();
    // A real forecast of organisation A's site, and a subscription that unlocks it.
    const db = world.database.db;
    const set = await db
      .insertInto('constituent_sets')
      .values({ organisation_id: world.orgA, site_id: world.siteA, version: 1, source: 'manual', kind: 'current', current_constituents: JSON.stringify(SITE_CURRENT.constituents), current_axis_deg: SITE_CURRENT.axisDeg })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.updateTable('sites').set({ active_constituent_set_id: set.id }).where('id', '=', world.siteA).execute();
    const profile = await db.insertInto('organism_profiles').values({ organisation_id: world.orgA, name: 'Heavy cyst', taxon: 'Alexandrium sp.' }).returning('id').executeTakeFirstOrThrow();
    const version = await db
      .insertInto('organism_profile_versions')
      .values({ profile_id: profile.id, organisation_id: world.orgA, version: 1, params: JSON.stringify(organismParamsSchema.parse({ settlingVelocityMPerDay: 8, initialCellsPerL: 2000, triggerCellsPerL: 500 })) })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.insertInto('site_organisms').values({ site_id: world.siteA, profile_id: profile.id }).execute();
    const run = await db
      .insertInto('forecast_runs')
      .values({ organisation_id: world.orgA, site_id: world.siteA, profile_version_id: version.id, constituent_set_id: set.id, forecast_start: new Date('2026-12-01T00:00:00Z'), horizon_days: 3, trigger: 'manual' })
      .returning('id')
      .executeTakeFirstOrThrow();
    await runForecastJob({ db, tides: siteTideSource({ db }), onStored: notifyOnStored({ db, appBaseUrl: world.baseUrl }) }, run.id);
    forecastId = (await db.selectFrom('forecasts').select('id').where('run_id', '=', run.id).executeTakeFirstOrThrow()).id;
  }, 120_000);
  afterAll(async () => {
    await world?.close();
  });

  it('lets a manager plan a bottle sample and everyone in the organisation read it', async () => {
    const created = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, BOTTLE);
    expect(created.status).toBe(201);
    const sample = plannedSampleSchema.parse(created.json);
    expect(sample).toMatchObject({ siteId: world.siteA, siteName: 'Alder north line', method: 'bottle', depthM: 12.5, topM: null, plannedAt: '2026-12-02T10:30:00.000Z', takenAt: null });
    expect(sample.createdBy?.displayName).toBe('managerA');
    for (const who of ['crewA', 'biologistA', 'ownerA']) {
      const list = plannedSampleListSchema.parse((await api(who, 'GET', `${base()}/samples?siteId=${world.siteA}`)).json);
      expect(list.samples.map((s) => s.id)).toContain(sample.id);
    }
  });

  it('refuses crew and biologists planning a sample, and changes nothing', async () => {
    const before = await count();
    for (const who of ['crewA', 'biologistA']) expect((await api(who, 'POST', `${base()}/sites/${world.siteA}/samples`, HOSE)).status).toBe(403);
    expect(await count()).toBe(before);
  });

  it('answers 400 naming the field for a hose without a bottom, and stores nothing', async () => {
    const before = await count();
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, { ...HOSE, bottomM: undefined });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain('bottomM: a hose sample needs the bottom of its range');
    expect(await count()).toBe(before);
  });

  it('answers 400 naming the field for a bottle deeper than the water, and stores nothing', async () => {
    const before = await count();
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, { ...BOTTLE, depthM: 40 });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain("depthM: must not be deeper than the site's water depth (15 m)");
    expect(await count()).toBe(before);
  });

  it('answers 400 naming the field for a time without an offset, and stores nothing', async () => {
    const before = await count();
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, { ...BOTTLE, plannedAt: 'tomorrow morning' });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain('plannedAt');
    expect(await count()).toBe(before);
  });

  it("never plans a sample at another organisation's site", async () => {
    const before = await count();
    expect((await api('managerA', 'POST', `${base()}/sites/${world.siteB}/samples`, BOTTLE)).status).toBe(404);
    expect(await count()).toBe(before);
  });

  it('lets a manager change a planned sample from bottle to hose, dropping the bottle depth', async () => {
    const sample = plannedSampleSchema.parse((await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, BOTTLE)).json);
    const changed = await api('managerA', 'PATCH', `${base()}/samples/${sample.id}`, { method: 'hose', topM: 2, bottomM: 8 });
    expect(changed.status).toBe(200);
    expect(plannedSampleSchema.parse(changed.json)).toMatchObject({ method: 'hose', depthM: null, topM: 2, bottomM: 8, reason: BOTTLE.reason });
  });

  it('refuses an edit whose merged sample is inconsistent, naming the field and changing nothing', async () => {
    const sample = plannedSampleSchema.parse((await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, HOSE)).json);
    const answer = await api('managerA', 'PATCH', `${base()}/samples/${sample.id}`, { topM: 11 });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain('bottomM: hose bottom must be deeper than hose top');
    const after = plannedSampleSchema.parse((await api('managerA', 'GET', `${base()}/samples/${sample.id}`)).json);
    expect(after.topM).toBe(0);
    expect(after.updatedAt).toBe(sample.updatedAt);
  });

  it('lets crew mark a sample taken, recording who and when, once', async () => {
    const sample = plannedSampleSchema.parse((await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, HOSE)).json);
    const taken = await api('crewA', 'POST', `${base()}/samples/${sample.id}/taken`, { takenAt: '2026-12-02T14:12:00Z', notes: 'Calm, 9.5 m hose' });
    expect(taken.status).toBe(200);
    expect(plannedSampleSchema.parse(taken.json)).toMatchObject({ takenAt: '2026-12-02T14:12:00.000Z', takenBy: { id: world.userIds.crewA, displayName: 'crewA' }, notes: 'Calm, 9.5 m hose' });
    expect((await api('crewA', 'POST', `${base()}/samples/${sample.id}/taken`, {})).status).toBe(409);
    // A taken sample is a record: neither changed nor deleted.
    expect((await api('managerA', 'PATCH', `${base()}/samples/${sample.id}`, { reason: 'rewritten' })).status).toBe(409);
    expect((await api('managerA', 'DELETE', `${base()}/samples/${sample.id}`)).status).toBe(409);
  });

  it('lets a manager delete a planned sample, and records every change in the audit log', async () => {
    const sample = plannedSampleSchema.parse((await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples`, BOTTLE)).json);
    expect((await api('crewA', 'DELETE', `${base()}/samples/${sample.id}`)).status).toBe(403);
    expect((await api('managerA', 'DELETE', `${base()}/samples/${sample.id}`)).status).toBe(204);
    expect((await api('managerA', 'GET', `${base()}/samples/${sample.id}`)).status).toBe(404);
    const audit = (await api('ownerA', 'GET', `${base()}/audit`)).json as { events: { action: string }[] };
    const actions = new Set(audit.events.map((e) => e.action));
    for (const action of ['sample.planned', 'sample.changed', 'sample.taken', 'sample.deleted']) expect(actions).toContain(action);
  });

  it('locks "add from advice" until the organisation subscribes', async () => {
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples/from-advice`, { forecastId });
    expect(answer.status).toBe(402);
    await world.database.db
      .insertInto('billing_accounts')
      .values({ organisation_id: world.orgA, customer_id: 'cus_sampling', subscription_id: 'sub_sampling', status: 'active', plan_id: 'longline', quantity: 1 })
      .execute();
  });

  it("turns one day's advice into planned samples with the advice's times, depths and reasons, once", async () => {
    const forecast = (await api('managerA', 'GET', `${base()}/forecasts/${forecastId}`)).json as { advice: unknown[] };
    const day = dayAdviceSchema.parse(forecast.advice[1]);
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples/from-advice`, { forecastId, dates: [day.date] });
    expect(answer.status).toBe(201);
    const { samples, skipped } = answer.json as { samples: PlannedSample[]; skipped: number };
    expect(skipped).toBe(0);
    expect(samples).toHaveLength(1 + day.worstCase.length);
    const rep = samples.find((s) => s.adviceKind === 'representative')!;
    expect(rep).toMatchObject({ method: 'hose', topM: day.representative.topM, bottomM: day.representative.bottomM, reason: day.representative.reason, forecastId });
    expect(Math.abs(Date.parse(rep.plannedAt) - day.representative.timeMs)).toBeLessThanOrEqual(30_000);
    for (const worst of day.worstCase) {
      const planned = samples.find((s) => s.adviceKind === worst.kind)!;
      expect(planned.method).toBe(worst.method);
      if (worst.method === 'bottle') expect(planned.depthM).toBe(worst.depthM);
    }
    const again = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples/from-advice`, { forecastId, dates: [day.date] });
    expect(again.json).toMatchObject({ samples: [], skipped: samples.length });
  });

  it('answers 400 naming the field for a forecast of another site, and stores nothing', async () => {
    const before = await count();
    const answer = await api('managerA', 'POST', `${base()}/sites/${world.siteA}/samples/from-advice`, { forecastId: '00000000-0000-4000-8000-000000000000' });
    expect(answer.status).toBe(400);
    expect(apiErrorSchema.parse(answer.json).error.message).toContain('forecastId');
    expect(await count()).toBe(before);
  });

  it('exports the plan as a calendar that a general-purpose iCalendar parser reads, one stable UID per sample, times in UTC', async () => {
    const first = await text('crewA', `${base()}/samples.ics?siteId=${world.siteA}`);
    expect(first.status).toBe(200);
    expect(first.type).toContain('text/calendar');
    // RFC 5545 §3.1: content lines end with CRLF.
    expect(first.body.split('\r\n')[0]).toBe('BEGIN:VCALENDAR');
    // Parsed by ical.js (a general-purpose iCalendar library).
    const calendar = new ICAL.Component(ICAL.parse(first.body));
    const events = calendar.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    const samples = plannedSampleListSchema.parse((await api('crewA', 'GET', `${base()}/samples?siteId=${world.siteA}`)).json).samples;
    expect(events).toHaveLength(samples.length);
    for (const sample of samples) {
      const event = events.find((e) => e.uid === `${sample.id}@planktide.sampling`);
      expect(event, `event of sample ${sample.id}`).toBeDefined();
      expect(event!.startDate.toJSDate().toISOString()).toBe(sample.plannedAt);
      expect(event!.startDate.zone?.tzid).toBe('UTC');
      expect(event!.description).toContain('Site time zone: Europe/London');
      expect(event!.description).toContain('below surface');
    }
    const second = await text('crewA', `${base()}/samples.ics?siteId=${world.siteA}`);
    const uids = (body: string) => new ICAL.Component(ICAL.parse(body)).getAllSubcomponents('vevent').map((v) => new ICAL.Event(v).uid).sort();
    expect(uids(second.body)).toEqual(uids(first.body));
  });

  it('exports the plan as RFC 4180 CSV with a header and one row per sample, quoting text with commas and quotes', async () => {
    const csv = await text('crewA', `${base()}/samples.csv?siteId=${world.siteA}`);
    expect(csv.status).toBe(200);
    expect(csv.body.endsWith('\r\n')).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(csv.body.trimEnd(), { header: true, newline: '\r\n' });
    expect(parsed.errors).toEqual([]);
    const samples = plannedSampleListSchema.parse((await api('crewA', 'GET', `${base()}/samples?siteId=${world.siteA}`)).json).samples;
    expect(parsed.data).toHaveLength(samples.length);
    const hose = parsed.data.find((row) => row.reason === HOSE.reason);
    expect(hose).toMatchObject({ method: 'hose', top_m_below_surface: '0', bottom_m_below_surface: '10', time_zone: 'Europe/London' });
    expect(csv.body).toContain('"Weekly integrated sample, ""upper column"", 0–10 m"');
  });

  it('lets a manager set the forecast time, horizon and window settings of a site, refusing a bad horizon by name', async () => {
    const bad = await api('managerA', 'PUT', `${base()}/sites/${world.siteA}/forecast-settings`, { forecastLocalTime: '05:30', forecastHorizonDays: 9, windowSettings: {} });
    expect(bad.status).toBe(400);
    expect(apiErrorSchema.parse(bad.json).error.message).toContain('forecastHorizonDays: horizon must be at most 7 days');
    expect(forecastSettingsSchema.parse((await api('crewA', 'GET', `${base()}/sites/${world.siteA}/forecast-settings`)).json).forecastHorizonDays).toBe(3);
    const good = await api('managerA', 'PUT', `${base()}/sites/${world.siteA}/forecast-settings`, { forecastLocalTime: '05:30', forecastHorizonDays: 5, windowSettings: { slackSpeedMPerS: 0.08 } });
    expect(good.status).toBe(200);
    const read = forecastSettingsSchema.parse((await api('crewA', 'GET', `${base()}/sites/${world.siteA}/forecast-settings`)).json);
    expect(read).toMatchObject({ forecastLocalTime: '05:30', forecastHorizonDays: 5, windowSettings: { slackSpeedMPerS: 0.08, slumpRatio: 2 } });
    expect((await api('crewA', 'PUT', `${base()}/sites/${world.siteA}/forecast-settings`, { forecastLocalTime: '05:30', forecastHorizonDays: 5, windowSettings: {} })).status).toBe(403);
  });

  it("shows each site's latest forecast, its windows of today and tomorrow and the open alerts in the overview", async () => {
    const answer = overviewSchema.parse((await api('crewA', 'GET', `${base()}/overview`)).json);
    expect(answer.forecastsUnlocked).toBe(true);
    const site = answer.sites.find((s) => s.id === world.siteA)!;
    expect(site.forecasts.map((f) => f.forecastId)).toEqual([forecastId]);
    const start = Date.parse(site.todayStart);
    const end = Date.parse(site.tomorrowEnd);
    for (const w of site.forecasts[0]!.windows) expect(w.endMs > start && w.startMs < end).toBe(true);
    const text = JSON.stringify(answer);
    expect(text).not.toContain(world.siteB);
  });
});
