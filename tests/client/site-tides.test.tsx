// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, within } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { routes } from '../../src/app/router.tsx';

const ORG = '0b9d2f56-5a3c-4d0e-9d61-6f5b0c2a1e11';
const SITE_ID = '7d3f8a50-7f7c-4b7d-8a2e-0c6e1d9b3f33';
const SET_ID = '2c1b7e4a-9d8f-4a3b-8c6d-5e4f3a2b1c00';
const OLD_SET_ID = '3d2c8f5b-0e9a-4b4c-9d7e-6f5a4b3c2d11';
const me = (role: string) => ({ id: '5a0e7c1c-1e1b-4a51-9e7b-3c0b8f3f2d22', email: 'ria@example.test', displayName: 'Ria', memberships: [{ organisationId: ORG, organisationName: 'Test Oysters', role }] });
const SITE = {
  id: SITE_ID, organisationId: ORG, name: 'West trestles', latitudeDeg: 53.2, longitudeDeg: -9.5, timeZone: 'Europe/Dublin',
  waterDepthM: 6, bedType: 'mud', bedRoughnessM: 0.006, gearTopM: 0.5, gearBottomM: 3, archivedAt: null, createdAt: '2026-11-30T10:00:00.000Z', updatedAt: '2026-11-30T10:00:00.000Z',
};
const set = (id: string, version: number, active: boolean) => ({
  id, siteId: SITE_ID, version, source: 'feed', kind: 'both', stationId: 'HRF-01', stationName: 'Heron Flats channel', label: null, notes: null,
  current: { axisDeg: 120, constituents: [{ name: 'M2', major: 0.25, minor: 0.01, inclinationDeg: 120, phaseDeg: 118 }] },
  level: { datumM: 2.6, constituents: [{ name: 'M2', amplitude: 1.55, phaseDeg: 125 }] },
  fit: null, basedOnSetId: null, createdAt: '2026-07-01T09:30:00.000Z', createdBy: { id: '5a0e7c1c-1e1b-4a51-9e7b-3c0b8f3f2d22', displayName: 'Ria', email: 'ria@example.test' }, active,
});
// One slack in summer (Irish Standard Time, UTC+1): 06:10 UTC shows as 07:10 GMT+1.
const PREVIEW = {
  setId: SET_ID, version: 2, start: '2026-07-01T00:00:00.000Z', end: '2026-07-01T12:00:00.000Z', stepMinutes: 360,
  times: ['2026-07-01T00:00:00.000Z', '2026-07-01T06:00:00.000Z', '2026-07-01T12:00:00.000Z'],
  current: { axisDeg: 120, along: [0.2, 0, -0.2], speed: [0.2, 0.01, 0.2], slacks: [{ time: '2026-07-01T06:10:00.000Z', speed: 0.01, turnsTo: 'ebb' }] },
  level: { datumM: 2.6, values: [3.5, 2.6, 1.7], highLow: [] },
  formFactor: { value: 0.32, type: 'mixed, mainly semidiurnal', of: 'current' },
};

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

function serve(role: string) {
  const base = `/api/orgs/${ORG}/sites/${SITE_ID}`;
  const answers: [string, () => Response][] = [
    [`${base}/tides/sets`, () => json({ activeSetId: SET_ID, sets: [set(SET_ID, 2, true), set(OLD_SET_ID, 1, false)] })],
    [`${base}/tides/preview`, () => json({ preview: PREVIEW })],
    [`${base}/tides/feed/refreshes`, () => json({ refreshes: [] })],
    [base, () => json(SITE)],
    ['/api/me', () => json(me(role))],
    ['/api/health', () => json({ status: 'ok', database: 'ok', version: '1.2.3' })],
  ];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = String(input);
      const answer = answers.find(([prefix]) => url.startsWith(prefix));
      return answer ? answer[1]() : json({ error: { code: 'not_found', message: `no fake for ${url}` } }, 404);
    }),
  );
}

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={createMemoryRouter(routes, { initialEntries: [path] })} />
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  window.localStorage.clear();
});

describe('site tides screen', () => {
  it('shows the active set with units, the versions and slack times in the site zone with summer time marked', async () => {
    serve('manager');
    renderAt(`/o/${ORG}/sites/${SITE_ID}/tides`);
    expect(await screen.findByRole('heading', { name: 'Tides at West trestles' })).toBeTruthy();
    expect(await screen.findByRole('columnheader', { name: 'Major axis (m/s)' })).toBeTruthy();
    expect(screen.getByRole('columnheader', { name: 'Amplitude (m)' })).toBeTruthy();
    // Europe/Dublin in July is UTC+1 (IANA tz database); luxon names it GMT+1.
    expect((await screen.findByText('Wed 1 Jul 07:10 GMT+1')).closest('time')?.getAttribute('datetime')).toBe('2026-07-01T06:10:00.000Z');
    const versions = screen.getByRole('heading', { name: 'Versions' }).parentElement!;
    expect(within(versions).getByText('active')).toBeTruthy();
    expect(within(versions).getByRole('button', { name: 'Make v1 active' })).toBeTruthy();
    expect(screen.getByRole('heading', { name: 'Upload a constituent table' })).toBeTruthy();
  });

  it('shows crew the tides without the controls that change them', async () => {
    serve('crew');
    renderAt(`/o/${ORG}/sites/${SITE_ID}/tides`);
    expect(await screen.findByRole('columnheader', { name: 'Major axis (m/s)' })).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Make v1 active' })).toBeNull();
    expect(screen.queryByRole('heading', { name: 'Upload a constituent table' })).toBeNull();
  });
});
