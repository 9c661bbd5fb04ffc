// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { routes } from '../../src/app/router.tsx';

const ORG = '0b9d2f56-5a3c-4d0e-9d61-6f5b0c2a1e11';
const ME = { id: '5a0e7c1c-1e1b-4a51-9e7b-3c0b8f3f2d22', email: 'manager@example.test', displayName: 'Ria Manager', memberships: [{ organisationId: ORG, organisationName: 'Test Oysters', role: 'manager' }] };
const SITE = {
  id: '7d3f8a50-7f7c-4b7d-8a2e-0c6e1d9b3f33', organisationId: ORG, name: 'West trestles', latitudeDeg: 53.2, longitudeDeg: -9.5, timeZone: 'Europe/Dublin',
  waterDepthM: 6, bedType: 'mud', bedRoughnessM: 0.006, gearTopM: 0.5, gearBottomM: 3, archivedAt: null, createdAt: '2026-11-30T10:00:00.000Z', updatedAt: '2026-11-30T10:00:00.000Z',
};

const json = (body: unknown, status = 200) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

/** A fake of the network the client talks to: answers by URL, like the API would. */
function serve(answers: Record<string, () => Response>) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const url = String(input);
    const answer = Object.entries(answers).find(([prefix]) => url.startsWith(prefix));
    return answer ? answer[1]() : json({ error: { code: 'not_found', message: `no fake for ${url}` } }, 404);
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  window.localStorage.clear();
});

describe('client shell', () => {
  it('asks an anonymous visitor to sign in, with the cautions', async () => {
    serve({ '/api/me': () => json({ error: { code: 'unauthenticated', message: 'Sign in' } }, 401), '/api/health': () => json({ status: 'ok', database: 'ok', version: '1.2.3' }) });
    renderAt('/');
    expect(await screen.findByRole('heading', { name: 'Sign in to Planktide' })).toBeTruthy();
    expect(screen.getAllByRole('link', { name: 'Sign in' })[0]!.getAttribute('href')).toBe('/auth/login?returnTo=%2F');
    expect(screen.getByRole('complementary', { name: 'Cautions' }).textContent).toContain('model estimates');
  });

  it('takes a member from / to their organisation overview, listing its sites with depths labelled', async () => {
    serve({ '/api/me': () => json(ME), [`/api/orgs/${ORG}/sites`]: () => json({ sites: [SITE] }), '/api/health': () => json({ status: 'ok', database: 'ok', version: '1.2.3' }) });
    const router = renderAt('/');
    expect(await screen.findByRole('heading', { name: 'Test Oysters' })).toBeTruthy();
    expect(router.state.location.pathname).toBe(`/o/${ORG}`);
    expect(await screen.findByText('West trestles')).toBeTruthy();
    expect(screen.getByText(/gear 0.5–3 m below surface/)).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Team' })).toBeTruthy();
    expect(screen.queryByRole('link', { name: 'Audit log' })).toBeNull();
  });

  it('says the database is unavailable when health answers 503', async () => {
    serve({ '/api/me': () => json(ME), [`/api/orgs/${ORG}/sites`]: () => json({ sites: [] }), '/api/health': () => json({ status: 'degraded', database: 'unavailable', version: '1.2.3' }, 503) });
    renderAt(`/o/${ORG}`);
    expect(await screen.findByText(/Database unavailable/)).toBeTruthy();
  });

  it('shows the not-found page for an unknown address, inside the layout', async () => {
    serve({ '/api/me': () => json(ME) });
    renderAt('/no/such/page');
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
  });

  it('refuses an organisation the user is not in', async () => {
    serve({ '/api/me': () => json(ME) });
    renderAt('/o/11111111-2222-4333-8444-555555555555');
    expect(await screen.findByText(/not a member of this organisation/)).toBeTruthy();
  });
});
