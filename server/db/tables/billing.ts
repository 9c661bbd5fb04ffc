/** Tables of the billing area (subscriptions, payment events). Filled in by that area. */
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface BillingTables {}
