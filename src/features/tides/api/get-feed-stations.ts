import { queryOptions, useQuery } from '@tanstack/react-query';
import { feedStationListSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export const getFeedStations = (orgId: string, siteId: string) => apiGet(`${tidesPath(orgId, siteId)}/feed/stations`, feedStationListSchema);

export const feedStationsQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: tidesKeys.stations(siteId), queryFn: () => getFeedStations(orgId, siteId), retry: false });

/** Loaded on demand (when the person opens the station chooser). */
export const useFeedStations = (orgId: string, siteId: string, enabled: boolean) => useQuery({ ...feedStationsQueryOptions(orgId, siteId), enabled });
