import { queryOptions, useQuery } from '@tanstack/react-query';
import { overviewSchema } from '../../../../shared/schemas/sampling.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getOverview = (orgId: string) => apiGet(`/orgs/${orgId}/overview`, overviewSchema);
export const overviewQueryOptions = (orgId: string) => queryOptions({ queryKey: ['overview', orgId], queryFn: () => getOverview(orgId), refetchInterval: 5 * 60_000 });
export const useOverview = (orgId: string) => useQuery(overviewQueryOptions(orgId));
