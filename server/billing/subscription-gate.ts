import type { RequestHandler } from 'express';
import type { SubscriptionStatus } from '../../shared/schemas/billing.schema.ts';
import type { Db } from '../db/connect.ts';
import type { BillingAccount } from '../db/tables/billing.ts';
import { AppError } from '../http/app-error.ts';
import '../http/request-context.ts';
import { accountCache } from '../auth/access-cache.ts';
import { findAccount } from './billing.repository.ts';
import { findPlan } from './plans.ts';

export const DEFAULT_GRACE_DAYS = 7;
const DAY_MS = 86_400_000;

export interface GateOptions {
  /** Days a past-due subscription keeps forecasts unlocked, counted from the unpaid invoice (default 7). */
  graceDays?: number;
  /** The clock (tests move it). */
  clock?: () => Date;
}

export interface ForecastAccess {
  unlocked: boolean;
  status: SubscriptionStatus;
  /** For a past-due subscription: when the forecasts lock unless paid. */
  locksAt: Date | null;
}

const KNOWN: readonly string[] = ['trialing', 'active', 'past_due', 'canceled', 'incomplete', 'incomplete_expired', 'unpaid', 'paused'];

/** Active and trialing subscriptions unlock forecasts; past due ones too, until the grace period ends. */
export function accessFromAccount(account: BillingAccount | undefined, options: GateOptions = {}): ForecastAccess {
  const status = (account?.status && KNOWN.includes(account.status) ? account.status : 'none') as SubscriptionStatus;
  if (status === 'trialing' || status === 'active') return { unlocked: true, status, locksAt: null };
  if (status === 'past_due') {
    const now = (options.clock ?? (() => new Date()))();
    const since = account?.past_due_since ?? now;
    const locksAt = new Date(since.getTime() + (options.graceDays ?? DEFAULT_GRACE_DAYS) * DAY_MS);
    return { unlocked: now < locksAt, status, locksAt };
  }
  return { unlocked: false, status, locksAt: null };
}

export async function forecastAccess(db: Db, organisationId: string, options: GateOptions = {}): Promise<ForecastAccess> {
  return accessFromAccount(await accountCache.get(organisationId, () => findAccount(db, organisationId)), options);
}

/**
 * For forecast routes under /orgs/:orgId (after requireMember): passes when the organisation's
 * subscription unlocks forecasts, else answers 402 payment_required, telling owners to subscribe and
 * everyone else to ask their owner.
 */
export function requireActiveSubscription(db: Db, options: GateOptions = {}): RequestHandler {
  return async (req, _res, next) => {
    const organisationId = req.membership?.organisationId ?? req.params.orgId;
    if (typeof organisationId !== 'string') return next(new AppError('not_found', 'No such organisation.'));
    const access = await forecastAccess(db, organisationId, options);
    if (access.unlocked) return next();
    const lapsed = access.status === 'past_due' ? 'The subscription is past due and its grace period has ended, so forecasts are locked. ' : 'Forecasts need an active subscription. ';
    const action = req.membership?.role === 'owner'
      ? 'Subscribe or update the payment on the Billing page to unlock them.'
      : 'Ask an owner of your organisation to subscribe on the Billing page.';
    next(new AppError('payment_required', lapsed + action, { status: access.status }));
  };
}

/**
 * The number of sites the organisation's plan allows, or null when it has no subscription that has
 * not ended (no plan: the caller decides what an organisation without a plan may do).
 */
export async function siteLimitFor(db: Db, organisationId: string): Promise<number | null> {
  const account = await findAccount(db, organisationId);
  if (!account || !['trialing', 'active', 'past_due', 'unpaid', 'paused'].includes(account.status ?? '')) return null;
  return findPlan(account.plan_id)?.sites ?? null;
}
