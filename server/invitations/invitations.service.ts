import { createHash, randomBytes } from 'node:crypto';
import type { Role } from '../../shared/schemas/common.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentMembership, CurrentUser } from '../http/request-context.ts';
import type { Mailer } from '../mail/mailer.ts';
import { findMembership } from '../organisations/organisations.repository.ts';
import { invitationMail } from './invitation-mail.ts';
import * as repo from './invitations.repository.ts';

export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000;

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Managers may invite crew and biologists; only owners may grant manager or owner. */
export function mayGrant(inviter: Role, role: Role): boolean {
  if (inviter === 'owner') return true;
  if (inviter === 'manager') return role === 'crew' || role === 'biologist';
  return false;
}

export function toDto(row: Awaited<ReturnType<typeof repo.listInvitations>>[number]) {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    status: repo.invitationStatus(row),
    createdAt: row.created_at.toISOString(),
    expiresAt: row.expires_at.toISOString(),
  };
}

export async function invite(
  deps: { db: Db; mailer: Mailer; appBaseUrl: string },
  actor: CurrentUser,
  membership: CurrentMembership,
  input: { email: string; role: Role },
) {
  if (!mayGrant(membership.role, input.role)) {
    throw new AppError('forbidden', `A ${membership.role} may not invite a ${input.role}. Only owners grant the manager and owner roles.`);
  }
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + INVITATION_TTL_MS);
  return deps.db.transaction().execute(async (trx) => {
    const org = await trx.selectFrom('organisations').select('name').where('id', '=', membership.organisationId).executeTakeFirstOrThrow();
    const row = await repo.insertInvitation(trx, {
      organisationId: membership.organisationId,
      email: input.email,
      role: input.role,
      tokenHash: hashToken(token),
      invitedBy: actor.id,
      expiresAt,
    });
    await recordAudit(trx, { organisationId: membership.organisationId, actorUserId: actor.id, action: 'invitation.sent', subject: input.email, details: { role: input.role } });
    // Sent inside the transaction: if the mail service refuses it, nothing is saved.
    const link = `${deps.appBaseUrl}/invitations/${token}`;
    try {
      await deps.mailer.send(invitationMail({ to: input.email, organisationName: org.name, role: input.role, inviterName: actor.displayName, link, expiresAt }));
    } catch {
      throw new AppError('service_unavailable', 'The invitation e-mail could not be sent, so no invitation was made. Try again in a few minutes.');
    }
    return toDto(row);
  });
}

async function usableInvitation(db: Db, token: string) {
  const row = await repo.findByTokenHash(db, hashToken(token));
  if (!row) throw new AppError('not_found', 'This invitation link is not valid. Check that you copied the whole link, or ask for a new invitation.');
  const status = repo.invitationStatus(row);
  if (status === 'accepted') throw new AppError('gone', 'This invitation has already been used. Each link works once; ask for a new invitation if you need one.');
  if (status === 'expired') throw new AppError('gone', 'This invitation has expired. Ask the person who invited you to send a new one.');
  if (status === 'revoked') throw new AppError('gone', 'This invitation was withdrawn. Ask the organisation for a new one.');
  return row;
}

function checkInvitee(row: { email: string }, user: CurrentUser) {
  if (row.email.toLowerCase() !== user.email.toLowerCase()) {
    throw new AppError('forbidden', `This invitation was sent to another e-mail address. Sign in as ${row.email} to see and accept it.`);
  }
}

export async function preview(db: Db, user: CurrentUser, token: string) {
  const row = await usableInvitation(db, token);
  checkInvitee(row, user);
  return { organisationName: row.organisation_name, role: row.role, email: row.email, expiresAt: row.expires_at.toISOString() };
}

export async function accept(db: Db, user: CurrentUser, token: string) {
  const row = await usableInvitation(db, token);
  checkInvitee(row, user);
  return db.transaction().execute(async (trx) => {
    if (await findMembership(trx, row.organisation_id, user.id)) {
      throw new AppError('conflict', 'You are already a member of this organisation; ask an owner to change your role instead.');
    }
    if (!(await repo.markAccepted(trx, row.id, user.id))) {
      throw new AppError('gone', 'This invitation has already been used. Each link works once; ask for a new invitation if you need one.');
    }
    await trx.insertInto('memberships').values({ organisation_id: row.organisation_id, user_id: user.id, role: row.role }).execute();
    await recordAudit(trx, { organisationId: row.organisation_id, actorUserId: user.id, action: 'invitation.accepted', subject: row.email, details: { role: row.role } });
    return { organisationId: row.organisation_id, organisationName: row.organisation_name, role: row.role };
  });
}

export async function revoke(db: Db, actor: CurrentUser, organisationId: string, id: string) {
  await db.transaction().execute(async (trx) => {
    const row = await repo.markRevoked(trx, organisationId, id);
    if (!row) throw new AppError('not_found', 'No pending invitation with this id.');
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'invitation.revoked', subject: row.email, details: { role: row.role } });
  });
}
