import { Navigate } from 'react-router-dom';
import { QueryState } from '../../components/ui/query-state.tsx';
import { useMe } from '../../features/account/api/get-me.ts';
import { lastOrg } from '../org-context.ts';

/** "/": the organisation used last, else the first, else the welcome page. */
export default function HomeRoute() {
  const me = useMe();
  return (
    <QueryState query={me}>
      {(data) => {
        if (data.memberships.length === 0) return <Navigate to="/welcome" replace />;
        const remembered = data.memberships.find((m) => m.organisationId === lastOrg());
        return <Navigate to={`/o/${(remembered ?? data.memberships[0]!).organisationId}`} replace />;
      }}
    </QueryState>
  );
}
