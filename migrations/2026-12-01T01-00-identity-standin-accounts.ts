import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
// The local identity stand-in keeps its accounts in a schema of its own; the app never reads it.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createSchema('identity_standin').ifNotExists().execute();

  await db.schema
    .withSchema('identity_standin')
    .createTable('accounts')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('email', 'text', (c) => c.notNull().check(sql`char_length(email) between 3 and 254`))
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('display_name', 'text', (c) => c.notNull())
    .addColumn('email_verified', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema
    .withSchema('identity_standin')
    .createIndex('accounts_email_unique')
    .on('accounts')
    .expression(sql`lower(email)`)
    .unique()
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.withSchema('identity_standin').dropTable('accounts').execute();
  await db.schema.dropSchema('identity_standin').execute();
}
