import type { TeamWorld } from '../helpers/team-world.ts';

/** An active subscription for organisation A, so that forecast output (comparison, calibration) is unlocked. */
export async function subscribe(w: TeamWorld, organisationId = w.orgA): Promise<void> {
  await w.database.db
    .insertInto('billing_accounts')
    .values({ organisation_id: organisationId, customer_id: `cus_${organisationId.slice(0, 8)}`, status: 'active', plan_id: 'longline', billing_interval: 'month' })
    .onConflict((oc) => oc.column('organisation_id').doUpdateSet({ status: 'active' }))
    .execute();
}

/** A CSV line per RFC 4180 from plain cells (none here needs quoting). */
export const csvLines = (rows: (string | number)[][]): string => rows.map((r) => r.join(',')).join('\r\n') + '\r\n';

export const labPath = (w: TeamWorld) => `/orgs/${w.orgA}/lab`;
