import { queryOptions, useQuery } from '@tanstack/react-query';
import { siteSchema } from '../../../../shared/schemas/site.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getSite = (orgId: string, siteId: string) => apiGet(`/orgs/${orgId}/sites/${siteId}`, siteSchema);

export const siteQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: ['sites', 'detail', siteId], queryFn: () => getSite(orgId, siteId) });

export const useSite = (orgId: string, siteId: string) => useQuery(siteQueryOptions(orgId, siteId));
