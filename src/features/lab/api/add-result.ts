import { useMutation, useQueryClient } from '@tanstack/react-query';
import { labResultSchema } from '../../../../shared/schemas/lab.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';
import { labKeys, labPath } from './lab-keys.ts';

export const addResult = (orgId: string, input: unknown) => apiSend('POST', `${labPath(orgId)}/results`, input, labResultSchema);

export function useAddResult(orgId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: unknown) => addResult(orgId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.all(orgId) }),
  });
}
