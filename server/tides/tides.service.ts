/**
 * The rules of a site's tides: versioned constituent sets (feed, upload, analysis, manual), the
 * active set, and refreshing from the tide feed with retries, where a failure is recorded and the
 * site keeps the set it had.
 */
import type { ConstituentSet, ConstituentSource, CurrentPart, FeedFetchResult, LevelPart, SetFit } from '../../shared/schemas/tides.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentUser } from '../http/request-context.ts';
import { TideFeedError, type FeedConstituents, type TideFeedClient } from './tide-feed.client.ts';
import * as repo from './tides.repository.ts';

export interface FeedRetryPolicy {
  /** Tries in all, the first included. Default 3. */
  attempts: number;
  /** Wait before the second try; doubles before each later one. Default 1000 ms. */
  backoffMs: number;
}

export interface FeedRefreshDeps {
  db: Db;
  /** The tide feed; without it, feed routes answer 503. */
  feed?: TideFeedClient;
  feedRetry?: Partial<FeedRetryPolicy>;
}

const DEFAULT_RETRY: FeedRetryPolicy = { attempts: 3, backoffMs: 1000 };

/** Feed failures worth another try; a refused key or an unknown station will not mend by waiting. */
const RETRYABLE = new Set(['unavailable', 'timeout', 'bad_answer']);

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * The site's active constituent set, for the forecast pipeline: `null` when the site has none.
 * `set.current` (when not null) holds the depth-mean current as shared/tides `CurrentConstituent`s
 * (major/minor in m/s, inclination and Greenwich phase in degrees) with `axisDeg`, the main axis
 * (degrees anticlockwise from east, positive along it = flood; pass it as `axisDeg` to predictCurrent
 * and findSlackWaters); `set.level` holds `LevelConstituent`s (m) and `datumM` (mean level above chart
 * datum); `set.id` and `set.version` are what a forecast records as the set it used.
 * No organisation check: callers hold a site id they already trust.
 */
export async function getActiveConstituentSet(db: Db, siteId: string): Promise<ConstituentSet | null> {
  const row = await repo.findActiveSet(db, siteId);
  return row ? repo.toSetDto(row, row.id) : null;
}

async function siteOrNotFound(db: Db, organisationId: string, siteId: string) {
  const site = await repo.findTideSite(db, organisationId, siteId);
  if (!site) throw new AppError('not_found', 'No such site in this organisation.');
  return site;
}

export async function listSets(db: Db, organisationId: string, siteId: string): Promise<{ activeSetId: string | null; sets: ConstituentSet[] }> {
  const site = await siteOrNotFound(db, organisationId, siteId);
  const rows = await repo.listSets(db, siteId);
  return { activeSetId: site.active_constituent_set_id, sets: rows.map((r) => repo.toSetDto(r, site.active_constituent_set_id)) };
}

export async function getSet(db: Db, organisationId: string, siteId: string, setId: string): Promise<ConstituentSet> {
  const site = await siteOrNotFound(db, organisationId, siteId);
  const row = await repo.findSet(db, siteId, setId);
  if (!row) throw new AppError('not_found', 'No such constituent set for this site.');
  return repo.toSetDto(row, site.active_constituent_set_id);
}

export async function getActiveSetOfSite(db: Db, organisationId: string, siteId: string): Promise<ConstituentSet | null> {
  await siteOrNotFound(db, organisationId, siteId);
  return getActiveConstituentSet(db, siteId);
}

export interface NewSetInput {
  source: ConstituentSource;
  current: CurrentPart | null;
  level: LevelPart | null;
  label?: string | null;
  notes?: string | null;
  fit?: SetFit | null;
  stationId?: string | null;
  stationName?: string | null;
  /** true: activate; false: keep the active set; 'auto': activate when the site has none or a feed set is active. */
  activate: boolean | 'auto';
}

/**
 * Stores a new version of the site's constituents. A set with only a current (or only a level) takes
 * the other part from the active set, so the active set stays complete; `basedOnSetId` names it.
 */
export async function createSet(db: Db, actor: CurrentUser | null, organisationId: string, siteId: string, input: NewSetInput): Promise<{ set: ConstituentSet; activated: boolean }> {
  if (!input.current && !input.level) throw new AppError('validation_failed', 'A constituent set needs current or level constituents (or both).');
  return db.transaction().execute(async (trx) => {
    const site = await repo.lockTideSite(trx, organisationId, siteId);
    if (!site) throw new AppError('not_found', 'No such site in this organisation.');
    const active = site.active_constituent_set_id ? await repo.findSet(trx, siteId, site.active_constituent_set_id) : undefined;
    let current = input.current;
    let level = input.level;
    let basedOn: string | null = null;
    const carried: string[] = [];
    if (active && !current && active.current_constituents) {
      current = { axisDeg: active.current_axis_deg, constituents: active.current_constituents };
      basedOn = active.id;
      carried.push(`current constituents carried over from version ${active.version}`);
    }
    if (active && !level && active.level_constituents) {
      level = { datumM: active.level_datum_m ?? 0, constituents: active.level_constituents };
      basedOn = active.id;
      carried.push(`level constituents carried over from version ${active.version}`);
    }
    const version = await repo.nextVersion(trx, siteId);
    const notes = [input.notes, ...carried].filter(Boolean).join('; ') || null;
    const row = await repo.insertSet(trx, {
      organisation_id: organisationId,
      site_id: siteId,
      version,
      source: input.source,
      kind: current && level ? 'both' : current ? 'current' : 'level',
      station_id: input.stationId ?? null,
      station_name: input.stationName ?? null,
      label: input.label ?? null,
      notes,
      current_constituents: current ? JSON.stringify(current.constituents) : null,
      current_axis_deg: current?.axisDeg ?? null,
      level_constituents: level ? JSON.stringify(level.constituents) : null,
      level_datum_m: level?.datumM ?? null,
      fit: input.fit ? JSON.stringify(input.fit) : null,
      based_on_set_id: basedOn,
      created_by: actor?.id ?? null,
    });
    const activate = input.activate === 'auto' ? !active || active.source === 'feed' : input.activate;
    if (activate) await repo.setActiveSet(trx, siteId, row.id);
    await recordAudit(trx, {
      organisationId,
      actorUserId: actor?.id ?? null,
      action: 'tides.set_created',
      subject: `${site.name} v${version}`,
      details: { siteId, setId: row.id, version, source: input.source, activated: activate },
    });
    const saved = await repo.findSet(trx, siteId, row.id);
    return { set: repo.toSetDto(saved!, activate ? row.id : site.active_constituent_set_id), activated: activate };
  });
}

export async function activateSet(db: Db, actor: CurrentUser | null, organisationId: string, siteId: string, setId: string): Promise<ConstituentSet> {
  return db.transaction().execute(async (trx) => {
    const site = await repo.lockTideSite(trx, organisationId, siteId);
    if (!site) throw new AppError('not_found', 'No such site in this organisation.');
    const row = await repo.findSet(trx, siteId, setId);
    if (!row) throw new AppError('not_found', 'No such constituent set for this site.');
    if (site.active_constituent_set_id !== setId) {
      await repo.setActiveSet(trx, siteId, setId);
      await recordAudit(trx, {
        organisationId,
        actorUserId: actor?.id ?? null,
        action: 'tides.set_activated',
        subject: `${site.name} v${row.version}`,
        details: { siteId, setId, version: row.version, previousSetId: site.active_constituent_set_id },
      });
    }
    return repo.toSetDto(row, setId);
  });
}

export async function findFeedStations(deps: FeedRefreshDeps, organisationId: string, siteId: string) {
  const site = await siteOrNotFound(deps.db, organisationId, siteId);
  const feed = requireFeed(deps);
  const stations = await feed.findStations({ latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg }, 8).catch((error: unknown) => {
    throw feedAppError(error, 1);
  });
  return { chosenStationId: site.tide_station_id, stations };
}

function requireFeed(deps: FeedRefreshDeps): TideFeedClient {
  if (!deps.feed) throw new AppError('service_unavailable', 'No tide feed is configured for this installation (TIDE_FEED_URL). Upload a constituent table or a record instead.');
  return deps.feed;
}

function feedAppError(error: unknown, attempts: number, keeps?: string): AppError {
  if (!(error instanceof TideFeedError)) return error instanceof AppError ? error : new AppError('internal', 'The tide feed request failed unexpectedly.');
  const tries = attempts > 1 ? ` after ${attempts} tries` : '';
  const kept = keeps ? ` ${keeps}` : '';
  if (error.kind === 'not_found') return new AppError('bad_request', `${error.message} Choose a station from the list near the site.${kept}`, { feedError: error.kind });
  return new AppError('service_unavailable', `The tide feed failed${tries}: ${error.message}${kept}`, { feedError: error.kind, attempts });
}

/** A key-order-independent fingerprint (jsonb does not keep key order). */
const currentKey = (list: CurrentPart['constituents'] | null) => JSON.stringify(list?.map((c) => [c.name, c.major, c.phaseDeg, c.minor ?? 0, c.inclinationDeg ?? null]) ?? null);
const levelKey = (list: LevelPart['constituents'] | null) => JSON.stringify(list?.map((c) => [c.name, c.amplitude, c.phaseDeg]) ?? null);

function sameParts(row: repo.SetWithCreator, fetched: FeedConstituents): boolean {
  const currentSame = !fetched.current || (currentKey(row.current_constituents) === currentKey(fetched.current.constituents) && row.current_axis_deg === fetched.current.axisDeg);
  const levelSame = !fetched.level || (levelKey(row.level_constituents) === levelKey(fetched.level.constituents) && row.level_datum_m === fetched.level.datumM);
  return currentSame && levelSame;
}

/**
 * Fetches the site's constituents from the tide feed: the given station, else the site's chosen
 * station, else the station nearest the site. Tries up to `feedRetry.attempts` times with doubling
 * waits; every try is recorded in tide_feed_refreshes. On failure the site keeps its active set and
 * the error says so. On success a new version is stored (unless the feed's values equal the latest
 * set from that station: outcome 'unchanged'), and becomes active per `activate` (default: when the
 * site has no active set or a feed set is active). `actor` is null for scheduled refreshes.
 */
export async function refreshSiteTidesFromFeed(
  deps: FeedRefreshDeps,
  organisationId: string,
  siteId: string,
  actor: CurrentUser | null,
  options: { stationId?: string; activate?: boolean } = {},
): Promise<FeedFetchResult> {
  const { db } = deps;
  const site = await siteOrNotFound(db, organisationId, siteId);
  const feed = requireFeed(deps);
  const policy = { ...DEFAULT_RETRY, ...deps.feedRetry };
  const stationId = options.stationId ?? site.tide_station_id ?? null;
  let fetched: FeedConstituents | null = null;
  let attempt = 0;
  let lastError: unknown = null;
  while (attempt < policy.attempts) {
    attempt++;
    try {
      fetched = stationId ? await feed.getConstituents(stationId) : await feed.getConstituentsNear({ latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg });
      break;
    } catch (error) {
      lastError = error;
      const kind = error instanceof TideFeedError ? error.kind : 'internal';
      const message = error instanceof Error ? error.message : String(error);
      await repo.insertRefresh(db, { organisationId, siteId, stationId, attempt, ok: false, errorCode: kind, errorMessage: message, actorUserId: actor?.id ?? null });
      if (!RETRYABLE.has(kind) || attempt >= policy.attempts) break;
      await sleep(policy.backoffMs * 2 ** (attempt - 1));
    }
  }
  if (!fetched) {
    const active = await getActiveConstituentSet(db, siteId);
    const keeps = active ? `The site keeps its active set (version ${active.version}).` : 'The site has no active set yet.';
    throw feedAppError(lastError, attempt, keeps);
  }

  const got = fetched;
  const previous = await repo.latestFeedSet(db, siteId, got.station.id);
  if (previous && sameParts(previous, got)) {
    const activate = options.activate ?? false;
    let set: ConstituentSet;
    if (activate) set = await activateSet(db, actor, organisationId, siteId, previous.id);
    else set = await getSet(db, organisationId, siteId, previous.id);
    await repo.insertRefresh(db, { organisationId, siteId, stationId: got.station.id, attempt, ok: true, setId: previous.id, actorUserId: actor?.id ?? null });
    return { outcome: 'unchanged', attempts: attempt, activated: activate, set };
  }
  const ignored = got.ignored.length ? `the feed also sent ${got.ignored.join(', ')}, which are not in the standard list and were left out` : null;
  const created = await createSet(db, actor, organisationId, siteId, {
    source: 'feed',
    current: got.current,
    level: got.level,
    stationId: got.station.id,
    stationName: got.station.name,
    label: `Tide feed: ${got.station.name}`,
    notes: ignored,
    activate: options.activate ?? 'auto',
  });
  await db.transaction().execute(async (trx) => {
    await repo.setChosenStation(trx, siteId, got.station.id, got.station.name);
    await repo.insertRefresh(trx, { organisationId, siteId, stationId: got.station.id, attempt, ok: true, setId: created.set.id, actorUserId: actor?.id ?? null });
  });
  return { outcome: 'created', attempts: attempt, activated: created.activated, set: created.set };
}
