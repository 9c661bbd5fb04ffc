import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { alertListSchema } from '../../../../shared/schemas/forecast.schema.ts';
import { apiGet, apiSend } from '../../../lib/api-client.ts';

export const alertKeys = { list: (orgId: string) => ['alerts', 'list', orgId] as const };

export const getAlerts = (orgId: string) => apiGet(`/orgs/${orgId}/alerts`, alertListSchema);
export const alertsQueryOptions = (orgId: string) => queryOptions({ queryKey: alertKeys.list(orgId), queryFn: () => getAlerts(orgId) });
export const useAlerts = (orgId: string) => useQuery(alertsQueryOptions(orgId));

export const acknowledgeAlert = (orgId: string, alertId: string) => apiSend('POST', `/orgs/${orgId}/alerts/${alertId}/ack`);

export function useAcknowledgeAlert(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (alertId: string) => acknowledgeAlert(orgId, alertId),
    onSuccess: () => Promise.all([client.invalidateQueries({ queryKey: ['alerts'] }), client.invalidateQueries({ queryKey: ['overview'] })]),
  });
}
