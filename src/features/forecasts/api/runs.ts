import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { forecastRunListSchema, type ForecastRun } from '../../../../shared/schemas/forecast.schema.ts';
import { apiGet, apiSend } from '../../../lib/api-client.ts';
import { forecastKeys } from './forecast-keys.ts';

export const getRuns = (orgId: string, siteId: string) => apiGet(`/orgs/${orgId}/sites/${siteId}/runs`, forecastRunListSchema);

const busy = (runs: ForecastRun[] | undefined) => (runs ?? []).some((r) => r.status === 'queued' || r.status === 'running');

/** The site's runs; polled every 2 s while one is queued or running. */
export const runsQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({
    queryKey: forecastKeys.runs(siteId),
    queryFn: () => getRuns(orgId, siteId),
    refetchInterval: (query) => (busy(query.state.data?.runs) ? 2000 : false),
  });

export const useRuns = (orgId: string, siteId: string, enabled: boolean) => useQuery({ ...runsQueryOptions(orgId, siteId), enabled });

export const runNow = (orgId: string, siteId: string, horizonDays: number) => apiSend('POST', `/orgs/${orgId}/sites/${siteId}/runs`, { horizonDays }, forecastRunListSchema);

export function useRunNow(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (horizonDays: number) => runNow(orgId, siteId, horizonDays),
    onSuccess: () => client.invalidateQueries({ queryKey: forecastKeys.runs(siteId) }),
  });
}
