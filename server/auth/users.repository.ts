import type { Db } from '../db/connect.ts';
import type { CurrentUser } from '../http/request-context.ts';

export interface IdentityClaims {
  issuer: string;
  subject: string;
  email: string;
  name?: string;
}

/**
 * Finds the user for an identity, creating it at first sign-in. A user seeded or invited by e-mail
 * before their first sign-in is linked to the identity that proves that e-mail.
 */
export async function upsertUserFromIdentity(db: Db, claims: IdentityClaims): Promise<CurrentUser> {
  return db.transaction().execute(async (trx) => {
    const linked = await trx
      .selectFrom('users')
      .select(['id', 'email', 'display_name'])
      .where('oidc_issuer', '=', claims.issuer)
      .where('oidc_subject', '=', claims.subject)
      .executeTakeFirst();
    if (linked) return { id: linked.id, email: linked.email, displayName: linked.display_name };

    const byEmail = await trx
      .selectFrom('users')
      .select(['id', 'email', 'display_name'])
      .where((eb) => eb(eb.fn('lower', ['email']), '=', claims.email.toLowerCase()))
      .where('oidc_subject', 'is', null)
      .forUpdate()
      .executeTakeFirst();
    if (byEmail) {
      await trx.updateTable('users').set({ oidc_issuer: claims.issuer, oidc_subject: claims.subject }).where('id', '=', byEmail.id).execute();
      return { id: byEmail.id, email: byEmail.email, displayName: byEmail.display_name };
    }

    const created = await trx
      .insertInto('users')
      .values({
        email: claims.email,
        display_name: claims.name?.trim() || claims.email.split('@')[0] || claims.email,
        oidc_issuer: claims.issuer,
        oidc_subject: claims.subject,
      })
      .returning(['id', 'email', 'display_name'])
      .executeTakeFirstOrThrow();
    return { id: created.id, email: created.email, displayName: created.display_name };
  });
}

export async function findUserByIdentity(db: Db, issuer: string, subject: string): Promise<CurrentUser | null> {
  const row = await db
    .selectFrom('users')
    .select(['id', 'email', 'display_name'])
    .where('oidc_issuer', '=', issuer)
    .where('oidc_subject', '=', subject)
    .executeTakeFirst();
  return row ? { id: row.id, email: row.email, displayName: row.display_name } : null;
}
