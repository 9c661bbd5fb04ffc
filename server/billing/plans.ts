import type { BillingInterval, Plan } from '../../shared/schemas/billing.schema.ts';

/**
 * The plans Planktide sells, priced by the number of sites forecast. Amounts are in minor units
 * (cents). At start-up each plan and interval becomes a price in the payments service, found again by
 * its lookup key (see prices.ts); changing an amount here makes a new price that takes over the key.
 */
export const BILLING_CURRENCY = 'eur';
export const TRIAL_DAYS = 14;

export const PLANS: readonly Plan[] = [
  {
    id: 'buoy',
    name: 'Buoy',
    description: 'One site: forecasts, sampling plans and alerts for a single lease.',
    sites: 1,
    currency: BILLING_CURRENCY,
    prices: { month: 4_900, year: 49_000 },
    trialDays: TRIAL_DAYS,
  },
  {
    id: 'longline',
    name: 'Longline',
    description: 'Up to 5 sites, for a farm with several leases.',
    sites: 5,
    currency: BILLING_CURRENCY,
    prices: { month: 14_900, year: 149_000 },
    trialDays: TRIAL_DAYS,
  },
  {
    id: 'flotilla',
    name: 'Flotilla',
    description: 'Up to 20 sites, for a business farming along a coast.',
    sites: 20,
    currency: BILLING_CURRENCY,
    prices: { month: 39_900, year: 399_000 },
    trialDays: TRIAL_DAYS,
  },
];

export const INTERVALS: readonly BillingInterval[] = ['month', 'year'];

export const lookupKey = (planId: string, interval: BillingInterval) => `planktide_${planId}_${interval}`;

export const findPlan = (planId: string | null | undefined): Plan | undefined => PLANS.find((p) => p.id === planId);

/** The plan and interval a lookup key names, if it is one of ours. */
export function planForLookupKey(key: string | null | undefined): { plan: Plan; interval: BillingInterval } | undefined {
  for (const plan of PLANS) for (const interval of INTERVALS) if (lookupKey(plan.id, interval) === key) return { plan, interval };
  return undefined;
}
