import { useMutation, useQueryClient } from '@tanstack/react-query';
import { constituentSetSchema } from '../../../../shared/schemas/tides.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { tidesKeys, tidesPath } from './tides-keys.ts';

export const activateConstituentSet = (orgId: string, siteId: string, setId: string) =>
  apiSend('POST', `${tidesPath(orgId, siteId)}/sets/${setId}/activate`, undefined, constituentSetSchema);

export function useActivateConstituentSet(orgId: string, siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (setId: string) => activateConstituentSet(orgId, siteId, setId),
    onSuccess: () => client.invalidateQueries({ queryKey: tidesKeys.site(siteId) }),
  });
}
