import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export const ROLES = ['owner', 'manager', 'biologist', 'crew'] as const;
export type Role = (typeof ROLES)[number];

export interface OrganisationTable {
  id: Generated<string>;
  name: string;
  created_at: Generated<Timestamp>;
}

export interface UserTable {
  id: Generated<string>;
  email: string;
  display_name: string;
  created_at: Generated<Timestamp>;
}

export interface MembershipTable {
  organisation_id: string;
  user_id: string;
  role: Role;
  created_at: Generated<Timestamp>;
}

export interface SiteTable {
  id: Generated<string>;
  organisation_id: string;
  name: string;
  latitude_deg: number;
  longitude_deg: number;
  time_zone: string;
  water_depth_m: number;
  bed_roughness_m: number;
  gear_top_m: number;
  gear_bottom_m: number;
  created_at: Generated<Timestamp>;
  updated_at: Generated<Timestamp>;
}

export interface Database {
  organisations: OrganisationTable;
  users: UserTable;
  memberships: MembershipTable;
  sites: SiteTable;
}

export type Organisation = Selectable<OrganisationTable>;
export type NewOrganisation = Insertable<OrganisationTable>;
export type User = Selectable<UserTable>;
export type NewUser = Insertable<UserTable>;
export type Membership = Selectable<MembershipTable>;
export type Site = Selectable<SiteTable>;
export type NewSite = Insertable<SiteTable>;
export type SiteUpdate = Updateable<SiteTable>;
