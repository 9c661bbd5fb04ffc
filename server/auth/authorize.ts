import type { RequestHandler } from 'express';
import type { Role } from '../../shared/schemas/common.schema.ts';
import type { Db } from '../db/connect.ts';
import { membershipCache } from './access-cache.ts';
import { AppError } from '../http/app-error.ts';
import '../http/request-context.ts';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const ALL_ROLES: readonly Role[] = ['owner', 'manager', 'biologist', 'crew'];

/** Who may call a route: signed-in users, or members of the route's organisation with one of the roles. */
export const requireSignedIn: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new AppError('unauthenticated', 'Sign in to use this. Your session may have ended.'));
  next();
};

/**
 * For routes under /orgs/:orgId: the caller must be a member with one of `roles`.
 * Non-members get 404 so that other organisations' ids reveal nothing.
 */
export function requireMember(db: Db, roles: readonly Role[]): RequestHandler {
  return async (req, _res, next) => {
    if (!req.user) return next(new AppError('unauthenticated', 'Sign in to use this. Your session may have ended.'));
    const orgId = req.params.orgId;
    if (typeof orgId !== 'string' || !UUID.test(orgId)) return next(new AppError('not_found', 'No such organisation.'));
    const userId = req.user.id;
    const membership = await membershipCache.get(membershipCache.key(orgId, userId), async () => {
      const row = await db.selectFrom('memberships').select(['organisation_id', 'role']).where('organisation_id', '=', orgId).where('user_id', '=', userId).executeTakeFirst();
      return row && { organisationId: row.organisation_id, role: row.role };
    });
    if (!membership) return next(new AppError('not_found', 'No such organisation.'));
    req.membership = { ...membership };
    if (!roles.includes(membership.role)) {
      return next(new AppError('forbidden', `Your role (${membership.role}) may not do this; it needs ${roles.join(' or ')}.`));
    }
    next();
  };
}
