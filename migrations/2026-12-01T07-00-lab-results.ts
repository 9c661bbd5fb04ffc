import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  // One uploaded lab file (or one manual entry): what was imported together.
  await db.schema
    .createTable('lab_uploads')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('source', 'text', (c) => c.notNull().check(sql`source in ('upload', 'manual')`))
    .addColumn('file_name', 'text')
    .addColumn('row_count', 'integer', (c) => c.notNull())
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // One counted taxon in one sample. Depths in m below the surface; a bottle has top = bottom.
  await db.schema
    .createTable('lab_results')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('upload_id', 'uuid', (c) => c.notNull().references('lab_uploads.id').onDelete('cascade'))
    .addColumn('sample_id', 'text', (c) => c.notNull())
    .addColumn('sampled_at', 'timestamptz', (c) => c.notNull())
    .addColumn('depth_top_m', 'double precision', (c) => c.notNull().check(sql`depth_top_m >= 0`))
    .addColumn('depth_bottom_m', 'double precision', (c) => c.notNull())
    .addColumn('method', 'text', (c) => c.notNull().check(sql`method in ('hose', 'bottle')`))
    .addColumn('taxon', 'text', (c) => c.notNull())
    .addColumn('cells_per_l', 'double precision', (c) => c.notNull().check(sql`cells_per_l >= 0`))
    .addColumn('detection_limit', 'double precision', (c) => c.notNull().check(sql`detection_limit > 0`))
    .addColumn('analyst', 'text')
    .addColumn('lab', 'text')
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('lab_results_depth_order', sql`depth_bottom_m >= depth_top_m`)
    .addCheckConstraint('lab_results_bottle_depth', sql`method <> 'bottle' or depth_bottom_m = depth_top_m`)
    .addUniqueConstraint('lab_results_sample_taxon_unique', ['organisation_id', 'sample_id', 'taxon'])
    .execute();
  await db.schema.createIndex('lab_results_site_time_idx').on('lab_results').columns(['site_id', 'sampled_at']).execute();

  // Which organism profile stands for a taxon name as the lab writes it.
  await db.schema
    .createTable('taxon_mappings')
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('taxon', 'text', (c) => c.notNull())
    .addColumn('profile_id', 'uuid', (c) => c.notNull().references('organism_profiles.id').onDelete('cascade'))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('taxon_mappings_pkey', ['organisation_id', 'taxon'])
    .execute();

  // A fit of a profile version's parameters to a site's lab results, and what became of it.
  await db.schema
    .createTable('calibrations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('profile_version_id', 'uuid', (c) => c.notNull().references('organism_profile_versions.id').onDelete('cascade'))
    .addColumn('fit_growth', 'boolean', (c) => c.notNull().defaultTo(false))
    // The results used: sampled within [period_from, period_to] (null: unbounded).
    .addColumn('period_from', 'timestamptz')
    .addColumn('period_to', 'timestamptz')
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('queued').check(sql`status in ('queued', 'running', 'done', 'failed', 'accepted', 'discarded')`))
    .addColumn('progress', 'real', (c) => c.notNull().defaultTo(0))
    .addColumn('error', 'text')
    .addColumn('result', 'jsonb')
    .addColumn('accepted_version_id', 'uuid', (c) => c.references('organism_profile_versions.id').onDelete('set null'))
    .addColumn('requested_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('started_at', 'timestamptz')
    .addColumn('finished_at', 'timestamptz')
    .addColumn('decided_at', 'timestamptz')
    .addColumn('decided_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .execute();
  await db.schema.createIndex('calibrations_org_idx').on('calibrations').columns(['organisation_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('calibrations').execute();
  await db.schema.dropTable('taxon_mappings').execute();
  await db.schema.dropTable('lab_results').execute();
  await db.schema.dropTable('lab_uploads').execute();
}
