import { queryOptions, useQuery } from '@tanstack/react-query';
import { profileListSchema } from '../../../../shared/schemas/organism.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { labKeys } from './lab-keys.ts';

/** The organisation's organism profiles, for mapping taxa, comparing and calibrating. */
export const getLabProfiles = (orgId: string) => apiGet(`/orgs/${orgId}/profiles`, profileListSchema);

export const labProfilesQueryOptions = (orgId: string) => queryOptions({ queryKey: labKeys.profiles(orgId), queryFn: () => getLabProfiles(orgId) });

export const useLabProfiles = (orgId: string) => useQuery(labProfilesQueryOptions(orgId));
