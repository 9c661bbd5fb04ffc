import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type RequiredTimestamp = ColumnType<Date, Date | string, Date | string>;
type NullableTimestamp = ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;

/** One payments customer per organisation and the mirror of its current subscription (null fields: none yet). */
export interface BillingAccountTable {
  organisation_id: string;
  customer_id: string;
  subscription_id: string | null;
  subscription_created_at: NullableTimestamp;
  plan_id: string | null;
  billing_interval: 'month' | 'year' | null;
  price_id: string | null;
  /** The payments service's status: trialing, active, past_due, canceled, incomplete, unpaid, paused… */
  status: string | null;
  quantity: number | null;
  trial_end: NullableTimestamp;
  current_period_end: NullableTimestamp;
  cancel_at_period_end: Generated<boolean>;
  /** When the unpaid invoice that made the subscription past due was raised; the grace period counts from here. */
  past_due_since: NullableTimestamp;
  synced_at: NullableTimestamp;
  created_at: Timestamp;
  updated_at: Timestamp;
}

/** Payments events already processed (idempotency by event id). */
export interface BillingEventTable {
  event_id: string;
  type: string;
  organisation_id: string | null;
  event_created_at: RequiredTimestamp;
  received_at: Timestamp;
}

/** Tables of the billing area (subscriptions, payment events). */
export interface BillingTables {
  billing_accounts: BillingAccountTable;
  billing_events: BillingEventTable;
}

export type BillingAccount = Selectable<BillingAccountTable>;
export type NewBillingAccount = Insertable<BillingAccountTable>;
export type BillingAccountUpdate = Updateable<BillingAccountTable>;
