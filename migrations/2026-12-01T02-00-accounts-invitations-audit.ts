import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('users').addColumn('oidc_issuer', 'text').addColumn('oidc_subject', 'text').execute();
  await db.schema.createIndex('users_oidc_unique').on('users').columns(['oidc_issuer', 'oidc_subject']).unique().execute();

  // express-session compatible store (connect-pg-simple's layout).
  await db.schema
    .createTable('app_sessions')
    .addColumn('sid', 'varchar', (c) => c.primaryKey())
    .addColumn('sess', 'json', (c) => c.notNull())
    .addColumn('expire', 'timestamp(6)', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('app_sessions_expire_idx').on('app_sessions').column('expire').execute();

  await db.schema
    .alterTable('sites')
    .addColumn('bed_type', 'text')
    .addColumn('archived_at', 'timestamptz')
    .execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'uuid', (c) => c.primaryKey().defaultTo(sql`gen_random_uuid()`))
    .addColumn('organisation_id', 'uuid', (c) => c.notNull().references('organisations.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('owner', 'manager', 'biologist', 'crew')`))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('invited_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('accepted_at', 'timestamptz')
    .addColumn('accepted_by', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('revoked_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('invitations_org_idx').on('invitations').column('organisation_id').execute();

  await db.schema
    .createTable('audit_events')
    .addColumn('id', 'bigserial', (c) => c.primaryKey())
    // Kept (with the organisation id nulled) when an organisation is deleted, so operators keep the trace.
    .addColumn('organisation_id', 'uuid', (c) => c.references('organisations.id').onDelete('set null'))
    .addColumn('actor_user_id', 'uuid', (c) => c.references('users.id').onDelete('set null'))
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('details', 'jsonb', (c) => c.notNull().defaultTo(sql`'{}'::jsonb`))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('audit_events_org_idx').on('audit_events').columns(['organisation_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('audit_events').execute();
  await db.schema.dropTable('invitations').execute();
  await db.schema.alterTable('sites').dropColumn('archived_at').dropColumn('bed_type').execute();
  await db.schema.dropTable('app_sessions').execute();
  await db.schema.dropIndex('users_oidc_unique').execute();
  await db.schema.alterTable('users').dropColumn('oidc_subject').dropColumn('oidc_issuer').execute();
}
