import { queryOptions, useQuery } from '@tanstack/react-query';
import { meSchema } from '../../../../shared/schemas/team.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getMe = () => apiGet('/me', meSchema);

export const meQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
