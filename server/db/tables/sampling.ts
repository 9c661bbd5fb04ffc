import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;

/** A planned sample of a site; depths are metres below the surface. */
export interface PlannedSampleTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  planned_at: ColumnType<Date, Date | string, Date | string>;
  method: 'hose' | 'bottle';
  depth_m: number | null;
  top_m: number | null;
  bottom_m: number | null;
  reason: ColumnType<string, string | undefined, string>;
  forecast_id: string | null;
  advice_kind: 'representative' | 'near_bed' | 'subsurface_peak' | 'gear_band' | null;
  created_by: string | null;
  created_at: Timestamp;
  updated_at: Timestamp;
  taken_at: NullableTimestamp;
  taken_by: string | null;
  notes: string | null;
}

/** Tables of the sampling area. */
export interface SamplingTables {
  planned_samples: PlannedSampleTable;
}

export type PlannedSampleRow = Selectable<PlannedSampleTable>;
export type NewPlannedSample = Insertable<PlannedSampleTable>;
export type PlannedSampleChanges = Updateable<PlannedSampleTable>;
