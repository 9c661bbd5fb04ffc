import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { forecastSettingsSchema, type ForecastSettingsInput } from '../../../../shared/schemas/sampling.schema.ts';
import { apiGet, apiSend } from '../../../lib/api-client.ts';
import { samplingKeys } from './sampling-keys.ts';

const path = (orgId: string, siteId: string) => `/orgs/${orgId}/sites/${siteId}/forecast-settings`;

export const forecastSettingsQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: samplingKeys.settings(siteId), queryFn: () => apiGet(path(orgId, siteId), forecastSettingsSchema) });

export const useForecastSettings = (orgId: string, siteId: string) => useQuery(forecastSettingsQueryOptions(orgId, siteId));

export function useSaveForecastSettings(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (settings: ForecastSettingsInput) => apiSend('PUT', path(orgId, siteId), settings, forecastSettingsSchema),
    onSuccess: (saved) => saved && client.setQueryData(samplingKeys.settings(siteId), saved),
  });
}
