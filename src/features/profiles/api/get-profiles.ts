import { queryOptions, useQuery } from '@tanstack/react-query';
import { profileListSchema } from '../../../../shared/schemas/organism.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

export const getProfiles = (orgId: string) => apiGet(profilesPath(orgId), profileListSchema);

export const profilesQueryOptions = (orgId: string) => queryOptions({ queryKey: profilesKeys.list(orgId), queryFn: () => getProfiles(orgId) });

export const useProfiles = (orgId: string) => useQuery(profilesQueryOptions(orgId));
