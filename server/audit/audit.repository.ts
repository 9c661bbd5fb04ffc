import type { Transaction } from 'kysely';
import type { Db } from '../db/connect.ts';
import type { Database } from '../db/schema.ts';

export interface AuditEntry {
  organisationId: string | null;
  actorUserId: string | null;
  action: string;
  subject: string;
  details?: Record<string, unknown>;
}

/** Records an audited change; call inside the transaction that makes the change. */
export async function recordAudit(trx: Transaction<Database> | Db, entry: AuditEntry): Promise<void> {
  await trx
    .insertInto('audit_events')
    .values({
      organisation_id: entry.organisationId,
      actor_user_id: entry.actorUserId,
      action: entry.action,
      subject: entry.subject,
      details: JSON.stringify(entry.details ?? {}),
    })
    .execute();
}

export async function listAudit(db: Db, organisationId: string, limit = 200) {
  const rows = await db
    .selectFrom('audit_events as a')
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .select(['a.id', 'a.action', 'a.subject', 'a.details', 'a.created_at', 'u.email as actor'])
    .where('a.organisation_id', '=', organisationId)
    .orderBy('a.created_at', 'desc')
    .orderBy('a.id', 'desc')
    .limit(limit)
    .execute();
  return rows.map((r) => ({
    id: Number(r.id),
    action: r.action,
    subject: r.subject,
    actor: r.actor,
    details: r.details,
    createdAt: r.created_at.toISOString(),
  }));
}
