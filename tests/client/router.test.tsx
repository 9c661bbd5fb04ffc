// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { routes } from '../../src/app/router.tsx';

function renderAt(path: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  return render(
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('client shell', () => {
  it('shows the not-found page for an unknown address, inside the layout', async () => {
    vi.stubGlobal('fetch', vi.fn());
    renderAt('/no/such/page');
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });

  it('shows the overview with the cautions and the service status from /api/health', async () => {
    const fetchMock = vi.fn(async () => new Response(JSON.stringify({ status: 'ok', database: 'ok', version: '1.2.3' }), { status: 200 }));
    vi.stubGlobal('fetch', fetchMock);
    renderAt('/');
    expect(await screen.findByText(/Service version 1\.2\.3/)).toBeTruthy();
    expect(screen.getByRole('complementary', { name: 'Cautions' }).textContent).toContain('Never harvest from a closed area');
    expect(fetchMock).toHaveBeenCalledWith('/api/health', expect.anything());
  });

  it('says the database is unavailable when health answers 503', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify({ status: 'degraded', database: 'unavailable', version: '1.2.3' }), { status: 503 })));
    renderAt('/');
    expect(await screen.findByText(/Database unavailable/)).toBeTruthy();
  });
});
