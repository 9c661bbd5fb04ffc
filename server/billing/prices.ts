import type Stripe from 'stripe';
import type { BillingInterval, Plan } from '../../shared/schemas/billing.schema.ts';
import { INTERVALS, lookupKey, PLANS } from './plans.ts';

const PLAN_KEY = 'planktide_plan';

function matches(price: Stripe.Price, plan: Plan, interval: BillingInterval): boolean {
  return price.active && price.unit_amount === plan.prices[interval] && price.currency === plan.currency && price.recurring?.interval === interval && price.recurring.interval_count === 1;
}

/**
 * Makes sure every plan and interval has its price in the payments service, found again by lookup key
 * (so running it twice creates nothing). A price whose amount no longer matches the plan file is
 * replaced by a new one that takes over the lookup key. Answers lookup key → price id.
 */
export async function ensurePrices(stripe: Stripe, plans: readonly Plan[] = PLANS): Promise<Map<string, string>> {
  const keys = plans.flatMap((plan) => INTERVALS.map((interval) => lookupKey(plan.id, interval)));
  const existing = await stripe.prices.list({ lookup_keys: keys, limit: 100 });
  const byKey = new Map(existing.data.filter((p) => p.lookup_key).map((p) => [p.lookup_key!, p]));
  const products = new Map<string, string>();
  for (const price of existing.data) {
    const planId = price.metadata[PLAN_KEY];
    if (planId) products.set(planId, typeof price.product === 'string' ? price.product : price.product.id);
  }

  const result = new Map<string, string>();
  for (const plan of plans) {
    for (const interval of INTERVALS) {
      const key = lookupKey(plan.id, interval);
      const found = byKey.get(key);
      if (found && matches(found, plan, interval)) {
        result.set(key, found.id);
        continue;
      }
      let product = products.get(plan.id);
      if (!product) {
        product = (await stripe.products.create({ name: `Planktide ${plan.name}`, description: plan.description, metadata: { [PLAN_KEY]: plan.id, sites: String(plan.sites) } })).id;
        products.set(plan.id, product);
      }
      const created = await stripe.prices.create({
        product,
        currency: plan.currency,
        unit_amount: plan.prices[interval],
        recurring: { interval },
        lookup_key: key,
        transfer_lookup_key: Boolean(found),
        nickname: `${plan.name} ${interval}ly`,
        metadata: { [PLAN_KEY]: plan.id, sites: String(plan.sites) },
      });
      result.set(key, created.id);
    }
  }
  return result;
}
