import { queryOptions, useQuery } from '@tanstack/react-query';
import { forecastSchema } from '../../../../shared/schemas/forecast.schema.ts';
import { apiGet, ApiError } from '../../../lib/api-client.ts';

/**
 * The profile's latest stored forecast for a site. No forecast (404) and no subscription (402) are
 * answers, not failures: the what-if then computes the saved version itself.
 */
export async function getLatestForecast(orgId: string, siteId: string, profileId: string) {
  try {
    return { forecast: await apiGet(`/orgs/${orgId}/sites/${siteId}/forecasts/latest?profileId=${profileId}`, forecastSchema), reason: null };
  } catch (error) {
    if (error instanceof ApiError && (error.status === 404 || error.status === 402)) return { forecast: null, reason: error.status === 402 ? ('subscription' as const) : ('none' as const) };
    throw error;
  }
}

export const latestForecastQueryOptions = (orgId: string, siteId: string, profileId: string) =>
  queryOptions({ queryKey: ['forecasts', 'latest', siteId, profileId], queryFn: () => getLatestForecast(orgId, siteId, profileId), retry: false });

export const useLatestForecast = (orgId: string, siteId: string | null, profileId: string) =>
  useQuery({ ...latestForecastQueryOptions(orgId, siteId ?? '', profileId), enabled: siteId !== null });
