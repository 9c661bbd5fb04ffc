import { useState } from 'react';
import { Link } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useSites } from '../../features/sites/api/get-sites.ts';
import { SiteList } from '../../features/sites/components/site-list.tsx';
import { canManage, useOrg } from '../org-context.ts';

export default function SitesRoute() {
  const { orgId, role } = useOrg();
  const [showArchived, setShowArchived] = useState(false);
  const sites = useSites(orgId, showArchived);
  const editor = canManage(role);
  return (
    <div>
      <PageHeader title="Sites">
        {editor && (
          <Link to={`/o/${orgId}/sites/new`} className="rounded-md bg-tide-700 px-4 py-2 text-sm font-semibold text-white hover:bg-tide-900">
            New site
          </Link>
        )}
      </PageHeader>
      <label className="mb-3 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} /> Show archived sites
      </label>
      <QueryState query={sites}>{(data) => <SiteList orgId={orgId} sites={data.sites} canEdit={editor} />}</QueryState>
    </div>
  );
}
