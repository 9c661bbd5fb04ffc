import type { Transaction } from 'kysely';
import type { Db } from '../db/connect.ts';
import type { Database, Invitation, Role } from '../db/schema.ts';

type Executor = Db | Transaction<Database>;

export function invitationStatus(row: Pick<Invitation, 'accepted_at' | 'revoked_at' | 'expires_at'>, now = new Date()) {
  if (row.accepted_at) return 'accepted' as const;
  if (row.revoked_at) return 'revoked' as const;
  if (row.expires_at <= now) return 'expired' as const;
  return 'pending' as const;
}

export async function insertInvitation(
  trx: Executor,
  values: { organisationId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
) {
  return trx
    .insertInto('invitations')
    .values({
      organisation_id: values.organisationId,
      email: values.email,
      role: values.role,
      token_hash: values.tokenHash,
      invited_by: values.invitedBy,
      expires_at: values.expiresAt,
    })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function listInvitations(db: Executor, organisationId: string) {
  return db.selectFrom('invitations').selectAll().where('organisation_id', '=', organisationId).orderBy('created_at', 'desc').limit(200).execute();
}

export async function findByTokenHash(db: Executor, tokenHash: string) {
  return db
    .selectFrom('invitations as i')
    .innerJoin('organisations as o', 'o.id', 'i.organisation_id')
    .selectAll('i')
    .select('o.name as organisation_name')
    .where('i.token_hash', '=', tokenHash)
    .executeTakeFirst();
}

/** Marks the invitation used, only if it is still pending; returns whether this call used it. */
export async function markAccepted(trx: Executor, id: string, userId: string): Promise<boolean> {
  const result = await trx
    .updateTable('invitations')
    .set({ accepted_at: new Date(), accepted_by: userId })
    .where('id', '=', id)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', new Date())
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function markRevoked(trx: Executor, organisationId: string, id: string): Promise<Invitation | undefined> {
  return trx
    .updateTable('invitations')
    .set({ revoked_at: new Date() })
    .where('id', '=', id)
    .where('organisation_id', '=', organisationId)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .returningAll()
    .executeTakeFirst();
}
