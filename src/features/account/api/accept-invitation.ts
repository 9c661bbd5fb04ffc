import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationPreviewSchema } from '../../../../shared/schemas/team.schema.ts';
import { apiGet, apiSend } from '../../../lib/api-client.ts';

const acceptedSchema = z.object({ organisationId: z.string(), organisationName: z.string(), role: z.string() });

export const invitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', 'detail', token], queryFn: () => apiGet(`/invitations/${token}`, invitationPreviewSchema), retry: false });

export const useInvitation = (token: string) => useQuery(invitationQueryOptions(token));

export function useAcceptInvitation(token: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => apiSend('POST', `/invitations/${token}/accept`, undefined, acceptedSchema),
    onSuccess: () => client.invalidateQueries({ queryKey: ['me'] }),
  });
}
