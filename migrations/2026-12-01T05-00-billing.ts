import { sql, type Kysely } from 'kysely';

// Frozen in time: never import application code here.
export async function up(db: Kysely<any>): Promise<void> {
  // One payments customer per organisation, and the mirror of its current subscription.
  await db.schema
    .createTable('billing_accounts')
    .addColumn('organisation_id', 'uuid', (c) => c.primaryKey().references('organisations.id').onDelete('cascade'))
    .addColumn('customer_id', 'text', (c) => c.notNull().unique())
    .addColumn('subscription_id', 'text')
    .addColumn('subscription_created_at', 'timestamptz')
    .addColumn('plan_id', 'text')
    .addColumn('billing_interval', 'text', (c) => c.check(sql`billing_interval in ('month', 'year')`))
    .addColumn('price_id', 'text')
    .addColumn('status', 'text')
    .addColumn('quantity', 'integer')
    .addColumn('trial_end', 'timestamptz')
    .addColumn('current_period_end', 'timestamptz')
    .addColumn('cancel_at_period_end', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('past_due_since', 'timestamptz')
    .addColumn('synced_at', 'timestamptz')
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('updated_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  // Every payments event processed, so that a second delivery of one changes nothing.
  await db.schema
    .createTable('billing_events')
    .addColumn('event_id', 'text', (c) => c.primaryKey())
    .addColumn('type', 'text', (c) => c.notNull())
    .addColumn('organisation_id', 'uuid', (c) => c.references('organisations.id').onDelete('set null'))
    .addColumn('event_created_at', 'timestamptz', (c) => c.notNull())
    .addColumn('received_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('billing_events_org_idx').on('billing_events').columns(['organisation_id', 'event_created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('billing_events').execute();
  await db.schema.dropTable('billing_accounts').execute();
}
