import { Link } from 'react-router-dom';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useSites } from '../../features/sites/api/get-sites.ts';
import { ServiceStatus } from '../../features/status/components/service-status.tsx';
import { useOrg } from '../org-context.ts';

export default function OverviewRoute() {
  const { orgId, orgName, role } = useOrg();
  const sites = useSites(orgId);
  return (
    <div className="space-y-6">
      <section>
        <h1 className="text-2xl font-bold text-tide-900">{orgName}</h1>
        <p className="mt-1 text-sm text-ink-soft">Your role: {role}</p>
      </section>
      <section aria-labelledby="sites-heading" className="rounded-lg border border-line bg-white p-4">
        <h2 id="sites-heading" className="text-lg font-bold">Sites</h2>
        <QueryState query={sites}>
          {(data) =>
            data.sites.length === 0 ? (
              <p className="text-ink-soft">No sites yet.</p>
            ) : (
              <ul className="mt-2 divide-y divide-line">
                {data.sites.map((site) => (
                  <li key={site.id} className="py-2">
                    <span className="font-semibold">{site.name}</span>{' '}
                    <span className="text-sm text-ink-soft">
                      · {site.waterDepthM} m deep · gear {site.gearTopM}–{site.gearBottomM} m below surface · {site.timeZone}
                    </span>
                  </li>
                ))}
              </ul>
            )
          }
        </QueryState>
        <Link to={`/o/${orgId}/sites`} className="mt-2 inline-block text-sm font-semibold text-tide-700 underline">All sites</Link>
      </section>
      <ServiceStatus />
      <SafetyNotice />
    </div>
  );
}
