import { useMutation, useQueryClient } from '@tanstack/react-query';
import { profileDetailSchema, type ProfileVersionInput } from '../../../../shared/schemas/organism.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

/** Always a new version (e.g. a what-if saved). */
export const createProfileVersion = (orgId: string, profileId: string, input: ProfileVersionInput) =>
  apiSend('POST', `${profilesPath(orgId)}/${profileId}/versions`, input, profileDetailSchema);

export function useCreateProfileVersion(orgId: string, profileId: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: (input: ProfileVersionInput) => createProfileVersion(orgId, profileId, input), onSuccess: () => client.invalidateQueries({ queryKey: profilesKeys.all }) });
}
