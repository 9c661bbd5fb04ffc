import { ErrorPanel } from '../../components/ui/error-panel.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useInvitations, useMembers, useRevokeInvitation } from '../../features/team/api/team.ts';
import { InviteForm } from '../../features/team/components/invite-form.tsx';
import { MemberTable } from '../../features/team/components/member-table.tsx';
import { Button } from '../../components/ui/button.tsx';
import { canManage, useOrg } from '../org-context.ts';

export default function TeamRoute() {
  const { orgId, role, me } = useOrg();
  const members = useMembers(orgId);
  const invitations = useInvitations(orgId);
  const revoke = useRevokeInvitation(orgId);
  if (!canManage(role)) return <ErrorPanel title="Not allowed" message="Owners and managers look after the team." />;
  return (
    <div className="space-y-8">
      <PageHeader title="Team" />
      <section aria-labelledby="members">
        <h2 id="members" className="mb-2 text-lg font-bold">Members</h2>
        <QueryState query={members}>{(data) => <MemberTable orgId={orgId} members={data.members} isOwner={role === 'owner'} myId={me.id} />}</QueryState>
      </section>
      <section aria-labelledby="invite" className="space-y-3">
        <h2 id="invite" className="text-lg font-bold">Invite someone</h2>
        <InviteForm orgId={orgId} myRole={role} />
        <QueryState query={invitations}>
          {(data) => (
            <ul className="divide-y divide-line rounded-lg border border-line bg-white">
              {data.invitations.map((inv) => (
                <li key={inv.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
                  <span>
                    {inv.email} · {inv.role} · <strong>{inv.status}</strong> · expires {new Date(inv.expiresAt).toLocaleString()}
                  </span>
                  {inv.status === 'pending' && (
                    <Button variant="secondary" onClick={() => revoke.mutate(inv.id)}>
                      Withdraw
                    </Button>
                  )}
                </li>
              ))}
            </ul>
          )}
        </QueryState>
      </section>
    </div>
  );
}
