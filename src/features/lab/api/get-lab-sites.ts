import { queryOptions, useQuery } from '@tanstack/react-query';
import { siteListSchema } from '../../../../shared/schemas/site.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys } from './lab-keys.ts';

/** The organisation's sites, for choosing where a result was sampled. */
export const getLabSites = (orgId: string) => apiGet(`/orgs/${orgId}/sites`, siteListSchema);

export const labSitesQueryOptions = (orgId: string) => queryOptions({ queryKey: labKeys.sites(orgId), queryFn: () => getLabSites(orgId) });

export const useLabSites = (orgId: string) => useQuery(labSitesQueryOptions(orgId));
