import { NavLink, Outlet, useMatch, useNavigate } from 'react-router-dom';
import { useMe } from '../features/account/api/get-me.ts';
import { ApiError, signInUrl } from '../lib/api-client.ts';
import type { Me } from '../../shared/schemas/team.schema.ts';
import { SignInPrompt } from './sign-in-prompt.tsx';
import { canManage } from './org-context.ts';

function navFor(orgId: string, role: string) {
  const items = [
    { to: `/o/${orgId}`, label: 'Overview', end: true },
    { to: `/o/${orgId}/sites`, label: 'Sites', end: false },
    { to: `/o/${orgId}/plan`, label: 'Sampling plan', end: false },
    { to: `/o/${orgId}/alerts`, label: 'Alerts', end: false },
    { to: `/o/${orgId}/profiles`, label: 'Organisms', end: false },
    { to: `/o/${orgId}/lab`, label: 'Lab results', end: false },
  ];
  if (canManage(role as never)) items.push({ to: `/o/${orgId}/team`, label: 'Team', end: false });
  if (role === 'owner') items.push({ to: `/o/${orgId}/audit`, label: 'Audit log', end: false }, { to: `/o/${orgId}/billing`, label: 'Billing', end: false });
  return items;
}

function OrgSwitcher({ me, orgId }: { me: Me; orgId?: string }) {
  const navigate = useNavigate();
  if (me.memberships.length < 2) return null;
  return (
    <label className="text-sm">
      <span className="sr-only">Organisation</span>
      <select
        className="rounded bg-tide-700 px-2 py-1 text-white"
        value={orgId ?? ''}
        onChange={(e) => navigate(`/o/${e.target.value}`)}
      >
        {!orgId && <option value="">Choose organisation</option>}
        {me.memberships.map((m) => (
          <option key={m.organisationId} value={m.organisationId}>
            {m.organisationName}
          </option>
        ))}
      </select>
    </label>
  );
}

export function AppLayout() {
  const me = useMe();
  const orgMatch = useMatch('/o/:orgId/*');
  const orgId = orgMatch?.params.orgId;
  const membership = me.data?.memberships.find((m) => m.organisationId === orgId);
  const unauthenticated = me.error instanceof ApiError && me.error.status === 401;

  return (
    <div className="min-h-screen font-sans">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-tide-900 text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <span className="text-xl font-bold tracking-tight">Planktide</span>
          {membership && (
            <nav aria-label="Main">
              <ul className="flex flex-wrap gap-4">
                {navFor(membership.organisationId, membership.role).map((item) => (
                  <li key={item.to}>
                    <NavLink to={item.to} end={item.end} className={({ isActive }) => (isActive ? 'font-semibold underline underline-offset-4' : 'opacity-90 hover:opacity-100')}>
                      {item.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </nav>
          )}
          <div className="ml-auto flex items-center gap-4 text-sm">
            {me.data && <OrgSwitcher me={me.data} orgId={orgId} />}
            {me.data ? (
              <NavLink to="/account" className="underline-offset-4 hover:underline">{me.data.displayName}</NavLink>
            ) : (
              unauthenticated && <a href={signInUrl()} className="font-semibold underline">Sign in</a>
            )}
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-4 py-6">
        {unauthenticated ? <SignInPrompt /> : <Outlet />}
      </main>
    </div>
  );
}
