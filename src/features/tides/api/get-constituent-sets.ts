import { queryOptions, useQuery } from '@tanstack/react-query';
import { constituentSetListSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export const getConstituentSets = (orgId: string, siteId: string) => apiGet(`${tidesPath(orgId, siteId)}/sets`, constituentSetListSchema);

export const constituentSetsQueryOptions = (orgId: string, siteId: string) =>
  queryOptions({ queryKey: tidesKeys.sets(siteId), queryFn: () => getConstituentSets(orgId, siteId) });

export const useConstituentSets = (orgId: string, siteId: string) => useQuery(constituentSetsQueryOptions(orgId, siteId));
