import type { Transaction } from 'kysely';
import type { Db } from '../db/connect.ts';
import type { Database, Role } from '../db/schema.ts';
import { accountChanged, membershipChanged } from '../auth/access-cache.ts';

type Executor = Db | Transaction<Database>;

export async function membershipsOf(db: Executor, userId: string) {
  return db
    .selectFrom('memberships as m')
    .innerJoin('organisations as o', 'o.id', 'm.organisation_id')
    .select(['o.id as organisationId', 'o.name as organisationName', 'm.role'])
    .where('m.user_id', '=', userId)
    .orderBy('o.name')
    .execute();
}

export async function insertOrganisation(trx: Executor, name: string, ownerId: string) {
  const org = await trx.insertInto('organisations').values({ name }).returning(['id', 'name', 'created_at']).executeTakeFirstOrThrow();
  await trx.insertInto('memberships').values({ organisation_id: org.id, user_id: ownerId, role: 'owner' }).execute();
  return org;
}

export async function findOrganisation(db: Executor, id: string) {
  return db.selectFrom('organisations').select(['id', 'name', 'created_at']).where('id', '=', id).executeTakeFirst();
}

export async function listMembers(db: Executor, organisationId: string) {
  const rows = await db
    .selectFrom('memberships as m')
    .innerJoin('users as u', 'u.id', 'm.user_id')
    .select(['u.id as userId', 'u.email', 'u.display_name', 'm.role', 'm.created_at'])
    .where('m.organisation_id', '=', organisationId)
    .orderBy('u.display_name')
    .execute();
  return rows.map((r) => ({ userId: r.userId, email: r.email, displayName: r.display_name, role: r.role, joinedAt: r.created_at.toISOString() }));
}

export async function findMembership(db: Executor, organisationId: string, userId: string) {
  return db
    .selectFrom('memberships')
    .select(['role'])
    .where('organisation_id', '=', organisationId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
}

export async function countOwners(db: Executor, organisationId: string): Promise<number> {
  const row = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('organisation_id', '=', organisationId)
    .where('role', '=', 'owner')
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function updateRole(db: Executor, organisationId: string, userId: string, role: Role) {
  membershipChanged(organisationId, userId);
  await db.updateTable('memberships').set({ role }).where('organisation_id', '=', organisationId).where('user_id', '=', userId).execute();
}

export async function deleteMembership(db: Executor, organisationId: string, userId: string) {
  membershipChanged(organisationId, userId);
  await db.deleteFrom('memberships').where('organisation_id', '=', organisationId).where('user_id', '=', userId).execute();
}

export async function deleteOrganisation(db: Executor, organisationId: string) {
  membershipChanged(organisationId);
  accountChanged(organisationId);
  await db.deleteFrom('organisations').where('id', '=', organisationId).execute();
}
