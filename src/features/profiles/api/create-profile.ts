import { useMutation, useQueryClient } from '@tanstack/react-query';
import { profileSchema, type ProfileInput } from '../../../../shared/schemas/organism.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { profilesKeys, profilesPath } from './profiles-keys.ts';

export const createProfile = (orgId: string, input: ProfileInput) => apiSend('POST', profilesPath(orgId), input, profileSchema);

export function useCreateProfile(orgId: string) {
  const client = useQueryClient();
  return useMutation({ mutationFn: (input: ProfileInput) => createProfile(orgId, input), onSuccess: () => client.invalidateQueries({ queryKey: profilesKeys.all }) });
}
