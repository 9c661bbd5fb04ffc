import { queryOptions, useQuery } from '@tanstack/react-query';
import { taxonMappingListSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export const getTaxa = (orgId: string) => apiGet(`${labPath(orgId)}/taxa`, taxonMappingListSchema);

export const taxaQueryOptions = (orgId: string) => queryOptions({ queryKey: labKeys.taxa(orgId), queryFn: () => getTaxa(orgId) });

export const useTaxa = (orgId: string) => useQuery(taxaQueryOptions(orgId));
