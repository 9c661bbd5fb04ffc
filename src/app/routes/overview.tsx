import { Link } from 'react-router-dom';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useOverview } from '../../features/overview/api/get-overview.ts';
import { useSites } from '../../features/sites/api/get-sites.ts';
import { SiteCard } from '../../features/overview/components/site-card.tsx';
import { ServiceStatus } from '../../features/status/components/service-status.tsx';
import { useOrg } from '../org-context.ts';

export default function OverviewRoute() {
  const { orgId, orgName, role } = useOrg();
  const sites = useSites(orgId);
  const overview = useOverview(orgId);
  return (
    <div className="space-y-6">
      <section>
        <h1 className="text-2xl font-bold text-tide-900">{orgName}</h1>
        <p className="mt-1 text-sm text-ink-soft">Your role: {role}. Times at each site are in its own zone.</p>
      </section>
      <section aria-labelledby="sites-heading" className="space-y-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="sites-heading" className="text-lg font-bold">Sites today and tomorrow</h2>
          <span className="flex gap-4 text-sm">
            <Link to={`/o/${orgId}/plan`} className="font-semibold text-tide-700 underline">Sampling plan</Link>
            <Link to={`/o/${orgId}/alerts`} className="font-semibold text-tide-700 underline">Alerts</Link>
            <Link to={`/o/${orgId}/sites`} className="font-semibold text-tide-700 underline">All sites</Link>
          </span>
        </div>
        <QueryState query={sites}>
          {(list) =>
            list.sites.length === 0 ? (
              <p className="text-ink-soft">No sites yet.</p>
            ) : (
              <>
                {overview.data && !overview.data.forecastsUnlocked && (
                  <p className="rounded-lg border border-line bg-white p-3 text-sm">
                    Forecasts are locked until the organisation subscribes{role === 'owner' ? <>: <Link className="underline" to={`/o/${orgId}/billing`}>subscribe to unlock them</Link></> : '; ask an owner'}.
                  </p>
                )}
                {overview.error && <p role="alert" className="text-sm text-alarm-600">Forecast summaries could not be loaded: {overview.error.message}</p>}
                <ul className="grid gap-3 lg:grid-cols-2">
                  {list.sites.map((site) => (
                    <SiteCard
                      key={site.id}
                      orgId={orgId}
                      base={site}
                      site={overview.data?.sites.find((s) => s.id === site.id)}
                      nowMs={overview.data ? Date.parse(overview.data.now) : 0}
                      unlocked={overview.data?.forecastsUnlocked}
                    />
                  ))}
                </ul>
              </>
            )
          }
        </QueryState>
      </section>
      <ServiceStatus />
      <SafetyNotice />
    </div>
  );
}
