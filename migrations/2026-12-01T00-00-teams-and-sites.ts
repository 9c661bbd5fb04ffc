import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('organisations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('display_name', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('users_email_unique').on('users').expression(sql`lower(email)`).unique().execute();

  await db.schema
    .createTable('memberships')
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('user_id', 'uuid', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('owner', 'manager', 'biologist', 'crew')`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('memberships_pkey', ['organisation_id', 'user_id'])
    .execute();
  await db.schema.createIndex('memberships_user_idx').on('memberships').column('user_id').execute();

  await db.schema
    .createTable('sites')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('latitude_deg', 'double precision', (c) => c.notNull().check(sql`latitude_deg between -90 and 90`))
    .addColumn('longitude_deg', 'double precision', (c) => c.notNull().check(sql`longitude_deg between -180 and 180`))
    .addColumn('time_zone', 'text', (c) => c.notNull())
    .addColumn('water_depth_m', 'double precision', (c) => c.notNull().check(sql`water_depth_m > 0`))
    .addColumn('bed_roughness_m', 'double precision', (c) => c.notNull().check(sql`bed_roughness_m > 0`))
    .addColumn('gear_top_m', 'double precision', (c) => c.notNull().check(sql`gear_top_m >= 0`))
    .addColumn('gear_bottom_m', 'double precision', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addCheckConstraint('sites_gear_band_check', sql`gear_bottom_m >= gear_top_m and gear_bottom_m <= water_depth_m`)
    .addUniqueConstraint('sites_org_name_unique', ['organisation_id', 'name'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('sites').execute();
  await db.schema.dropTable('memberships').execute();
  await db.schema.dropTable('users').execute();
  await db.schema.dropTable('organisations').execute();
}
