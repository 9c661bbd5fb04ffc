import { LRUCache } from 'lru-cache';
import type { Role } from '../../shared/schemas/common.schema.ts';
import type { BillingAccount } from '../db/tables/billing.ts';
import { organisationChanged } from '../http/org-read-cache.ts';
import type { CurrentUser } from '../http/request-context.ts';

/**
 * Every API request reads who is calling, their membership and (for forecasts) the organisation's
 * subscription. Under load the same few rows are read hundreds of times a second, so the answers
 * are kept for a moment. Only found rows are kept (a new membership or subscription counts at
 * once), every change made through the app drops its entry at once, and a change made behind the
 * app's back (by hand in SQL) counts within ACCESS_CACHE_MS.
 */
export const ACCESS_CACHE_MS = 2000;

function shortLived<V extends object>() {
  const cache = new LRUCache<string, V>({ max: 10_000, ttl: ACCESS_CACHE_MS });
  return {
    async get(key: string, load: () => Promise<V | undefined | null>): Promise<V | undefined> {
      const cached = cache.get(key);
      if (cached) return cached;
      const value = (await load()) ?? undefined;
      if (value) cache.set(key, value);
      return value;
    },
    drop: (key: string) => void cache.delete(key),
    clear: () => cache.clear(),
  };
}

const users = shortLived<CurrentUser>();
const memberships = shortLived<{ organisationId: string; role: Role }>();
const accounts = shortLived<BillingAccount>();

export const userCache = { get: users.get, key: (issuer: string, subject: string) => `${issuer}\n${subject}` };
export const membershipCache = { get: memberships.get, key: (organisationId: string, userId: string) => `${organisationId}/${userId}` };
export const accountCache = { get: accounts.get };

/** Called by every write to a membership, and when an organisation is deleted. */
export function membershipChanged(organisationId: string, userId?: string): void {
  if (userId) memberships.drop(membershipCache.key(organisationId, userId));
  else memberships.clear();
}

export function accountChanged(organisationId: string): void {
  accounts.drop(organisationId);
  organisationChanged(organisationId);
}
