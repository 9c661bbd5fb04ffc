import { z } from 'zod';
import { isoDateTimeSchema } from './common.schema.ts';

export const BILLING_INTERVALS = ['month', 'year'] as const;
export const billingIntervalSchema = z.enum(BILLING_INTERVALS);
export type BillingInterval = z.infer<typeof billingIntervalSchema>;

/** The payments service's subscription states, and "none" before the first subscription. */
export const subscriptionStatusSchema = z.enum(['none', 'trialing', 'active', 'past_due', 'canceled', 'incomplete', 'incomplete_expired', 'unpaid', 'paused']);
export type SubscriptionStatus = z.infer<typeof subscriptionStatusSchema>;

export const planSchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  /** The most sites the plan forecasts. */
  sites: z.number().int().positive(),
  currency: z.string(),
  /** Amounts in minor units (cents) per interval. */
  prices: z.object({ month: z.number().int().nonnegative(), year: z.number().int().nonnegative() }),
  trialDays: z.number().int().nonnegative(),
});
export type Plan = z.infer<typeof planSchema>;

export const invoiceSchema = z.object({
  id: z.string(),
  number: z.string().nullable(),
  status: z.string(),
  amount: z.number().int(),
  currency: z.string(),
  createdAt: isoDateTimeSchema,
  periodStart: isoDateTimeSchema,
  periodEnd: isoDateTimeSchema,
  url: z.string().nullable(),
});
export type Invoice = z.infer<typeof invoiceSchema>;

/** What owners see of their organisation's billing. */
export const billingDetailSchema = z.object({
  status: subscriptionStatusSchema,
  plan: planSchema.nullable(),
  interval: billingIntervalSchema.nullable(),
  trialEnd: isoDateTimeSchema.nullable(),
  currentPeriodEnd: isoDateTimeSchema.nullable(),
  cancelAtPeriodEnd: z.boolean(),
  pastDueSince: isoDateTimeSchema.nullable(),
  /** When a past-due subscription locks the forecasts, unless paid before. */
  locksAt: isoDateTimeSchema.nullable(),
  nextInvoice: z.object({ amount: z.number().int(), currency: z.string(), date: isoDateTimeSchema }).nullable(),
  invoices: z.array(invoiceSchema),
  /** True when the payments service could not be asked for the invoices just now. */
  invoicesUnavailable: z.boolean(),
  /** A free trial is offered only to an organisation that has never subscribed. */
  trialAvailable: z.boolean(),
  /** True when there is a subscription to change or cancel in the portal. */
  canManage: z.boolean(),
  plans: z.array(planSchema),
});
export type BillingDetail = z.infer<typeof billingDetailSchema>;

/** GET /orgs/:orgId/billing: every member learns whether forecasts are unlocked; owners get the detail. */
export const billingStatusSchema = z.object({
  forecastsUnlocked: z.boolean(),
  detail: billingDetailSchema.nullable(),
});
export type BillingStatus = z.infer<typeof billingStatusSchema>;

export const checkoutInputSchema = z.object({
  plan: z.string().min(1, 'choose a plan'),
  interval: billingIntervalSchema,
});
export type CheckoutInput = z.infer<typeof checkoutInputSchema>;

/** Where to send the browser next (the payments service's checkout or portal page). */
export const billingRedirectSchema = z.object({ url: z.url() });
