import type { Role } from '../../shared/schemas/common.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import type { CurrentUser } from '../http/request-context.ts';
import * as repo from './organisations.repository.ts';

export async function createOrganisation(db: Db, user: CurrentUser, name: string) {
  return db.transaction().execute(async (trx) => {
    const org = await repo.insertOrganisation(trx, name, user.id);
    await recordAudit(trx, { organisationId: org.id, actorUserId: user.id, action: 'organisation.created', subject: name });
    return { id: org.id, name: org.name, createdAt: org.created_at.toISOString(), role: 'owner' as const };
  });
}

export async function changeRole(db: Db, actor: CurrentUser, organisationId: string, userId: string, role: Role) {
  await db.transaction().execute(async (trx) => {
    const current = await repo.findMembership(trx, organisationId, userId);
    if (!current) throw new AppError('not_found', 'That person is not a member of this organisation.');
    if (current.role === 'owner' && role !== 'owner' && (await repo.countOwners(trx, organisationId)) <= 1) {
      throw new AppError('conflict', 'The organisation must keep at least one owner. Make someone else owner first.');
    }
    await repo.updateRole(trx, organisationId, userId, role);
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'member.role_changed', subject: userId, details: { from: current.role, to: role } });
  });
}

export async function removeMember(db: Db, actor: CurrentUser, organisationId: string, userId: string) {
  await db.transaction().execute(async (trx) => {
    const current = await repo.findMembership(trx, organisationId, userId);
    if (!current) throw new AppError('not_found', 'That person is not a member of this organisation.');
    if (current.role === 'owner' && (await repo.countOwners(trx, organisationId)) <= 1) {
      throw new AppError('conflict', 'The last owner cannot be removed. Make someone else owner first, or delete the organisation.');
    }
    await repo.deleteMembership(trx, organisationId, userId);
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'member.removed', subject: userId, details: { role: current.role } });
  });
}

export async function deleteOrganisation(db: Db, actor: CurrentUser, organisationId: string, confirmName: string) {
  await db.transaction().execute(async (trx) => {
    const org = await repo.findOrganisation(trx, organisationId);
    if (!org) throw new AppError('not_found', 'No such organisation.');
    if (org.name !== confirmName) {
      throw new AppError('validation_failed', 'To delete the organisation, type its name exactly as shown in "confirmName".');
    }
    await recordAudit(trx, { organisationId, actorUserId: actor.id, action: 'organisation.deleted', subject: org.name });
    await repo.deleteOrganisation(trx, organisationId);
  });
}
