import { useMutation } from '@tanstack/react-query';
import { billingRedirectSchema, type CheckoutInput } from '../../../../shared/schemas/billing.schema.ts';
import { apiSend } from '../../../lib/api-client.ts';

export const startCheckout = (orgId: string, input: CheckoutInput) => apiSend('POST', `/orgs/${orgId}/billing/checkout`, input, billingRedirectSchema);

/** Asks for a checkout page for the plan; the caller sends the browser there. */
export const useStartCheckout = (orgId: string) => useMutation({ mutationFn: (input: CheckoutInput) => startCheckout(orgId, input) });
