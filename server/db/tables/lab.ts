import type { ColumnType, Generated, Insertable, Selectable } from 'kysely';

/** Tables of the lab area: lab results and their uploads, taxon → profile mappings, calibrations. */

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type RequiredTimestamp = ColumnType<Date, Date | string, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
type NullableJson<T> = ColumnType<T | null, string | null | undefined, string | null>;

export type SamplingMethod = 'hose' | 'bottle';

export interface LabUploadTable {
  id: Generated<string>;
  organisation_id: string;
  source: 'upload' | 'manual';
  file_name: string | null;
  row_count: number;
  created_by: string | null;
  created_at: Timestamp;
}

export interface LabResultTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  upload_id: string;
  sample_id: string;
  /** When the sample was taken (UTC). */
  sampled_at: RequiredTimestamp;
  /** m below the surface; a bottle has top = bottom. */
  depth_top_m: number;
  depth_bottom_m: number;
  method: SamplingMethod;
  taxon: string;
  cells_per_l: number;
  detection_limit: number;
  analyst: string | null;
  lab: string | null;
  created_by: string | null;
  created_at: Timestamp;
}

export interface TaxonMappingTable {
  organisation_id: string;
  taxon: string;
  profile_id: string;
  updated_at: Timestamp;
}

export type CalibrationStatus = 'queued' | 'running' | 'done' | 'failed' | 'accepted' | 'discarded';

export interface CalibrationTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  profile_version_id: string;
  fit_growth: ColumnType<boolean, boolean | undefined, boolean>;
  /** The results used were sampled within [period_from, period_to] (null: unbounded). */
  period_from: NullableTimestamp;
  period_to: NullableTimestamp;
  status: ColumnType<CalibrationStatus, CalibrationStatus | undefined, CalibrationStatus>;
  progress: ColumnType<number, number | undefined, number>;
  error: string | null;
  /** shared/schemas/lab.schema.ts CalibrationResult. */
  result: NullableJson<unknown>;
  accepted_version_id: string | null;
  requested_by: string | null;
  created_at: Timestamp;
  started_at: NullableTimestamp;
  finished_at: NullableTimestamp;
  decided_at: NullableTimestamp;
  decided_by: string | null;
}

export interface LabTables {
  lab_uploads: LabUploadTable;
  lab_results: LabResultTable;
  taxon_mappings: TaxonMappingTable;
  calibrations: CalibrationTable;
}

export type LabResultRow = Selectable<LabResultTable>;
export type NewLabResult = Insertable<LabResultTable>;
export type CalibrationRow = Selectable<CalibrationTable>;
