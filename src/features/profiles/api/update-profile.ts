import { useMutation, useQueryClient } from '@tanstack/react-query';
import { profileEditResultSchema, type ProfileUpdate } from '../../../../shared/schemas/organism.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

/** An edit: the server changes the latest version in place while unused, otherwise adds a version. */
export const updateProfile = (orgId: string, profileId: string, edit: ProfileUpdate) => apiSend('PATCH', `${profilesPath(orgId)}/${profileId}`, edit, profileEditResultSchema);

export function useUpdateProfile(orgId: string, profileId: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: (edit: ProfileUpdate) => updateProfile(orgId, profileId, edit), onSuccess: () => client.invalidateQueries({ queryKey: profilesKeys.all }) });
}
