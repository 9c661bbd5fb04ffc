import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { profileListSchema } from '../../../../shared/schemas/organism.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { forecastKeys } from './forecast-keys.ts';

const watchAnswerSchema = z.object({ profileIds: z.array(z.string()) });

export const getWatch = (orgId: string, siteId: string) => apiGet(`/orgs/${orgId}/sites/${siteId}/watch`, watchAnswerSchema);
export const watchQueryOptions = (orgId: string, siteId: string) => queryOptions({ queryKey: forecastKeys.watch(siteId), queryFn: () => getWatch(orgId, siteId) });
export const useWatch = (orgId: string, siteId: string) => useQuery(watchQueryOptions(orgId, siteId));

/** The organisation's organism profiles (names for the organism choice). */
export const getProfiles = (orgId: string) => apiGet(`/orgs/${orgId}/profiles`, profileListSchema);
export const profilesQueryOptions = (orgId: string) => queryOptions({ queryKey: forecastKeys.profiles(orgId), queryFn: () => getProfiles(orgId) });
export const useProfiles = (orgId: string) => useQuery(profilesQueryOptions(orgId));
