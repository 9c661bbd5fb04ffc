import { queryOptions, useQuery } from '@tanstack/react-query';
import { healthSchema } from '../../../../shared/schemas/health.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getHealth = () => apiGet('/health', healthSchema, [503]);

export const healthQueryOptions = () =>
  queryOptions({ queryKey: ['health'], queryFn: getHealth, refetchInterval: 30_000 });

export const useHealth = () => useQuery(healthQueryOptions());
