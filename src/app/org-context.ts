import { useOutletContext } from 'react-router-dom';
import type { Role } from '../../shared/schemas/common.schema.ts';
import type { Me } from '../../shared/schemas/team.schema.ts';

export interface OrgContext {
  orgId: string;
  orgName: string;
  role: Role;
  me: Me;
}

export const useOrg = () => useOutletContext<OrgContext>();

const LAST_ORG_KEY = 'planktide.lastOrganisation';
export const rememberOrg = (orgId: string) => window.localStorage.setItem(LAST_ORG_KEY, orgId);
export const lastOrg = () => window.localStorage.getItem(LAST_ORG_KEY);

export const canManage = (role: Role) => role === 'owner' || role === 'manager';
