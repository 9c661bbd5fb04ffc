import type { ColumnType, Generated, Insertable, Selectable } from 'kysely';

/** Tables of the site tides area (constituent sets, feed refreshes). */

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
/** A nullable jsonb column: read as parsed JSON, written as a JSON string (or null). */
type NullableJson<T> = ColumnType<T | null, string | null | undefined, string | null>;

/** One constituent of the depth-mean current, as stored (the shape prediction takes). */
export interface StoredCurrentConstituent {
  name: string;
  /** Semi-major axis, m/s. */
  major: number;
  /** Greenwich phase lag, degrees. */
  phaseDeg: number;
  /** Signed semi-minor axis, m/s (positive anticlockwise). */
  minor?: number;
  /** Direction of the major axis, degrees anticlockwise from east. */
  inclinationDeg?: number;
}

/** One constituent of the water level, as stored. */
export interface StoredLevelConstituent {
  name: string;
  /** Amplitude, m. */
  amplitude: number;
  /** Greenwich phase lag, degrees. */
  phaseDeg: number;
}

export type ConstituentSource = 'feed' | 'upload' | 'analysis' | 'manual';
export type ConstituentSetKind = 'current' | 'level' | 'both';

export interface ConstituentSetTable {
  id: Generated<string>;
  organisation_id: string;
  site_id: string;
  version: number;
  source: ConstituentSource;
  kind: ConstituentSetKind;
  station_id: string | null;
  station_name: string | null;
  label: string | null;
  notes: string | null;
  current_constituents: NullableJson<StoredCurrentConstituent[]>;
  current_axis_deg: number | null;
  level_constituents: NullableJson<StoredLevelConstituent[]>;
  level_datum_m: number | null;
  /** Fit statistics of an analysed record (shared/schemas/tides.schema.ts: SetFit), or null. */
  fit: NullableJson<unknown>;
  based_on_set_id: string | null;
  created_at: Timestamp;
  created_by: string | null;
}

export interface TideFeedRefreshTable {
  id: Generated<number>;
  organisation_id: string;
  site_id: string;
  station_id: string | null;
  attempt: number;
  attempted_at: Timestamp;
  ok: boolean;
  error_code: string | null;
  error_message: string | null;
  constituent_set_id: string | null;
  actor_user_id: string | null;
}

/**
 * Columns the tides migration adds to `sites`. SiteTable (server/db/schema.ts) does not list them;
 * the tides repository sees them through `db.withTables<SiteTidesTables>()`.
 */
export interface SiteTideColumns {
  active_constituent_set_id: string | null;
  tide_station_id: string | null;
  tide_station_name: string | null;
}

export type SiteTidesTables = { sites: SiteTideColumns };

export interface TidesTables {
  constituent_sets: ConstituentSetTable;
  tide_feed_refreshes: TideFeedRefreshTable;
}

export type ConstituentSetRow = Selectable<ConstituentSetTable>;
export type NewConstituentSet = Insertable<ConstituentSetTable>;
export type TideFeedRefreshRow = Selectable<TideFeedRefreshTable>;
