import { queryOptions, useQuery } from '@tanstack/react-query';
import { activeSetSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

/** The site's active constituent set (null when it has none), for the what-if. */
export const getActiveTides = (orgId: string, siteId: string) => apiGet(`/orgs/${orgId}/sites/${siteId}/tides/active`, activeSetSchema);

export const activeTidesQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: ['tides', siteId, 'active'], queryFn: () => getActiveTides(orgId, siteId) });

export const useActiveTides = (orgId: string, siteId: string | null) => useQuery({ ...activeTidesQueryOptions(orgId, siteId ?? ''), enabled: siteId !== null });
