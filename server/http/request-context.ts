import type { Role } from '../../shared/schemas/common.schema.ts';

export interface CurrentUser {
  id: string;
  email: string;
  displayName: string;
}

export interface CurrentMembership {
  organisationId: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set by loadCurrentUser when the caller is signed in. */
      user?: CurrentUser;
      /** Set by requireMember for routes under /api/orgs/:orgId. */
      membership?: CurrentMembership;
    }
  }
}
