import { queryOptions, useQuery } from '@tanstack/react-query';
import { plannedSampleListSchema } from '../../../../shared/schemas/sampling.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { samplesPath, samplingKeys } from './sampling-keys.ts';

export interface SampleFilters {
  siteId?: string;
  from?: string;
  to?: string;
}

export const sampleQueryString = (filters: SampleFilters) => {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value) params.set(key, value);
  const text = params.toString();
  return text ? `?${text}` : '';
};

export const getSamples = (orgId: string, filters: SampleFilters) => apiGet(`${samplesPath(orgId)}${sampleQueryString(filters)}`, plannedSampleListSchema);

export const samplesQueryOptions = (orgId: string, filters: SampleFilters) => queryOptions({ queryKey: samplingKeys.list(orgId, filters), queryFn: () => getSamples(orgId, filters) });

export const useSamples = (orgId: string, filters: SampleFilters) => useQuery(samplesQueryOptions(orgId, filters));

/** Links of the exports (the browser downloads them with the session cookie). */
export const calendarUrl = (orgId: string, filters: SampleFilters) => `/api${samplesPath(orgId)}.ics${sampleQueryString(filters)}`;
export const csvUrl = (orgId: string, filters: SampleFilters) => `/api${samplesPath(orgId)}.csv${sampleQueryString(filters)}`;
