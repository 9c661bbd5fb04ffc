import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  // Planned samples of a site: hose over a depth range or bottle at a depth (m below the surface), and their taking.
  await db.schema
    .createTable('planned_samples')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('planned_at', 'timestamptz', (c) => c.notNull())
    .addColumn('method', 'text', (c) => c.notNull().check(sql`method in ('hose', 'bottle')`))
    .addColumn('depth_m', 'double precision')
    .addColumn('top_m', 'double precision')
    .addColumn('bottom_m', 'double precision')
    .addColumn('reason', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('forecast_id', 'uuid', (c) => c.references('forecasts.id').onDelete('set null'))
    .addColumn('advice_kind', 'text', (c) => c.check(sql`advice_kind in ('representative', 'near_bed', 'subsurface_peak', 'gear_band')`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('taken_at', 'timestamptz')
    .addColumn('taken_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('notes', 'text')
    .addCheckConstraint(
      'planned_samples_shape',
      sql`(method = 'bottle' and depth_m is not null and top_m is null and bottom_m is null) or (method = 'hose' and depth_m is null and top_m is not null and bottom_m > top_m)`,
    )
    .execute();
  await db.schema.createIndex('planned_samples_site_time_idx').on('planned_samples').columns(['organisation_id', 'site_id', 'planned_at']).execute();
  // Adding the same advice twice adds nothing.
  await db.schema
    .createIndex('planned_samples_advice_unique')
    .on('planned_samples')
    .columns(['site_id', 'advice_kind', 'planned_at'])
    .unique()
    .where(sql.ref('advice_kind'), 'is not', null)
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('planned_samples').execute();
}
