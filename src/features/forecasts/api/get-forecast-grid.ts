import { queryOptions, useQuery } from '@tanstack/react-query';
import { decodeGrid } from '../../../../shared/forecast/grid-codec.ts';
import type { ForecastGrid } from '../../../../shared/forecast/grid.ts';
import { markGridArrived } from '../../../components/charts/perf-marks.ts';
import { apiGetBinary } from '../../../lib/api-client.ts';
import { forecastKeys } from './forecast-keys.ts';

/** The forecast's grid (binary, served gzip-encoded; the browser unpacks it), decoded into typed arrays. */
export async function getForecastGrid(orgId: string, forecastId: string): Promise<ForecastGrid> {
  const grid = decodeGrid(await apiGetBinary(`/orgs/${orgId}/forecasts/${forecastId}/grid`));
  markGridArrived();
  return grid;
}

// A forecast never changes once made: its grid is kept as long as the page lives.
export const forecastGridQueryOptions = (orgId: string, forecastId: string) =>
  queryOptions({ queryKey: forecastKeys.grid(forecastId), queryFn: () => getForecastGrid(orgId, forecastId), staleTime: Number.POSITIVE_INFINITY, gcTime: 10 * 60_000 });

export const useForecastGrid = (orgId: string, forecastId: string | undefined) => useQuery({ ...forecastGridQueryOptions(orgId, forecastId ?? ''), enabled: Boolean(forecastId) });
