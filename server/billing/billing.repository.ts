import type { Transaction } from 'kysely';
import { accountChanged } from '../auth/access-cache.ts';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';
import type { BillingAccount, BillingAccountUpdate } from '../db/tables/billing.ts';

type Executor = Db | Transaction<Database>;

export async function findAccount(db: Executor, organisationId: string): Promise<BillingAccount | undefined> {
  return db.selectFrom('billing_accounts').selectAll().where('organisation_id', '=', organisationId).executeTakeFirst();
}

/** The account row, locked until the transaction ends (webhooks for one organisation apply one at a time). */
export async function lockAccount(trx: Transaction<Database>, organisationId: string): Promise<BillingAccount | undefined> {
  return trx.selectFrom('billing_accounts').selectAll().where('organisation_id', '=', organisationId).forUpdate().executeTakeFirst();
}

export async function findOrganisationByCustomer(db: Executor, customerId: string): Promise<string | undefined> {
  const row = await db.selectFrom('billing_accounts').select('organisation_id').where('customer_id', '=', customerId).executeTakeFirst();
  return row?.organisation_id;
}

export async function organisationExists(db: Executor, organisationId: string): Promise<boolean> {
  return Boolean(await db.selectFrom('organisations').select('id').where('id', '=', organisationId).executeTakeFirst());
}

export async function saveCustomer(db: Executor, organisationId: string, customerId: string): Promise<void> {
  accountChanged(organisationId);
  await db
    .insertInto('billing_accounts')
    .values({ organisation_id: organisationId, customer_id: customerId })
    .onConflict((oc) => oc.column('organisation_id').doUpdateSet({ customer_id: customerId, updated_at: new Date() }))
    .execute();
}

export async function updateAccount(trx: Executor, organisationId: string, changes: BillingAccountUpdate): Promise<void> {
  accountChanged(organisationId);
  await trx.updateTable('billing_accounts').set({ ...changes, updated_at: new Date() }).where('organisation_id', '=', organisationId).execute();
}

/** Records an event id; false when it was already there (a repeated delivery). */
export async function recordEvent(trx: Executor, event: { id: string; type: string; organisationId: string | null; created: Date }): Promise<boolean> {
  const inserted = await trx
    .insertInto('billing_events')
    .values({ event_id: event.id, type: event.type, organisation_id: event.organisationId, event_created_at: event.created })
    .onConflict((oc) => oc.column('event_id').doNothing())
    .returning('event_id')
    .executeTakeFirst();
  return Boolean(inserted);
}
