import { createHash, randomBytes } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { notifyOnStored } from '../../server/forecasts/notify.ts';
import { runForecastJob } from '../../server/forecasts/run-forecast.ts';
import { siteTideSource } from '../../server/forecasts/site-tide-source.ts';
import { organismParamsSchema } from '../../shared/schemas/organism.schema.ts';
import { Browser } from '../helpers/browser.ts';
import { SITE_VALUES, startTeamWorld, type TeamWorld } from '../helpers/team-world.ts';

type Subject = 'anonymous' | 'ownerB' | 'crewA' | 'biologistA' | 'managerA' | 'ownerA';
/** Least privileged first, so that the owner's destructive call (if allowed) comes last. */
const SUBJECTS: Subject[] = ['anonymous', 'ownerB', 'crewA', 'biologistA', 'managerA', 'ownerA'];

interface RouteCase {
  /** The route as declared: METHOD and path under /api. */
  route: string;
  /** The concrete path for one call (may set up data first). */
  path: (w: TeamWorld) => string | Promise<string>;
  body?: unknown | ((w: TeamWorld) => unknown);
  expect: Record<Subject, number>;
}

const SITE_BODY = { name: 'New line', latitudeDeg: 57.2, longitudeDeg: -6.1, timeZone: 'Europe/London', waterDepthM: 12, bedType: 'mud', gearTopM: 1, gearBottomM: 6 };
let siteCounter = 0;

async function pendingInvitation(w: TeamWorld, email: string): Promise<{ id: string; token: string }> {
  const token = randomBytes(32).toString('base64url');
  const row = await w.database.db
    .insertInto('invitations')
    .values({ organisation_id: w.orgA, email, role: 'crew', token_hash: createHash('sha256').update(token).digest('hex'), invited_by: w.userIds.ownerA, expires_at: new Date(Date.now() + 3600_000) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { id: row.id, token };
}

async function spareMember(w: TeamWorld): Promise<string> {
  const user = await w.database.db.insertInto('users').values({ email: `spare${siteCounter++}@alder.test`, display_name: 'Spare' }).returning('id').executeTakeFirstOrThrow();
  await w.database.db.insertInto('memberships').values({ organisation_id: w.orgA, user_id: user.id, role: 'crew' }).execute();
  return user.id;
}

async function spareSite(w: TeamWorld): Promise<string> {
  return (await w.database.db.insertInto('sites').values({ ...SITE_VALUES, organisation_id: w.orgA, name: `Spare ${siteCounter++}` }).returning('id').executeTakeFirstOrThrow()).id;
}

const scientists = (status: number): Record<Subject, number> => ({ anonymous: 401, ownerB: 404, crewA: 403, biologistA: status, managerA: status, ownerA: status });

async function spareSet(w: TeamWorld): Promise<string> {
  const db = w.database.db;
  const latest = await db.selectFrom('constituent_sets').select((eb) => eb.fn.max('version').as('v')).where('site_id', '=', w.siteA).executeTakeFirst();
  const row = await db
    .insertInto('constituent_sets')
    .values({ organisation_id: w.orgA, site_id: w.siteA, version: Number(latest?.v ?? 0) + 1, source: 'manual', kind: 'current', current_constituents: JSON.stringify([{ name: 'M2', major: 0.3, phaseDeg: 100 }]), current_axis_deg: null })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

let forecastOfA: Promise<{ forecastId: string; profileId: string }> | undefined;
/** One real forecast of organisation A's site (made once): set, profile, run, engine. */
function demoForecast(w: TeamWorld) {
  forecastOfA ??= (async () => {
    const db = w.database.db;
    const setId = await spareSet(w);
    await db.updateTable('sites').set({ active_constituent_set_id: setId }).where('id', '=', w.siteA).execute();
    const profile = await db.insertInto('organism_profiles').values({ organisation_id: w.orgA, name: 'Table diatom', taxon: 'Thalassiosira sp.' }).returning('id').executeTakeFirstOrThrow();
    const version = await db
      .insertInto('organism_profile_versions')
      .values({ profile_id: profile.id, organisation_id: w.orgA, version: 1, params: JSON.stringify(organismParamsSchema.parse({ settlingVelocityMPerDay: 3, initialCellsPerL: 1000, triggerCellsPerL: 500 })) })
      .returning('id')
      .executeTakeFirstOrThrow();
    await db.insertInto('site_organisms').values({ site_id: w.siteA, profile_id: profile.id }).execute();
    const run = await db
      .insertInto('forecast_runs')
      .values({ organisation_id: w.orgA, site_id: w.siteA, profile_version_id: version.id, constituent_set_id: setId, forecast_start: new Date('2026-12-01T00:00:00Z'), horizon_days: 3, trigger: 'manual' })
      .returning('id')
      .executeTakeFirstOrThrow();
    await runForecastJob({ db, tides: siteTideSource({ db }), onStored: notifyOnStored({ db, appBaseUrl: w.baseUrl }) }, run.id);
    const forecast = await db.selectFrom('forecasts').select('id').where('run_id', '=', run.id).executeTakeFirstOrThrow();
    return { forecastId: forecast.id, profileId: profile.id };
  })();
  return forecastOfA;
}

async function spareAlert(w: TeamWorld): Promise<string> {
  const row = await w.database.db.insertInto('alerts').values({ organisation_id: w.orgA, site_id: w.siteA, kind: 'gear_trigger', message: 'test alert' }).returning('id').executeTakeFirstOrThrow();
  return row.id;
}

const tides = (w: TeamWorld) => `/orgs/${w.orgA}/sites/${w.siteA}/tides`;

async function spareCalibration(w: TeamWorld, status: 'queued' | 'failed'): Promise<string> {
  const db = w.database.db;
  const { profileId } = await demoForecast(w);
  const version = await db.selectFrom('organism_profile_versions').select('id').where('profile_id', '=', profileId).orderBy('version').executeTakeFirstOrThrow();
  return (await db.insertInto('calibrations').values({ organisation_id: w.orgA, site_id: w.siteA, profile_version_id: version.id, status }).returning('id').executeTakeFirstOrThrow()).id;
}
const lab = (w: TeamWorld) => `/orgs/${w.orgA}/lab`;

/** A profile of organisation A with one version (a fresh one per call). */
async function spareProfile(w: TeamWorld): Promise<{ profileId: string; versionId: string }> {
  const db = w.database.db;
  const profile = await db.insertInto('organism_profiles').values({ organisation_id: w.orgA, name: `Spare profile ${siteCounter++}`, taxon: 'Skeletonema sp.' }).returning('id').executeTakeFirstOrThrow();
  const version = await db
    .insertInto('organism_profile_versions')
    .values({ profile_id: profile.id, organisation_id: w.orgA, version: 1, params: JSON.stringify(organismParamsSchema.parse({ settlingVelocityMPerDay: 1, initialCellsPerL: 100, triggerCellsPerL: 1000 })) })
    .returning('id')
    .executeTakeFirstOrThrow();
  return { profileId: profile.id, versionId: version.id };
}
async function spareSample(w: TeamWorld): Promise<string> {
  return (await w.database.db.insertInto('planned_samples').values({ organisation_id: w.orgA, site_id: w.siteA, planned_at: new Date('2026-12-02T10:00:00Z'), method: 'bottle', depth_m: 5 }).returning('id').executeTakeFirstOrThrow()).id;
}

const PROFILE_PARAMS = { settlingVelocityMPerDay: 2, initialCellsPerL: 100, triggerCellsPerL: 1000 };

const everyone = (status: number, anonymous = 401): Record<Subject, number> => ({ anonymous, ownerB: status, crewA: status, biologistA: status, managerA: status, ownerA: status });
const members = (status: number): Record<Subject, number> => ({ anonymous: 401, ownerB: 404, crewA: status, biologistA: status, managerA: status, ownerA: status });
const managers = (status: number): Record<Subject, number> => ({ anonymous: 401, ownerB: 404, crewA: 403, biologistA: 403, managerA: status, ownerA: status });
const owners = (status: number): Record<Subject, number> => ({ anonymous: 401, ownerB: 404, crewA: 403, biologistA: 403, managerA: 403, ownerA: status });

export const ROUTE_TABLE: RouteCase[] = [
  { route: 'GET /health', path: () => '/health', expect: everyone(200, 200) },
  { route: 'GET /me', path: () => '/me', expect: everyone(200) },
  { route: 'POST /organisations', path: () => '/organisations', body: { name: 'Side venture' }, expect: everyone(201) },
  { route: 'GET /orgs/:orgId', path: (w) => `/orgs/${w.orgA}`, expect: members(200) },
  // A wrong confirmation name: the owner gets past authorisation to the check (400) and nothing is deleted.
  { route: 'DELETE /orgs/:orgId', path: (w) => `/orgs/${w.orgA}`, body: { confirmName: 'not the name' }, expect: owners(400) },
  { route: 'GET /orgs/:orgId/members', path: (w) => `/orgs/${w.orgA}/members`, expect: managers(200) },
  { route: 'PATCH /orgs/:orgId/members/:userId', path: async (w) => `/orgs/${w.orgA}/members/${await spareMember(w)}`, body: { role: 'biologist' }, expect: owners(204) },
  { route: 'DELETE /orgs/:orgId/members/:userId', path: async (w) => `/orgs/${w.orgA}/members/${await spareMember(w)}`, expect: owners(204) },
  { route: 'GET /orgs/:orgId/invitations', path: (w) => `/orgs/${w.orgA}/invitations`, expect: managers(200) },
  { route: 'POST /orgs/:orgId/invitations', path: (w) => `/orgs/${w.orgA}/invitations`, body: { email: 'deckhand@alder.test', role: 'crew' }, expect: managers(201) },
  { route: 'DELETE /orgs/:orgId/invitations/:invitationId', path: async (w) => `/orgs/${w.orgA}/invitations/${(await pendingInvitation(w, 'x@alder.test')).id}`, expect: managers(204) },
  // Only the invited address may see or accept an invitation; none of these subjects is it (the invitation test covers the invitee).
  { route: 'GET /invitations/:token', path: async (w) => `/invitations/${(await pendingInvitation(w, 'newcomer@alder.test')).token}`, expect: everyone(403) },
  { route: 'POST /invitations/:token/accept', path: async (w) => `/invitations/${(await pendingInvitation(w, 'newcomer@alder.test')).token}/accept`, expect: everyone(403) },
  { route: 'GET /orgs/:orgId/audit', path: (w) => `/orgs/${w.orgA}/audit`, expect: owners(200) },
  { route: 'GET /orgs/:orgId/sites', path: (w) => `/orgs/${w.orgA}/sites`, expect: members(200) },
  { route: 'POST /orgs/:orgId/sites', path: (w) => `/orgs/${w.orgA}/sites`, body: () => ({ ...SITE_BODY, name: `New line ${siteCounter++}` }), expect: managers(201) },
  { route: 'GET /orgs/:orgId/sites/:siteId', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}`, expect: members(200) },
  { route: 'PATCH /orgs/:orgId/sites/:siteId', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}`, body: { gearBottomM: 9 }, expect: managers(200) },
  { route: 'POST /orgs/:orgId/sites/:siteId/archive', path: async (w) => `/orgs/${w.orgA}/sites/${await spareSite(w)}/archive`, expect: managers(200) },

  // Site tides.
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/sets', path: (w) => `${tides(w)}/sets`, expect: members(200) },
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/sets', path: (w) => `${tides(w)}/sets`, body: { current: { axisDeg: null, constituents: [{ name: 'M2', major: 0.3, phaseDeg: 100 }] } }, expect: managers(201) },
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/sets/:setId', path: async (w) => `${tides(w)}/sets/${await spareSet(w)}`, expect: members(200) },
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/sets/:setId/activate', path: async (w) => `${tides(w)}/sets/${await spareSet(w)}/activate`, expect: managers(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/active', path: (w) => `${tides(w)}/active`, expect: members(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/preview', path: (w) => `${tides(w)}/preview`, expect: members(200) },
  // No tide feed in this world: past authorisation the answer is 503.
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/feed/stations', path: (w) => `${tides(w)}/feed/stations`, expect: members(503) },
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/feed/fetch', path: (w) => `${tides(w)}/feed/fetch`, body: {}, expect: managers(503) },
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/feed/refreshes', path: (w) => `${tides(w)}/feed/refreshes`, expect: members(200) },
  // JSON instead of multipart: past authorisation the answer is 400 "attach the CSV in the field file".
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/uploads/constituents', path: (w) => `${tides(w)}/uploads/constituents`, body: { kind: 'level' }, expect: managers(400) },
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/analyses', path: (w) => `${tides(w)}/analyses`, body: {}, expect: managers(400) },
  { route: 'POST /orgs/:orgId/sites/:siteId/tides/sets/from-record', path: (w) => `${tides(w)}/sets/from-record`, body: {}, expect: managers(400) },

  // Organism profiles, watched organisms, forecasts and runs.
  { route: 'GET /orgs/:orgId/profiles', path: (w) => `/orgs/${w.orgA}/profiles`, expect: members(200) },
  {
    route: 'POST /orgs/:orgId/profiles',
    path: (w) => `/orgs/${w.orgA}/profiles`,
    body: () => ({ name: `Profile ${siteCounter++}`, taxon: 'Skeletonema sp.', params: { settlingVelocityMPerDay: 1, initialCellsPerL: 100, triggerCellsPerL: 1000 } }),
    expect: scientists(201),
  },
  { route: 'GET /orgs/:orgId/profiles/:profileId', path: async (w) => `/orgs/${w.orgA}/profiles/${(await spareProfile(w)).profileId}`, expect: members(200) },
  { route: 'PATCH /orgs/:orgId/profiles/:profileId', path: async (w) => `/orgs/${w.orgA}/profiles/${(await spareProfile(w)).profileId}`, body: { params: PROFILE_PARAMS, note: 'faster' }, expect: scientists(200) },
  { route: 'POST /orgs/:orgId/profiles/:profileId/versions', path: async (w) => `/orgs/${w.orgA}/profiles/${(await spareProfile(w)).profileId}/versions`, body: { params: PROFILE_PARAMS, note: 'what-if' }, expect: scientists(201) },
  {
    route: 'GET /orgs/:orgId/profiles/:profileId/versions/:versionId',
    path: async (w) => {
      const { profileId, versionId } = await spareProfile(w);
      return `/orgs/${w.orgA}/profiles/${profileId}/versions/${versionId}`;
    },
    expect: members(200),
  },
  { route: 'POST /orgs/:orgId/profiles/:profileId/archive', path: async (w) => `/orgs/${w.orgA}/profiles/${(await spareProfile(w)).profileId}/archive`, expect: scientists(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/watch', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/watch`, expect: members(200) },
  { route: 'PUT /orgs/:orgId/sites/:siteId/watch', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/watch`, body: async (w: TeamWorld) => ({ profileIds: [(await demoForecast(w)).profileId] }), expect: managers(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/forecasts/latest', path: async (w) => `/orgs/${w.orgA}/sites/${w.siteA}/forecasts/latest?profileId=${(await demoForecast(w)).profileId}`, expect: members(200) },
  { route: 'GET /orgs/:orgId/forecasts/:forecastId', path: async (w) => `/orgs/${w.orgA}/forecasts/${(await demoForecast(w)).forecastId}`, expect: members(200) },
  { route: 'GET /orgs/:orgId/forecasts/:forecastId/grid', path: async (w) => `/orgs/${w.orgA}/forecasts/${(await demoForecast(w)).forecastId}/grid`, expect: members(200) },
  { route: 'GET /orgs/:orgId/forecasts/:forecastId/download.csv', path: async (w) => `/orgs/${w.orgA}/forecasts/${(await demoForecast(w)).forecastId}/download.csv`, expect: members(200) },
  { route: 'GET /orgs/:orgId/forecasts/:forecastId/download.json', path: async (w) => `/orgs/${w.orgA}/forecasts/${(await demoForecast(w)).forecastId}/download.json`, expect: members(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/runs', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/runs`, expect: managers(200) },
  // No queue in this world: past authorisation the answer is 503.
  { route: 'POST /orgs/:orgId/sites/:siteId/runs', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/runs`, body: {}, expect: managers(503) },
  { route: 'GET /orgs/:orgId/alerts', path: (w) => `/orgs/${w.orgA}/alerts`, expect: members(200) },
  { route: 'POST /orgs/:orgId/alerts/:alertId/ack', path: async (w) => `/orgs/${w.orgA}/alerts/${await spareAlert(w)}/ack`, expect: managers(204) },
  { route: 'GET /me/mail-settings', path: () => '/me/mail-settings', expect: everyone(200) },
  { route: 'PUT /me/mail-settings', path: () => '/me/mail-settings', body: { digestEnabled: true, digestLocalTime: '07:00', timeZone: 'Europe/London', alertsEnabled: true }, expect: everyone(200) },
  // Public, by secret token: an unknown token is refused whoever asks.
  { route: 'GET /mail/unsubscribe/:token', path: () => '/mail/unsubscribe/not-a-real-token', expect: everyone(404, 404) },

  // Sampling plan, overview and forecast settings.
  { route: 'GET /orgs/:orgId/overview', path: (w) => `/orgs/${w.orgA}/overview`, expect: members(200) },
  { route: 'GET /orgs/:orgId/samples', path: (w) => `/orgs/${w.orgA}/samples`, expect: members(200) },
  { route: 'GET /orgs/:orgId/samples.ics', path: (w) => `/orgs/${w.orgA}/samples.ics`, expect: members(200) },
  { route: 'GET /orgs/:orgId/samples.csv', path: (w) => `/orgs/${w.orgA}/samples.csv`, expect: members(200) },
  { route: 'GET /orgs/:orgId/samples/:sampleId', path: async (w) => `/orgs/${w.orgA}/samples/${await spareSample(w)}`, expect: members(200) },
  { route: 'POST /orgs/:orgId/sites/:siteId/samples', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/samples`, body: { plannedAt: '2026-12-02T10:00:00Z', method: 'bottle', depthM: 5 }, expect: managers(201) },
  // No subscription in this world: past authorisation the answer is 402.
  { route: 'POST /orgs/:orgId/sites/:siteId/samples/from-advice', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/samples/from-advice`, body: async (w: TeamWorld) => ({ forecastId: (await demoForecast(w)).forecastId }), expect: managers(402) },
  { route: 'PATCH /orgs/:orgId/samples/:sampleId', path: async (w) => `/orgs/${w.orgA}/samples/${await spareSample(w)}`, body: { reason: 'moved to the afternoon' }, expect: managers(200) },
  { route: 'DELETE /orgs/:orgId/samples/:sampleId', path: async (w) => `/orgs/${w.orgA}/samples/${await spareSample(w)}`, expect: managers(204) },
  { route: 'POST /orgs/:orgId/samples/:sampleId/taken', path: async (w) => `/orgs/${w.orgA}/samples/${await spareSample(w)}/taken`, body: { notes: 'calm' }, expect: members(200) },
  { route: 'GET /orgs/:orgId/sites/:siteId/forecast-settings', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/forecast-settings`, expect: members(200) },
  { route: 'PUT /orgs/:orgId/sites/:siteId/forecast-settings', path: (w) => `/orgs/${w.orgA}/sites/${w.siteA}/forecast-settings`, body: { forecastLocalTime: '05:00', forecastHorizonDays: 4, windowSettings: {} }, expect: managers(200) },

  // Lab results, comparison with forecasts, calibration.
  // JSON instead of multipart: past authorisation the answer is 400 "attach the CSV in the field file".
  { route: 'POST /orgs/:orgId/lab/uploads/preview', path: (w) => `${lab(w)}/uploads/preview`, body: {}, expect: scientists(400) },
  { route: 'POST /orgs/:orgId/lab/uploads', path: (w) => `${lab(w)}/uploads`, body: {}, expect: scientists(400) },
  {
    route: 'POST /orgs/:orgId/lab/results',
    path: (w) => `${lab(w)}/results`,
    body: (w: TeamWorld) => ({ siteId: w.siteA, sampleId: `AUTH-${siteCounter++}`, sampledAt: '2025-06-01T09:00:00+01:00', depthTopM: 5, method: 'bottle', taxon: 'Dinophysis acuta', cellsPerL: 120, detectionLimit: 40 }),
    expect: scientists(201),
  },
  { route: 'GET /orgs/:orgId/lab/results', path: (w) => `${lab(w)}/results`, expect: members(200) },
  { route: 'GET /orgs/:orgId/lab/results/export.csv', path: (w) => `${lab(w)}/results/export.csv`, expect: members(200) },
  { route: 'GET /orgs/:orgId/lab/taxa', path: (w) => `${lab(w)}/taxa`, expect: members(200) },
  { route: 'PUT /orgs/:orgId/lab/taxa', path: (w) => `${lab(w)}/taxa`, body: { mappings: [] }, expect: scientists(200) },
  // Forecast output: without a subscription in this world, past authorisation the answer is 402.
  { route: 'GET /orgs/:orgId/lab/comparison', path: async (w) => `${lab(w)}/comparison?profileId=${(await demoForecast(w)).profileId}`, expect: members(402) },
  { route: 'POST /orgs/:orgId/lab/calibrations', path: (w) => `${lab(w)}/calibrations`, body: {}, expect: scientists(402) },
  { route: 'GET /orgs/:orgId/lab/calibrations', path: (w) => `${lab(w)}/calibrations`, expect: members(200) },
  { route: 'GET /orgs/:orgId/lab/calibrations/:calibrationId', path: async (w) => `${lab(w)}/calibrations/${await spareCalibration(w, 'queued')}`, expect: members(200) },
  // A calibration still queued cannot be accepted: past authorisation the answer is 409.
  { route: 'POST /orgs/:orgId/lab/calibrations/:calibrationId/accept', path: async (w) => `${lab(w)}/calibrations/${await spareCalibration(w, 'queued')}/accept`, expect: scientists(409) },
  { route: 'POST /orgs/:orgId/lab/calibrations/:calibrationId/discard', path: async (w) => `${lab(w)}/calibrations/${await spareCalibration(w, 'failed')}/discard`, expect: scientists(200) },

  // Billing.
  { route: 'GET /orgs/:orgId/billing', path: (w) => `/orgs/${w.orgA}/billing`, expect: members(200) },
  // A plan that does not exist: the owner gets past authorisation to the check (400) and no payments call is made.
  { route: 'POST /orgs/:orgId/billing/checkout', path: (w) => `/orgs/${w.orgA}/billing/checkout`, body: { plan: 'no-such-plan', interval: 'month' }, expect: owners(400) },
  // No subscription yet: the owner gets past authorisation to the check (409).
  { route: 'POST /orgs/:orgId/billing/portal', path: (w) => `/orgs/${w.orgA}/billing/portal`, expect: owners(409) },
  // Called by the payments service, not by people: an unsigned call is refused (400) whoever sends it.
  { route: 'POST /billing/webhook', path: () => '/billing/webhook', expect: everyone(400, 400) },
];

/** Cross-organisation probes: an id of organisation B under A's path, and B's path itself. */
const CROSS_CASES: RouteCase[] = [
  { route: 'GET /orgs/:orgId/sites/:siteId', path: (w) => `/orgs/${w.orgA}/sites/${w.siteB}`, expect: { ...members(404) } },
  { route: 'PATCH /orgs/:orgId/sites/:siteId', path: (w) => `/orgs/${w.orgA}/sites/${w.siteB}`, body: { gearBottomM: 9 }, expect: { ...managers(404), crewA: 403, biologistA: 403 } },
  { route: 'GET /orgs/:orgId/sites', path: (w) => `/orgs/${w.orgB}/sites`, expect: { anonymous: 401, ownerB: 200, crewA: 404, biologistA: 404, managerA: 404, ownerA: 404 } },
  { route: 'GET /orgs/:orgId/sites/:siteId/tides/sets', path: (w) => `/orgs/${w.orgA}/sites/${w.siteB}/tides/sets`, expect: members(404) },
  { route: 'GET /orgs/:orgId/sites/:siteId/forecast-settings', path: (w) => `/orgs/${w.orgA}/sites/${w.siteB}/forecast-settings`, expect: members(404) },
  { route: 'GET /orgs/:orgId/forecasts/:forecastId', path: async (w) => `/orgs/${w.orgB}/forecasts/${(await demoForecast(w)).forecastId}`, expect: { anonymous: 401, ownerB: 404, crewA: 404, biologistA: 404, managerA: 404, ownerA: 404 } },
];

async function call(w: TeamWorld, subject: Subject, c: RouteCase) {
  const browser = subject === 'anonymous' ? new Browser() : await w.as(subject);
  const [method] = c.route.split(' ');
  const body = typeof c.body === 'function' ? await (c.body as (w: TeamWorld) => unknown)(w) : c.body;
  return browser.api(w.baseUrl, method!, await c.path(w), body);
}

describe('authorisation over every API route', () => {
  let world: TeamWorld;
  beforeAll(async () => {
    world = await startTeamWorld();
  }, 60_000);
  afterAll(async () => {
    await world.close();
  });

  for (const c of [...ROUTE_TABLE, ...CROSS_CASES]) {
    it(`${c.route} answers each role as the table says`, async () => {
      const seen: Record<string, number> = {};
      for (const subject of SUBJECTS) {
        const { status, json } = await call(world, subject, c);
        seen[subject] = status;
        const text = JSON.stringify(json ?? '');
        // No answer to someone of organisation A ever carries B's data, nor the other way round.
        if (subject === 'ownerB') expect(text).not.toMatch(new RegExp(`${world.orgA}|${world.siteA}|Alder`));
        else expect(text).not.toMatch(new RegExp(`${world.orgB}|${world.siteB}|Birch`));
      }
      expect(seen).toEqual(c.expect);
    });
  }

  it('covers every route the server declares', () => {
    const mounts: Record<string, string[]> = {
      'health.routes.ts': [''],
      'organisations.routes.ts': ['', '/orgs/:orgId'],
      'invitations.routes.ts': ['/orgs/:orgId/invitations', '/invitations'],
      'sites.routes.ts': ['/orgs/:orgId/sites'],
      'audit.routes.ts': ['/orgs/:orgId/audit'],
      'tides.routes.ts': ['/orgs/:orgId/sites/:siteId/tides'],
      'billing.routes.ts': ['', '/orgs/:orgId/billing'],
      'forecasts.routes.ts': ['/orgs/:orgId'],
      'profiles.routes.ts': ['/orgs/:orgId/profiles'],
      'sampling.routes.ts': ['/orgs/:orgId'],
      'lab.routes.ts': ['/orgs/:orgId'],
      'alerts.routes.ts': ['/orgs/:orgId/alerts'],
      'mail-settings.routes.ts': [''],
    };
    const declared = new Set(ROUTE_TABLE.map((c) => c.route));
    const serverDir = path.resolve(import.meta.dirname, '../../server');
    const files = readdirSync(serverDir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.routes.ts') && !f.includes('identity-standin') && !f.includes('dev-mail'));
    const missing: string[] = [];
    for (const file of files) {
      const name = path.basename(file);
      expect(mounts[name], `mount prefixes for ${name} are listed in this test`).toBeDefined();
      const source = readFileSync(path.join(serverDir, file), 'utf8');
      for (const match of source.matchAll(/router\.(get|post|patch|put|delete)\('([^']*)'/g)) {
        const method = match[1]!.toUpperCase();
        const sub = match[2] === '/' ? '' : match[2]!;
        const candidates = mounts[name]!.map((prefix) => `${method} ${`${prefix}${sub}` || '/'}`);
        if (!candidates.some((candidate) => declared.has(candidate))) missing.push(`${name}: ${method} ${match[2]}`);
      }
    }
    expect(missing).toEqual([]);
  });
});
