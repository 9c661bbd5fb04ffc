import { queryOptions, useQuery } from '@tanstack/react-query';
import { feedRefreshListSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export const getFeedRefreshes = (orgId: string, siteId: string) => apiGet(`${tidesPath(orgId, siteId)}/feed/refreshes`, feedRefreshListSchema);

export const feedRefreshesQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: tidesKeys.refreshes(siteId), queryFn: () => getFeedRefreshes(orgId, siteId) });

export const useFeedRefreshes = (orgId: string, siteId: string) => useQuery(feedRefreshesQueryOptions(orgId, siteId));
