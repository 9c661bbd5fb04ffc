import { useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button.tsx';
import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useAcceptInvitation, useInvitation } from '../../features/account/api/accept-invitation.ts';

export default function InvitationRoute() {
  const { token = '' } = useParams();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const navigate = useNavigate();
  return (
    <div className="max-w-xl">
      <PageHeader title="Invitation" />
      <QueryState query={invitation}>
        {(data) => (
          <div className="space-y-4">
            <p>
              You are invited to join <strong>{data.organisationName}</strong> as <strong>{data.role}</strong>.
            </p>
            <Button onClick={() => accept.mutate(undefined, { onSuccess: (r) => r && navigate(`/o/${r.organisationId}`) })} disabled={accept.isPending}>
              Accept invitation
            </Button>
            {accept.error && <p role="alert" className="text-sm text-alarm-600">{accept.error.message}</p>}
          </div>
        )}
      </QueryState>
    </div>
  );
}
