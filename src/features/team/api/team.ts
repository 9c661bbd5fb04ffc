import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '../../../../shared/schemas/common.schema.ts';
import { auditListSchema, invitationListSchema, invitationSchema, memberListSchema } from '../../../../shared/schemas/team.schema.ts';
import { apiGet, apiSend } from '../../../lib/api-client.ts';

export const membersQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ['team', orgId, 'members'], queryFn: () => apiGet(`/orgs/${orgId}/members`, memberListSchema) });
export const invitationsQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ['team', orgId, 'invitations'], queryFn: () => apiGet(`/orgs/${orgId}/invitations`, invitationListSchema) });
export const auditQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ['team', orgId, 'audit'], queryFn: () => apiGet(`/orgs/${orgId}/audit`, auditListSchema) });

export const useMembers = (orgId: string) => useQuery(membersQueryOptions(orgId));
export const useInvitations = (orgId: string) => useQuery(invitationsQueryOptions(orgId));
export const useAudit = (orgId: string) => useQuery(auditQueryOptions(orgId));

function useTeamMutation<A>(orgId: string, fn: (args: A) => Promise<unknown>) {
  const client = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => client.invalidateQueries({ queryKey: ['team', orgId] }) });
}

export const useInvite = (orgId: string) =>
  useTeamMutation(orgId, (input: { email: string; role: Role }) => apiSend('POST', `/orgs/${orgId}/invitations`, input, invitationSchema));
export const useRevokeInvitation = (orgId: string) => useTeamMutation(orgId, (id: string) => apiSend('DELETE', `/orgs/${orgId}/invitations/${id}`));
export const useChangeRole = (orgId: string) =>
  useTeamMutation(orgId, ({ userId, role }: { userId: string; role: Role }) => apiSend('PATCH', `/orgs/${orgId}/members/${userId}`, { role }));
export const useRemoveMember = (orgId: string) => useTeamMutation(orgId, (userId: string) => apiSend('DELETE', `/orgs/${orgId}/members/${userId}`));
