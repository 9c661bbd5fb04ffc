import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_SITES } from '../../server/seed/demo-organisation.ts';
import { createTideFeedClient, TideFeedError, type TideFeedErrorKind } from '../../server/tides/tide-feed.client.ts';
import { startTideFeedStandIn, type TideFeedStandIn } from '../../server/tides/tide-feed-standin.ts';
import { distanceKm } from '../../server/tides/tide-feed-stations.ts';
import { predictCurrent, regularTimes } from '../../shared/tides/predict.ts';
import { formFactor } from '../../shared/tides/tide-character.ts';
import { freePort } from '../helpers/free-port.ts';

const KEY = 'feed-test-key-0123';

async function failure(promise: Promise<unknown>): Promise<TideFeedError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof TideFeedError) return error;
    throw error;
  }
  throw new Error('expected the feed call to fail');
}

describe('tide feed client against the local stand-in', () => {
  let standIn: TideFeedStandIn;
  beforeAll(async () => {
    standIn = await startTideFeedStandIn({ port: 0, apiKey: KEY, slowMs: 3000 });
  });
  afterAll(async () => {
    await standIn.close();
  });

  const client = () => createTideFeedClient({ baseUrl: standIn.url, apiKey: KEY, timeoutMs: 400 });

  it('lists stations near each demo site, nearest first, with great-circle distances', async () => {
    for (const site of DEMO_SITES) {
      const stations = await client().findStations({ latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg });
      expect(stations.length).toBeGreaterThan(0);
      const distances = stations.map((s) => s.distanceKm!);
      expect([...distances].sort((a, b) => a - b)).toEqual(distances);
      expect(distances[0]).toBeLessThan(20);
      // Reported distances agree with the haversine formula to the 0.1 km they are rounded to.
      for (const s of stations) expect(Math.abs(s.distanceKm! - distanceKm(site.latitude_deg, site.longitude_deg, s.latitudeDeg, s.longitudeDeg))).toBeLessThanOrEqual(0.05 + 1e-9);
    }
  });

  it('measures one degree of latitude as 111.19 km (haversine, R = 6371 km: 6371·π/180 [calc])', () => {
    expect(distanceKm(56, -5, 57, -5)).toBeCloseTo(111.195, 2);
  });

  it('gives every station mixed, mainly semidiurnal constituents with spring currents of 0.1 to 0.5 m/s', async () => {
    // Classes: form factor (K1 + O1)/(M2 + S2) between 0.25 and 1.5 (Courtier 1938, via Pugh 1987).
    // Speeds: typical tidal peak currents at farm sites 0.1 to 0.5 m/s (common practice [from memory]).
    const times = regularTimes(Date.parse('2026-01-01T00:00:00Z'), Date.parse('2026-03-01T00:00:00Z'), 600_000);
    const near = await client().findStations({ latitudeDeg: 57, longitudeDeg: -6 }, 20);
    const far = await client().findStations({ latitudeDeg: 57, longitudeDeg: 2 }, 20);
    const ids = new Set([...near, ...far].map((s) => s.id));
    for (const site of DEMO_SITES) for (const s of await client().findStations({ latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg }, 20)) ids.add(s.id);
    expect(ids.size).toBeGreaterThanOrEqual(5);
    for (const id of ids) {
      const answer = await client().getConstituents(id);
      if (answer.level) {
        const F = formFactor(answer.level.constituents);
        expect(F.ok && F.type).toBe('mixed, mainly semidiurnal');
      }
      if (answer.current) {
        const F = formFactor(answer.current.constituents.map((c) => ({ name: c.name, amplitude: c.major })));
        expect(F.ok && F.type).toBe('mixed, mainly semidiurnal');
        const predicted = predictCurrent(answer.current.constituents, times);
        if (!predicted.ok) throw new Error(predicted.message);
        const peak = Math.max(...predicted.speed);
        expect(peak).toBeGreaterThan(0.1);
        expect(peak).toBeLessThanOrEqual(0.5);
      }
    }
  });

  it('finds the constituents of the station nearest a position', async () => {
    const site = DEMO_SITES[1]!;
    const answer = await client().getConstituentsNear({ latitudeDeg: site.latitude_deg, longitudeDeg: site.longitude_deg });
    expect(answer.station.id).toBe('HRF-01');
    expect(answer.current?.constituents[0]).toMatchObject({ name: 'M2' });
    expect(answer.ignored).toEqual([]);
  });

  const cases: [string, () => Promise<unknown>, TideFeedErrorKind][] = [
    ['an unknown station', () => client().getConstituents('NOPE-9'), 'not_found'],
    ['a position far from every station', () => client().getConstituentsNear({ latitudeDeg: -40, longitudeDeg: 100 }), 'not_found'],
    ['a wrong API key', () => createTideFeedClient({ baseUrl: standIn.url, apiKey: 'wrong', timeoutMs: 400 }).getConstituents('SKN-01'), 'unauthorised'],
  ];
  for (const [what, call, kind] of cases) {
    it(`reports ${what} as ${kind}`, async () => {
      expect((await failure(call())).kind).toBe(kind);
    });
  }

  it('reports a feed that answers 500 as unavailable', async () => {
    standIn.setFault('error');
    try {
      const error = await failure(client().getConstituents('SKN-01'));
      expect(error.kind).toBe('unavailable');
      expect(error.status).toBe(500);
    } finally {
      standIn.setFault('none');
    }
  });

  it('gives up on a slow feed after its timeout', async () => {
    standIn.setFault('slow');
    try {
      const started = Date.now();
      const error = await failure(client().getConstituents('SKN-01'));
      expect(error.kind).toBe('timeout');
      expect(Date.now() - started).toBeLessThan(2500);
    } finally {
      standIn.setFault('none');
    }
  });

  it('reports a malformed body as a bad answer that says what was wrong', async () => {
    standIn.setFault('malformed');
    try {
      const error = await failure(client().getConstituents('SKN-01'));
      expect(error.kind).toBe('bad_answer');
      expect(error.message).toMatch(/not JSON/);
    } finally {
      standIn.setFault('none');
    }
  });

  it('reports a body of the wrong shape as a bad answer naming the field', async () => {
    const fake = (async () => new Response(JSON.stringify({ station: { id: 'X' }, phase_reference: 'greenwich', current: null, level: null }), { status: 200 })) as typeof fetch;
    const error = await failure(createTideFeedClient({ baseUrl: 'http://feed.invalid', apiKey: KEY, fetch: fake }).getConstituents('X'));
    expect(error.kind).toBe('bad_answer');
    expect(error.message).toMatch(/station\.name/);
  });

  it('reports a feed that is not listening as unavailable', async () => {
    const port = await freePort();
    const error = await failure(createTideFeedClient({ baseUrl: `http://127.0.0.1:${port}`, apiKey: KEY, timeoutMs: 1000 }).getConstituents('SKN-01'));
    expect(error.kind).toBe('unavailable');
  });
});
