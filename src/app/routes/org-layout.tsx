import { useEffect } from 'react';
import { Outlet, useParams } from 'react-router-dom';
import { ErrorPanel } from '../../components/ui/error-panel.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useMe } from '../../features/account/api/get-me.ts';
import { rememberOrg, type OrgContext } from '../org-context.ts';

/** /o/:orgId: checks the membership and hands the organisation and role to its pages. */
export default function OrgLayoutRoute() {
  const { orgId = '' } = useParams();
  const me = useMe();
  const member = me.data?.memberships.some((m) => m.organisationId === orgId);
  useEffect(() => {
    if (member) rememberOrg(orgId);
  }, [member, orgId]);
  return (
    <QueryState query={me}>
      {(data) => {
        const membership = data.memberships.find((m) => m.organisationId === orgId);
        if (!membership) return <ErrorPanel title="Not found" message="You are not a member of this organisation, or it no longer exists." />;
        const context: OrgContext = { orgId, orgName: membership.organisationName, role: membership.role, me: data };
        return <Outlet context={context} />;
      }}
    </QueryState>
  );
}
