import { useMutation, useQueryClient } from '@tanstack/react-query';
import { feedFetchResultSchema, type FeedFetchInput } from '../../../../shared/schemas/tides.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export const fetchFromFeed = (orgId: string, siteId: string, input: FeedFetchInput) => apiSend('POST', `${tidesPath(orgId, siteId)}/feed/fetch`, input, feedFetchResultSchema);

/** Fetches from the tide feed; refreshes the site's tides afterwards, failed or not (failures are recorded). */
export function useFetchFromFeed(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: FeedFetchInput) => fetchFromFeed(orgId, siteId, input),
    onSettled: () => client.invalidateQueries({ queryKey: tidesKeys.site(siteId) }),
  });
}
