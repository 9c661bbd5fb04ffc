import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
// Site tides: versioned constituent sets per site (old sets are kept), the site's active set and
// chosen feed station, and every attempt to refresh a site's set from the tide feed.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('constituent_sets')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('version', 'integer', (c) => c.notNull().check(sql`version >= 1`))
    .addColumn('source', 'text', (c) => c.notNull().check(sql`source in ('feed', 'upload', 'analysis', 'manual')`))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('current', 'level', 'both')`))
    .addColumn('station_id', 'text')
    .addColumn('station_name', 'text')
    .addColumn('label', 'text')
    .addColumn('notes', 'text')
    // Depth-mean current: [{ name, major, phaseDeg, minor?, inclinationDeg? }], m/s and degrees.
    .addColumn('current_constituents', 'jsonb')
    // Main axis of the site current, degrees anticlockwise from east; positive along it is the flood.
    .addColumn('current_axis_deg', 'double precision')
    // Water level: [{ name, amplitude, phaseDeg }], m and degrees; datum = mean level above the chart datum.
    .addColumn('level_constituents', 'jsonb')
    .addColumn('level_datum_m', 'double precision')
    .addColumn('fit', 'jsonb')
    .addColumn('based_on_set_id', 'uuid', (c) => c.references('constituent_sets.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addUniqueConstraint('constituent_sets_site_version_unique', ['site_id', 'version'])
    .addCheckConstraint(
      'constituent_sets_parts_check',
      sql`(kind = 'current' and current_constituents is not null and level_constituents is null)
        or (kind = 'level' and level_constituents is not null and current_constituents is null)
        or (kind = 'both' and current_constituents is not null and level_constituents is not null)`,
    )
    .execute();
  await db.schema.createIndex('constituent_sets_org_idx').on('constituent_sets').column('organisation_id').execute();

  await db.schema
    .alterTable('sites')
    .addColumn('active_constituent_set_id', 'uuid', (c) => c.references('constituent_sets.id').onDelete('set null'))
    .addColumn('tide_station_id', 'text')
    .addColumn('tide_station_name', 'text')
    .execute();

  await db.schema
    .createTable('tide_feed_refreshes')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('station_id', 'text')
    .addColumn('attempt', 'integer', (c) => c.notNull().check(sql`attempt >= 1`))
    .addColumn('attempted_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('ok', 'boolean', (c) => c.notNull())
    .addColumn('error_code', 'text')
    .addColumn('error_message', 'text')
    .addColumn('constituent_set_id', 'uuid', (c) => c.references('constituent_sets.id').onDelete('set null'))
    .addColumn('actor_user_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .execute();
  await db.schema.createIndex('tide_feed_refreshes_site_idx').on('tide_feed_refreshes').columns(['site_id', 'attempted_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('tide_feed_refreshes').execute();
  await db.schema.alterTable('sites').dropColumn('tide_station_name').dropColumn('tide_station_id').dropColumn('active_constituent_set_id').execute();
  await db.schema.dropTable('constituent_sets').execute();
}
