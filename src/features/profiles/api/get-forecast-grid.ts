import { queryOptions, useQuery } from '@tanstack/react-query';
import { decodeGrid } from '../../../../shared/forecast/grid-codec.ts';
import { ApiError } from '../../../lib/api-client.ts';

/** A stored forecast's grid (binary, gzip-encoded on the wire; the browser unpacks it). */
export async function getForecastGrid(orgId: string, forecastId: string) {
  const response = await fetch(`/api/orgs/${orgId}/forecasts/${forecastId}/grid`, { credentials: 'same-origin' });
  if (!response.ok) throw new ApiError(response.status, 'grid_unavailable', `The forecast grid could not be loaded (${response.status}).`);
  return decodeGrid(await response.arrayBuffer());
}

export const forecastGridQueryOptions = (orgId: string, forecastId: string) =>
  queryOptions({ queryKey: ['forecasts', 'grid', forecastId], queryFn: () => getForecastGrid(orgId, forecastId), staleTime: Infinity });

export const useForecastGrid = (orgId: string, forecastId: string | null) => useQuery({ ...forecastGridQueryOptions(orgId, forecastId ?? ''), enabled: forecastId !== null });
