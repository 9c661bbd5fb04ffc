import { useMutation } from '@tanstack/react-query';
import { billingRedirectSchema } from '../../../../shared/schemas/billing.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';

export const openPortal = (orgId: string) => apiSend('POST', `/orgs/${orgId}/billing/portal`, undefined, billingRedirectSchema);

/** Asks for a page of the payments service's customer portal; the caller sends the browser there. */
export const useOpenPortal = (orgId: string) => useMutation({ mutationFn: () => openPortal(orgId) });
