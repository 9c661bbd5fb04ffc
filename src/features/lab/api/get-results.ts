import { queryOptions, useQuery } from '@tanstack/react-query';
import { labResultListSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys, labPath, query } from './lab-keys.ts';

export const getResults = (orgId: string, filters: { siteId?: string; taxon?: string }) => apiGet(`${labPath(orgId)}/results${query(filters)}`, labResultListSchema);

export const resultsQueryOptions = (orgId: string, filters: { siteId?: string; taxon?: string }) =>
  queryOptions({ queryKey: labKeys.results(orgId, filters), queryFn: () => getResults(orgId, filters) });

export const useResults = (orgId: string, filters: { siteId?: string; taxon?: string }) => useQuery(resultsQueryOptions(orgId, filters));

/** Where the Darwin Core export of the same filter downloads from. */
export const exportUrl = (orgId: string, filters: { siteId?: string; taxon?: string }) => `/api${labPath(orgId)}/results/export.csv${query(filters)}`;
