import { PageHeader } from '../../components/ui/page-header.tsx';
import { QueryState } from '../../components/ui/query-state.tsx';
import { SafetyNotice } from '../../components/ui/safety-notice.tsx';
import { useAlerts } from '../../features/alerts/api/alerts.ts';
import { AlertList } from '../../features/alerts/components/alert-list.tsx';
import { canManage, useOrg } from '../org-context.ts';

export default function AlertsRoute() {
  const { orgId, role } = useOrg();
  const alerts = useAlerts(orgId);
  return (
    <div className="space-y-4">
      <PageHeader title="Alerts" />
      <p className="text-sm text-ink-soft">Raised when a forecast crosses a trigger at the gear band, or when a scheduled official sample falls in an unrepresentative phase. {canManage(role) ? 'Acknowledging records your name and the time.' : 'Owners and managers acknowledge them.'}</p>
      <QueryState query={alerts}>{(data) => <AlertList orgId={orgId} alerts={data.alerts} canAcknowledge={canManage(role)} />}</QueryState>
      <SafetyNotice compact />
    </div>
  );
}
