import { useMutation, useQueryClient } from '@tanstack/react-query';
import { organisationSchema } from '../../../../shared/schemas/team.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';

export const createOrganisation = (name: string) => apiSend('POST', '/organisations', { name }, organisationSchema);

export function useCreateOrganisation() {
  const client = useQueryClient();
  return useMutation({ mutationFn: createOrganisation, onSuccess: () => client.invalidateQueries({ queryKey: ['me'] }) });
}
