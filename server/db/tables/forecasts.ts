import type { ColumnType, Generated } from 'kysely';

/** Tables of the forecast area: organism profiles, forecast runs, forecasts, alerts, mail. */

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
type Json<T> = ColumnType<T, string, string>;

export interface OrganismProfileTable {
  id: Generated<string>;
  organisation_id: string;
  name: string;
  taxon: string;
  created_at: Timestamp;
  archived_at: NullableTimestamp;
}

export interface OrganismProfileVersionTable {
  id: Generated<string>;
  profile_id: string;
  organisation_id: string;
  version: number;
  params: Json<unknown>;
  note: ColumnType<string, string | undefined, string>;
  created_at: Timestamp;
  created_by: string | null;
  first_used_at: NullableTimestamp;
}

export interface SiteOrganismTable {
  site_id: string;
  profile_id: string;
}

export type RunStatus = 'queued' | 'running' | 'done' | 'failed';

export interface ForecastRunTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  profile_version_id: string;
  constituent_set_id: string | null;
  forecast_start: ColumnType<Date, Date | string, Date | string>;
  horizon_days: number;
  trigger: 'schedule' | 'manual';
  status: ColumnType<RunStatus, RunStatus | undefined, RunStatus>;
  progress: ColumnType<number, number | undefined, number>;
  attempts: ColumnType<number, number | undefined, number>;
  error: string | null;
  tide_note: string | null;
  requested_by: string | null;
  created_at: Timestamp;
  started_at: NullableTimestamp;
  finished_at: NullableTimestamp;
}

export interface ForecastTable {
  id: Generated<string>;
  run_id: string;
  organisation_id: string;
  site_id: string;
  profile_version_id: string;
  constituent_set_id: string | null;
  forecast_start: ColumnType<Date, Date | string, Date | string>;
  horizon_days: number;
  engine_version: string;
  inputs: Json<unknown>;
  model_case: Json<unknown>;
  grid: Buffer;
  windows: Json<unknown>;
  advice: Json<unknown>;
  gear_max_cells_per_l: number;
  pinned: ColumnType<boolean, boolean | undefined, boolean>;
  created_at: Timestamp;
}

export interface AlertTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  forecast_id: string | null;
  kind: string;
  message: string;
  starts_at: NullableTimestamp;
  created_at: Timestamp;
  acknowledged_at: NullableTimestamp;
  acknowledged_by: string | null;
}

export interface MailSettingsTable {
  user_id: string;
  digest_enabled: ColumnType<boolean, boolean | undefined, boolean>;
  digest_local_time: ColumnType<string, string | undefined, string>;
  time_zone: ColumnType<string, string | undefined, string>;
  alerts_enabled: ColumnType<boolean, boolean | undefined, boolean>;
  unsubscribe_token: string;
}

export interface MailLogTable {
  id: Generated<number>;
  user_id: string;
  kind: string;
  dedupe_key: string;
  sent_at: Timestamp;
}

export interface ScheduleSlotTable {
  site_id: string;
  slot_start: ColumnType<Date, Date | string, Date | string>;
  claimed_at: Timestamp;
}

export interface ForecastTables {
  schedule_slots: ScheduleSlotTable;
  organism_profiles: OrganismProfileTable;
  organism_profile_versions: OrganismProfileVersionTable;
  site_organisms: SiteOrganismTable;
  forecast_runs: ForecastRunTable;
  forecasts: ForecastTable;
  alerts: AlertTable;
  mail_settings: MailSettingsTable;
  mail_log: MailLogTable;
}
