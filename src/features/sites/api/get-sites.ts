import { queryOptions, useQuery } from '@tanstack/react-query';
import { siteListSchema } from '../../../../shared/schemas/site.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getSites = (orgId: string, includeArchived: boolean) =>
  apiGet(`/orgs/${orgId}/sites${includeArchived ? '?archived=include' : ''}`, siteListSchema);

export const sitesQueryOptions = (orgId: string, includeArchived = false) =>
  queryOptions({ queryKey: ['sites', 'list', orgId, { includeArchived }], queryFn: () => getSites(orgId, includeArchived) });

export const useSites = (orgId: string, includeArchived = false) => useQuery(sitesQueryOptions(orgId, includeArchived));
