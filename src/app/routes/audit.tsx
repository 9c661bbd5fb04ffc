import { ErrorPanel } from '../../components/ui/error-panel.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useAudit } from '../../features/team/api/team.ts';
import { useOrg } from '../org-context.ts';

export default function AuditRoute() {
  const { orgId, role } = useOrg();
  const audit = useAudit(orgId);
  if (role !== 'owner') return <ErrorPanel title="Not allowed" message="Only owners read the audit log." />;
  return (
    <div>
      <PageHeader title="Audit log" />
      <QueryState query={audit}>
        {(data) => (
          <table className="w-full rounded-lg border border-line bg-white text-left text-sm">
            <thead className="bg-tide-50 text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2">When (your time)</th>
                <th scope="col" className="px-3 py-2">Who</th>
                <th scope="col" className="px-3 py-2">What</th>
                <th scope="col" className="px-3 py-2">Subject</th>
              </tr>
            </thead>
            <tbody>
              {data.events.map((e) => (
                <tr key={e.id} className="border-t border-line">
                  <td className="px-3 py-2">{new Date(e.createdAt).toLocaleString()}</td>
                  <td className="px-3 py-2">{e.actor ?? '—'}</td>
                  <td className="px-3 py-2">{e.action}</td>
                  <td className="px-3 py-2">{e.subject}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </QueryState>
    </div>
  );
}
