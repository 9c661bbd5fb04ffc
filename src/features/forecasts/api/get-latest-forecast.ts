import { queryOptions, useQuery } from '@tanstack/react-query';
import { forecastSchema } from '../../../../shared/schemas/forecast.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { forecastKeys } from './forecast-keys.ts';

export const getLatestForecast = (orgId: string, siteId: string, profileId: string) =>
  apiGet(`/orgs/${orgId}/sites/${siteId}/forecasts/latest?profileId=${encodeURIComponent(profileId)}`, forecastSchema);

export const latestForecastQueryOptions = (orgId: string, siteId: string, profileId: string) =>
  queryOptions({ queryKey: forecastKeys.latest(siteId, profileId), queryFn: () => getLatestForecast(orgId, siteId, profileId) });

export const useLatestForecast = (orgId: string, siteId: string, profileId: string | undefined) =>
  useQuery({ ...latestForecastQueryOptions(orgId, siteId, profileId ?? ''), enabled: Boolean(profileId) });
