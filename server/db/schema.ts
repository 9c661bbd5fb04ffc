import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

/** A timestamptz column: read as Date, written as Date or ISO string, optional on insert (defaults). */
type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type RequiredTimestamp = ColumnType<Date, Date | string, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;

import type { Role } from '../../shared/schemas/common.schema.ts';

export type { Role };

export interface OrganisationTable {
  id: Generated<string>;
  name: string;
  created_at: Timestamp;
}

export interface UserTable {
  id: Generated<string>;
  email: string;
  display_name: string;
  oidc_issuer: string | null;
  oidc_subject: string | null;
  created_at: Timestamp;
}

export interface MembershipTable {
  organisation_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
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
  bed_type: string | null;
  archived_at: NullableTimestamp;
  forecast_local_time: ColumnType<string, string | undefined, string>;
  forecast_horizon_days: ColumnType<number, number | undefined, number>;
  window_settings: ColumnType<unknown, string | undefined, string>;
  /** The site's tides (server/db/tables/tides.ts). */
  active_constituent_set_id: string | null;
  tide_station_id: string | null;
  tide_station_name: string | null;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface InvitationTable {
  id: Generated<string>;
  organisation_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  created_at: Timestamp;
  expires_at: RequiredTimestamp;
  accepted_at: NullableTimestamp;
  accepted_by: string | null;
  revoked_at: NullableTimestamp;
}

export interface AuditEventTable {
  id: Generated<number>;
  organisation_id: string | null;
  actor_user_id: string | null;
  action: string;
  subject: string;
  details: ColumnType<Record<string, unknown>, string | undefined, string>;
  created_at: Timestamp;
}

export interface AppSessionTable {
  sid: string;
  sess: unknown;
  expire: Date;
}

import type { BillingTables } from './tables/billing.ts';
import type { ForecastTables } from './tables/forecasts.ts';
import type { LabTables } from './tables/lab.ts';
import type { SamplingTables } from './tables/sampling.ts';
import type { TidesTables } from './tables/tides.ts';

/** Every table; each product area declares its own in server/db/tables/. */
export interface Database extends TidesTables, ForecastTables, BillingTables, SamplingTables, LabTables {
  organisations: OrganisationTable;
  users: UserTable;
  memberships: MembershipTable;
  sites: SiteTable;
  invitations: InvitationTable;
  audit_events: AuditEventTable;
  app_sessions: AppSessionTable;
}

export type Organisation = Selectable<OrganisationTable>;
export type NewOrganisation = Insertable<OrganisationTable>;
export type User = Selectable<UserTable>;
export type NewUser = Insertable<UserTable>;
export type Membership = Selectable<MembershipTable>;
export type Site = Selectable<SiteTable>;
export type NewSite = Insertable<SiteTable>;
export type SiteUpdate = Updateable<SiteTable>;
export type Invitation = Selectable<InvitationTable>;
export type AuditEvent = Selectable<AuditEventTable>;
