/**
 * Client of the hosted tide-constituent service ("the tide feed"). Speaks its small JSON API
 * (documented in docs/tides.md, served locally by tide-feed-standin.ts):
 *   GET /v1/stations?lat=&lon=&limit=     stations nearest a position
 *   GET /v1/stations/:id/constituents     a station's constituents
 *   GET /v1/constituents?lat=&lon=        the constituents of the station nearest a position
 * The API key goes in the X-Api-Key header. Every request has a timeout (AbortSignal.timeout),
 * every answer is checked with zod, and every failure is a TideFeedError whose `kind` says what went wrong.
 */
import { z } from 'zod';
import { resolveConstituentNames } from '../../shared/tides/constituents.ts';

export type TideFeedErrorKind =
  /** The service could not be reached, or answered 5xx. */
  | 'unavailable'
  /** No complete answer within the timeout. */
  | 'timeout'
  /** An answer that is not the documented JSON (malformed body, unexpected status). */
  | 'bad_answer'
  /** No such station, or no station near the position. */
  | 'not_found'
  /** The API key was refused (401/403). */
  | 'unauthorised';

export class TideFeedError extends Error {
  constructor(
    readonly kind: TideFeedErrorKind,
    message: string,
    readonly status: number | null = null,
  ) {
    super(message);
    this.name = 'TideFeedError';
  }
}

export const API_KEY_HEADER = 'x-api-key';

const feedConstituent = z.object({
  name: z.string().min(1),
  amplitude: z.number().nonnegative(),
  phase_deg: z.number(),
  minor: z.number().optional(),
  inclination_deg: z.number().optional(),
});

const feedStation = z.object({
  id: z.string().min(1),
  name: z.string().min(1),
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(180),
  distance_km: z.number().nonnegative().optional(),
  has_current: z.boolean(),
  has_level: z.boolean(),
});

const stationsBody = z.object({ stations: z.array(feedStation) });

const constituentsBody = z
  .object({
    station: feedStation,
    phase_reference: z.literal('greenwich'),
    current: z
      .object({
        unit: z.literal('m/s'),
        axis_deg: z.number().nullable(),
        constituents: z.array(feedConstituent).min(1),
      })
      .nullable(),
    level: z
      .object({
        unit: z.literal('m'),
        datum_m: z.number(),
        constituents: z.array(feedConstituent).min(1),
      })
      .nullable(),
  })
  .refine((b) => b.current !== null || b.level !== null, { error: 'neither current nor level constituents' });

export interface FeedStationInfo {
  id: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  distanceKm: number | null;
  hasCurrent: boolean;
  hasLevel: boolean;
}

export interface FeedConstituents {
  station: FeedStationInfo;
  current: {
    axisDeg: number | null;
    constituents: { name: string; major: number; phaseDeg: number; minor?: number; inclinationDeg?: number }[];
  } | null;
  level: { datumM: number; constituents: { name: string; amplitude: number; phaseDeg: number }[] } | null;
  /** Constituent names the feed sent that are not in the standard list (left out). */
  ignored: string[];
}

export interface TideFeedClient {
  /** Stations nearest a position, nearest first. */
  findStations(position: { latitudeDeg: number; longitudeDeg: number }, limit?: number): Promise<FeedStationInfo[]>;
  /** A station's constituents. */
  getConstituents(stationId: string): Promise<FeedConstituents>;
  /** The constituents of the station nearest a position. */
  getConstituentsNear(position: { latitudeDeg: number; longitudeDeg: number }): Promise<FeedConstituents>;
}

export interface TideFeedClientOptions {
  baseUrl: string;
  apiKey: string;
  /** Per request, connection to last byte. Default 8000 ms. */
  timeoutMs?: number;
  fetch?: typeof fetch;
}

function toStation(s: z.infer<typeof feedStation>): FeedStationInfo {
  return {
    id: s.id,
    name: s.name,
    latitudeDeg: s.latitude,
    longitudeDeg: s.longitude,
    distanceKm: s.distance_km ?? null,
    hasCurrent: s.has_current,
    hasLevel: s.has_level,
  };
}

/** Keeps the standard constituents; names outside the list are reported, not guessed at. */
function known<T extends { name: string }>(list: T[], ignored: string[]): T[] {
  return list.filter((c) => {
    const ok = resolveConstituentNames([c.name]).ok;
    if (!ok) ignored.push(c.name);
    return ok;
  });
}

function toConstituents(body: z.infer<typeof constituentsBody>): FeedConstituents {
  const ignored: string[] = [];
  const current = body.current
    ? {
        axisDeg: body.current.axis_deg,
        constituents: known(body.current.constituents, ignored).map((c) => ({
          name: c.name,
          major: c.amplitude,
          phaseDeg: c.phase_deg,
          ...(c.minor !== undefined ? { minor: c.minor } : {}),
          ...(c.inclination_deg !== undefined ? { inclinationDeg: c.inclination_deg } : {}),
        })),
      }
    : null;
  const level = body.level
    ? { datumM: body.level.datum_m, constituents: known(body.level.constituents, ignored).map((c) => ({ name: c.name, amplitude: c.amplitude, phaseDeg: c.phase_deg })) }
    : null;
  if ((current && current.constituents.length === 0) || (level && level.constituents.length === 0)) {
    throw new TideFeedError('bad_answer', `The tide feed sent no constituent of the standard list (it sent ${ignored.join(', ')}).`);
  }
  const resolvedDuplicates = [current?.constituents, level?.constituents].flatMap((list) => {
    if (!list) return [];
    const resolved = resolveConstituentNames(list.map((c) => c.name));
    return resolved.ok ? [] : [resolved.message];
  });
  if (resolvedDuplicates.length) throw new TideFeedError('bad_answer', `The tide feed's answer is inconsistent: ${resolvedDuplicates.join('; ')}.`);
  return { station: toStation(body.station), current, level, ignored: [...new Set(ignored)] };
}

export function createTideFeedClient(options: TideFeedClientOptions): TideFeedClient {
  const base = options.baseUrl.replace(/\/+$/, '');
  const timeoutMs = options.timeoutMs ?? 8000;
  const doFetch = options.fetch ?? fetch;

  async function getJson<T>(path: string, schema: z.ZodType<T>, what: string): Promise<T> {
    const url = `${base}${path}`;
    let text: string;
    let status: number;
    try {
      // The signal covers the whole exchange: connecting, the headers and reading the body.
      const response = await doFetch(url, { headers: { accept: 'application/json', [API_KEY_HEADER]: options.apiKey }, signal: AbortSignal.timeout(timeoutMs) });
      status = response.status;
      text = await response.text();
    } catch (error) {
      const name = error instanceof Error ? error.name : '';
      if (name === 'TimeoutError' || name === 'AbortError') {
        throw new TideFeedError('timeout', `The tide feed did not answer ${what} within ${timeoutMs} ms.`);
      }
      const cause = error instanceof Error && error.cause instanceof Error ? error.cause.message : error instanceof Error ? error.message : String(error);
      throw new TideFeedError('unavailable', `The tide feed at ${base} could not be reached (${cause}).`);
    }
    if (status === 404) throw new TideFeedError('not_found', `The tide feed found nothing for ${what} (404).`, status);
    if (status === 401 || status === 403) throw new TideFeedError('unauthorised', `The tide feed refused the API key (${status}). Check TIDE_FEED_API_KEY.`, status);
    if (status >= 500) throw new TideFeedError('unavailable', `The tide feed failed with status ${status}.`, status);
    if (status < 200 || status >= 300) throw new TideFeedError('bad_answer', `The tide feed answered ${what} with an unexpected status ${status}.`, status);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw new TideFeedError('bad_answer', `The tide feed's answer to ${what} is not JSON (it begins ${JSON.stringify(text.slice(0, 40))}).`, status);
    }
    const parsed = schema.safeParse(body);
    if (!parsed.success) {
      const problems = parsed.error.issues.slice(0, 5).map((i) => `${i.path.join('.') || '(body)'}: ${i.message}`);
      throw new TideFeedError('bad_answer', `The tide feed's answer to ${what} is not in the expected form: ${problems.join('; ')}.`, status);
    }
    return parsed.data;
  }

  const position = (p: { latitudeDeg: number; longitudeDeg: number }) => `lat=${encodeURIComponent(p.latitudeDeg)}&lon=${encodeURIComponent(p.longitudeDeg)}`;

  return {
    async findStations(p, limit = 5) {
      const body = await getJson(`/v1/stations?${position(p)}&limit=${limit}`, stationsBody, 'stations near the position');
      return body.stations.map(toStation);
    },
    async getConstituents(stationId) {
      return toConstituents(await getJson(`/v1/stations/${encodeURIComponent(stationId)}/constituents`, constituentsBody, `station ${stationId}`));
    },
    async getConstituentsNear(p) {
      return toConstituents(await getJson(`/v1/constituents?${position(p)}`, constituentsBody, 'a station near the position'));
    },
  };
}
