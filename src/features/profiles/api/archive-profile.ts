import { useMutation, useQueryClient } from '@tanstack/react-query';
import { profileDetailSchema } from '../../../../shared/schemas/organism.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

export const archiveProfile = (orgId: string, profileId: string) => apiSend('POST', `${profilesPath(orgId)}/${profileId}/archive`, undefined, profileDetailSchema);

export function useArchiveProfile(orgId: string, profileId: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: () => archiveProfile(orgId, profileId), onSuccess: () => client.invalidateQueries({ queryKey: profilesKeys.all }) });
}
