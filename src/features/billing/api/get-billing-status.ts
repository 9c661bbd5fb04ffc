import { queryOptions, useQuery } from '@tanstack/react-query';
import { billingStatusSchema } from '../../../../shared/schemas/billing.schema.ts';
import { apiGet } from '../../../lib/api-client.ts';

export const getBillingStatus = (orgId: string) => apiGet(`/orgs/${orgId}/billing`, billingStatusSchema);

export const billingStatusQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ['billing', 'status', orgId], queryFn: () => getBillingStatus(orgId) });

/** Billing status; `waitForSubscription` polls while the payments service's confirmation is on its way. */
export const useBillingStatus = (orgId: string, waitForSubscription = false) =>
  useQuery({
    ...billingStatusQueryOptions(orgId),
    refetchInterval: (query) => (waitForSubscription && query.state.data?.detail?.status === 'none' ? 1000 : false),
  });
