import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('organism_profiles')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('taxon', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('archived_at', 'timestamptz')
    .addUniqueConstraint('organism_profiles_org_name_unique', ['organisation_id', 'name'])
    .execute();

  await db.schema
    .createTable('organism_profile_versions')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('profile_id', 'uuid', (c) => c.notNull().references('organism_profiles.id').onDelete('cascade'))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('version', 'integer', (c) => c.notNull())
    .addColumn('params', 'jsonb', (c) => c.notNull())
    .addColumn('note', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('created_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('first_used_at', 'timestamptz')
    .addUniqueConstraint('organism_profile_versions_unique', ['profile_id', 'version'])
    .execute();

  await db.schema
    .createTable('site_organisms')
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('profile_id', 'uuid', (c) => c.notNull().references('organism_profiles.id').onDelete('cascade'))
    .addPrimaryKeyConstraint('site_organisms_pkey', ['site_id', 'profile_id'])
    .execute();

  await db.schema
    .alterTable('sites')
    .addColumn('forecast_local_time', 'text', (c) => c.notNull().defaultTo('04:00'))
    .addColumn('forecast_horizon_days', 'integer', (c) => c.notNull().defaultTo(3).check(sql`forecast_horizon_days between 3 and 7`))
    .addColumn('window_settings', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .execute();

  await db.schema
    .createTable('forecast_runs')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('profile_version_id', 'uuid', (c) => c.notNull().references('organism_profile_versions.id').onDelete('cascade'))
    // Null when the site had no constituent set; such a run fails with a clear reason.
    .addColumn('constituent_set_id', 'uuid')
    .addColumn('forecast_start', 'timestamptz', (c) => c.notNull())
    .addColumn('horizon_days', 'integer', (c) => c.notNull())
    .addColumn('trigger', 'text', (c) => c.notNull().check(sql`trigger in ('schedule', 'manual')`))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('queued').check(sql`status in ('queued', 'running', 'done', 'failed')`))
    .addColumn('progress', 'real', (c) => c.notNull().defaultTo(0))
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('error', 'text')
    // What happened to the tides before the run, e.g. the feed was down and the last good set was used.
    .addColumn('tide_note', 'text')
    .addColumn('requested_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('started_at', 'timestamptz')
    .addColumn('finished_at', 'timestamptz')
    .execute();
  // One run per site, profile version, constituent set and forecast start: retries and a second scheduler add nothing.
  await db.schema
    .createIndex('forecast_runs_identity')
    .on('forecast_runs')
    .expression(sql`site_id, profile_version_id, coalesce(constituent_set_id, '00000000-0000-0000-0000-000000000000'::uuid), forecast_start`)
    .unique()
    .execute();

  // A scheduler claims each site's daily slot here, so two schedulers queue it once.
  await db.schema
    .createTable('schedule_slots')
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('slot_start', 'timestamptz', (c) => c.notNull())
    .addColumn('claimed_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('schedule_slots_pkey', ['site_id', 'slot_start'])
    .execute();

  await db.schema
    .createTable('forecasts')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('run_id', 'uuid', (c) => c.notNull().unique().references('forecast_runs.id').onDelete('cascade'))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('profile_version_id', 'uuid', (c) => c.notNull().references('organism_profile_versions.id').onDelete('cascade'))
    .addColumn('constituent_set_id', 'uuid')
    .addColumn('forecast_start', 'timestamptz', (c) => c.notNull())
    .addColumn('horizon_days', 'integer', (c) => c.notNull())
    .addColumn('engine_version', 'text', (c) => c.notNull())
    .addColumn('inputs', 'jsonb', (c) => c.notNull())
    .addColumn('model_case', 'jsonb', (c) => c.notNull())
    .addColumn('grid', 'bytea', (c) => c.notNull())
    .addColumn('windows', 'jsonb', (c) => c.notNull())
    .addColumn('advice', 'jsonb', (c) => c.notNull())
    .addColumn('gear_max_cells_per_l', 'double precision', (c) => c.notNull())
    .addColumn('pinned', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('forecasts_latest_idx').on('forecasts').columns(['site_id', 'profile_version_id', 'forecast_start']).execute();

  await db.schema
    .createTable('alerts')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('site_id', 'uuid', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('forecast_id', 'uuid', (c) => c.references('forecasts.id').onDelete('set null'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('message', 'text', (c) => c.notNull())
    .addColumn('starts_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('acknowledged_at', 'timestamptz')
    .addColumn('acknowledged_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .execute();

  await db.schema
    .createTable('mail_settings')
    .addColumn('user_id', 'uuid', (c) => c.primaryKey().references('users.id').onDelete('cascade'))
    .addColumn('digest_enabled', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('digest_local_time', 'text', (c) => c.notNull().defaultTo('06:30'))
    .addColumn('time_zone', 'text', (c) => c.notNull().defaultTo('UTC'))
    .addColumn('alerts_enabled', 'boolean', (c) => c.notNull().defaultTo(true))
    .addColumn('unsubscribe_token', 'text', (c) => c.notNull().unique())
    .execute();

  await db.schema
    .createTable('mail_log')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('dedupe_key', 'text', (c) => c.notNull().unique())
    .addColumn('sent_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('mail_log').execute();
  await db.schema.dropTable('mail_settings').execute();
  await db.schema.dropTable('alerts').execute();
  await db.schema.dropTable('forecasts').execute();
  await db.schema.dropTable('schedule_slots').execute();
  await db.schema.dropTable('forecast_runs').execute();
  await db.schema.alterTable('sites').dropColumn('window_settings').dropColumn('forecast_horizon_days').dropColumn('forecast_local_time').execute();
  await db.schema.dropTable('site_organisms').execute();
  await db.schema.dropTable('organism_profile_versions').execute();
  await db.schema.dropTable('organism_profiles').execute();
}
