import { useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.tsx';
import { ErrorPanel } from '../../components/ui/error-panel.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useSite } from '../../features/sites/api/get-site.ts';
import { useArchiveSite } from '../../features/sites/api/save-site.ts';
import { SiteForm } from '../../features/sites/components/site-form.tsx';
import { canManage, useOrg } from '../org-context.ts';

export function SiteNewRoute() {
  const { orgId, role } = useOrg();
  const navigate = useNavigate();
  if (!canManage(role)) return <ErrorPanel title="Not allowed" message="Only owners and managers add sites." />;
  return (
    <div>
      <PageHeader title="New site" />
      <SiteForm orgId={orgId} onSaved={() => navigate(`/o/${orgId}/sites`)} />
    </div>
  );
}

export default function SiteEditRoute() {
  const { orgId, role } = useOrg();
  const { siteId = '' } = useParams();
  const navigate = useNavigate();
  const site = useSite(orgId, siteId);
  const archive = useArchiveSite(orgId);
  if (!canManage(role)) return <ErrorPanel title="Not allowed" message="Only owners and managers change sites." />;
  return (
    <QueryState query={site}>
      {(data) => (
        <div>
          <PageHeader title={`Edit ${data.name}`}>
            {!data.archivedAt && (
              <Button variant="secondary" onClick={() => window.confirm(`Archive ${data.name}? Its records are kept.`) && archive.mutate(siteId, { onSuccess: () => navigate(`/o/${orgId}/sites`) })}>
                Archive site
              </Button>
            )}
          </PageHeader>
          <SiteForm key={data.updatedAt} orgId={orgId} site={data} onSaved={() => navigate(`/o/${orgId}/sites`)} />
        </div>
      )}
    </QueryState>
  );
}
