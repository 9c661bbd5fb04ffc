import { queryOptions, useQuery } from '@tanstack/react-query';
import { comparisonSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys, labPath, query } from './lab-keys.ts';

export const getComparison = (orgId: string, profileId: string, siteId: string | undefined) =>
  apiGet(`${labPath(orgId)}/comparison${query({ profileId, siteId })}`, comparisonSchema);

export const comparisonQueryOptions = (orgId: string, profileId: string, siteId: string | undefined) =>
  queryOptions({ queryKey: labKeys.comparison(orgId, profileId, siteId), queryFn: () => getComparison(orgId, profileId, siteId), enabled: Boolean(profileId), retry: false });

export const useComparison = (orgId: string, profileId: string, siteId: string | undefined) => useQuery(comparisonQueryOptions(orgId, profileId, siteId));
