import { queryOptions, useQuery } from '@tanstack/react-query';
import { profileDetailSchema } from '../../../../shared/schemas/organism.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

export const getProfile = (orgId: string, profileId: string) => apiGet(`${profilesPath(orgId)}/${profileId}`, profileDetailSchema);

export const profileQueryOptions = (orgId: string, profileId: string) =>
  queryOptions({ queryKey: profilesKeys.detail(profileId), queryFn: () => getProfile(orgId, profileId) });

export const useProfile = (orgId: string, profileId: string) => useQuery(profileQueryOptions(orgId, profileId));
