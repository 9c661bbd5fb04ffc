/**
 * A local stand-in for the hosted tide feed: the same small JSON API as the real service (see
 * tide-feed.client.ts and docs/tides.md) over invented stations (tide-feed-stations.ts).
 * `npm start` runs it when TIDE_FEED_URL is not set; tests make it fail with setFault().
 */
import type { Server } from 'node:http';
import express, { type RequestHandler } from 'express';
import { API_KEY_HEADER } from './tide-feed.client.ts';
import { distanceKm, STAND_IN_STATIONS, type StandInStation } from './tide-feed-stations.ts';

export type TideFeedFault = 'none' | 'error' | 'slow' | 'malformed';

export interface TideFeedStandIn {
  url: string;
  /** From now on every /v1 request fails this way ('none' answers normally again). */
  setFault(mode: TideFeedFault): void;
  /** Requests received under /v1 since the start (or the last reset), faulty ones included. */
  requestCount(): number;
  resetRequestCount(): void;
  close(): Promise<void>;
}

export interface TideFeedStandInOptions {
  port: number;
  host?: string;
  apiKey: string;
  /** How long a 'slow' answer takes. Default 20 s. */
  slowMs?: number;
}

/** Stations searched by position are taken within this distance. */
const NEAR_KM = 150;

function stationInfo(s: StandInStation, distance?: number) {
  return {
    id: s.id,
    name: s.name,
    latitude: s.latitude,
    longitude: s.longitude,
    ...(distance !== undefined ? { distance_km: Math.round(distance * 10) / 10 } : {}),
    has_current: s.current !== null,
    has_level: s.level !== null,
  };
}

function constituentsOf(s: StandInStation, distance?: number) {
  return {
    station: stationInfo(s, distance),
    phase_reference: 'greenwich',
    current: s.current ? { unit: 'm/s', ...s.current } : null,
    level: s.level ? { unit: 'm', ...s.level } : null,
  };
}

function position(query: Record<string, unknown>): { lat: number; lon: number } | null {
  const lat = Number(query.lat);
  const lon = Number(query.lon);
  if (typeof query.lat !== 'string' || typeof query.lon !== 'string' || !Number.isFinite(lat) || !Number.isFinite(lon) || Math.abs(lat) > 90 || Math.abs(lon) > 180) return null;
  return { lat, lon };
}

function nearest(lat: number, lon: number) {
  return STAND_IN_STATIONS.map((s) => ({ station: s, distance: distanceKm(lat, lon, s.latitude, s.longitude) }))
    .filter((x) => x.distance <= NEAR_KM)
    .sort((a, b) => a.distance - b.distance);
}

export async function startTideFeedStandIn(options: TideFeedStandInOptions): Promise<TideFeedStandIn> {
  const host = options.host ?? '127.0.0.1';
  const slowMs = options.slowMs ?? 20_000;
  let fault: TideFeedFault = 'none';
  let requests = 0;
  const timers = new Set<NodeJS.Timeout>();

  const app = express();
  app.disable('x-powered-by');

  const faults: RequestHandler = (req, res, next) => {
    requests++;
    if (req.get(API_KEY_HEADER) !== options.apiKey) {
      res.status(401).json({ error: 'missing or wrong API key (X-Api-Key)' });
      return;
    }
    if (fault === 'error') {
      res.status(500).json({ error: 'internal error (stand-in fault)' });
      return;
    }
    if (fault === 'malformed') {
      // A truncated JSON body with a success status.
      res.status(200).type('application/json').send('{"station": {"id": "SKN-01", "name": "Skerry');
      return;
    }
    if (fault === 'slow') {
      const timer = setTimeout(() => {
        timers.delete(timer);
        next();
      }, slowMs);
      timers.add(timer);
      res.on('close', () => {
        clearTimeout(timer);
        timers.delete(timer);
      });
      return;
    }
    next();
  };

  const v1 = express.Router();
  v1.use(faults);
  v1.get('/stations', (req, res) => {
    const at = position(req.query);
    if (!at) {
      res.status(400).json({ error: 'give lat and lon in degrees' });
      return;
    }
    const limit = Math.min(20, Math.max(1, Number(req.query.limit) || 5));
    res.json({ stations: nearest(at.lat, at.lon).slice(0, limit).map((x) => stationInfo(x.station, x.distance)) });
  });
  v1.get('/stations/:id/constituents', (req, res) => {
    const station = STAND_IN_STATIONS.find((s) => s.id === req.params.id);
    if (!station) {
      res.status(404).json({ error: `no station ${req.params.id}` });
      return;
    }
    res.json(constituentsOf(station));
  });
  v1.get('/constituents', (req, res) => {
    const at = position(req.query);
    if (!at) {
      res.status(400).json({ error: 'give lat and lon in degrees' });
      return;
    }
    const found = nearest(at.lat, at.lon)[0];
    if (!found) {
      res.status(404).json({ error: `no station within ${NEAR_KM} km` });
      return;
    }
    res.json(constituentsOf(found.station, found.distance));
  });
  app.use('/v1', v1);
  app.use((_req, res) => {
    res.status(404).json({ error: 'no such endpoint' });
  });

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port, host, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  return {
    url: `http://${host}:${port}`,
    setFault(mode) {
      fault = mode;
    },
    requestCount: () => requests,
    resetRequestCount() {
      requests = 0;
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const timer of timers) clearTimeout(timer);
        timers.clear();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
