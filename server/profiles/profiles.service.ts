import { isDeepStrictEqual } from 'node:util';
import { organismParamsSchema, type OrganismParams, type ProfileDetail, type VersionChange } from '../../shared/schemas/organism.schema.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import * as repo from './profiles.repository.ts';

export interface Actor {
  organisationId: string;
  userId: string;
}

const NAME_TAKEN = 'organism_profiles_org_name_unique';

/** Turns the unique-name violation into a 409 with a plain message; anything else goes on. */
function nameConflict(error: unknown): never {
  if (error && typeof error === 'object' && 'constraint' in error && error.constraint === NAME_TAKEN) {
    throw new AppError('conflict', 'A profile with this name exists already. Choose another name.');
  }
  throw error;
}

async function detailOrThrow(db: Db, organisationId: string, profileId: string): Promise<ProfileDetail> {
  const detail = await repo.findProfileDetail(db, organisationId, profileId);
  if (!detail) throw new AppError('not_found', 'No such organism profile in this organisation.');
  return detail;
}

export const getProfile = detailOrThrow;

export async function createProfile(db: Db, actor: Actor, input: { name: string; taxon: string; params: OrganismParams; note: string }): Promise<ProfileDetail> {
  const created = await db
    .transaction()
    .execute(async (trx) => {
      const ids = await repo.insertProfile(trx, { organisationId: actor.organisationId, ...input, createdBy: actor.userId });
      await recordAudit(trx, { organisationId: actor.organisationId, actorUserId: actor.userId, action: 'profile.created', subject: input.name, details: ids });
      return ids;
    })
    .catch(nameConflict);
  return detailOrThrow(db, actor.organisationId, created.profileId);
}

/**
 * An edit: name and taxon change on the profile; params and note change the latest version in place
 * while no forecast has used it (and no run is waiting on it), and otherwise go into a new version,
 * leaving the used one as it was. Everything in one transaction, with the profile locked.
 */
export async function editProfile(
  db: Db,
  actor: Actor,
  profileId: string,
  edit: { name?: string; taxon?: string; params?: OrganismParams; note?: string },
): Promise<{ profile: ProfileDetail; versionChange: VersionChange }> {
  const versionChange = await db
    .transaction()
    .execute(async (trx) => {
      const locked = await repo.lockProfileForEdit(trx, actor.organisationId, profileId);
      if (!locked) throw new AppError('not_found', 'No such organism profile in this organisation.');
      const { profile, latest } = locked;
      if (profile.archived_at) throw new AppError('conflict', 'This profile is archived; archived profiles are kept as they were.');

      const current = organismParamsSchema.parse(latest.params);
      const params = edit.params ?? current;
      const paramsChanged = edit.params !== undefined && !isDeepStrictEqual(edit.params, current);
      const noteChanged = edit.note !== undefined && edit.note !== latest.note;
      let change: VersionChange = 'none';
      let versionId = latest.id;
      let version = latest.version;
      if (paramsChanged || noteChanged) {
        const used = latest.first_used_at !== null || (await repo.versionHasPendingRun(trx, latest.id));
        if (used) {
          const added = await repo.insertVersion(trx, { organisationId: actor.organisationId, profileId, version: latest.version + 1, params, note: edit.note ?? '', createdBy: actor.userId });
          versionId = added.id;
          version = added.version;
          change = 'new_version';
        } else {
          await repo.updateVersionInPlace(trx, latest.id, { params, note: edit.note ?? latest.note });
          change = 'updated_in_place';
        }
      }
      const nameChanged = edit.name !== undefined && edit.name !== profile.name;
      const taxonChanged = edit.taxon !== undefined && edit.taxon !== profile.taxon;
      await repo.updateProfileFields(trx, profileId, { ...(nameChanged ? { name: edit.name } : {}), ...(taxonChanged ? { taxon: edit.taxon } : {}) });
      if (change !== 'none' || nameChanged || taxonChanged) {
        await recordAudit(trx, {
          organisationId: actor.organisationId,
          actorUserId: actor.userId,
          action: 'profile.updated',
          subject: edit.name ?? profile.name,
          details: { profileId, versionId, version, versionChange: change, nameChanged, taxonChanged, paramsChanged, noteChanged },
        });
      }
      return change;
    })
    .catch(nameConflict);
  return { profile: await detailOrThrow(db, actor.organisationId, profileId), versionChange };
}

/** Always adds a version (a saved what-if, an accepted calibration), whatever the latest's state. */
export async function addVersion(db: Db, actor: Actor, profileId: string, input: { params: OrganismParams; note: string }): Promise<ProfileDetail> {
  await db.transaction().execute(async (trx) => {
    const locked = await repo.lockProfileForEdit(trx, actor.organisationId, profileId);
    if (!locked) throw new AppError('not_found', 'No such organism profile in this organisation.');
    if (locked.profile.archived_at) throw new AppError('conflict', 'This profile is archived; archived profiles are kept as they were.');
    const added = await repo.insertVersion(trx, { organisationId: actor.organisationId, profileId, version: locked.latest.version + 1, params: input.params, note: input.note, createdBy: actor.userId });
    await recordAudit(trx, {
      organisationId: actor.organisationId,
      actorUserId: actor.userId,
      action: 'profile.version_added',
      subject: locked.profile.name,
      details: { profileId, versionId: added.id, version: added.version },
    });
  });
  return detailOrThrow(db, actor.organisationId, profileId);
}

/** Archives a profile: kept with its versions and forecasts, no longer listed or forecast. */
export async function archive(db: Db, actor: Actor, profileId: string): Promise<ProfileDetail> {
  await db.transaction().execute(async (trx) => {
    const locked = await repo.lockProfileForEdit(trx, actor.organisationId, profileId);
    if (!locked) throw new AppError('not_found', 'No such organism profile in this organisation.');
    if (locked.profile.archived_at) return;
    await repo.archiveProfile(trx, profileId);
    await recordAudit(trx, { organisationId: actor.organisationId, actorUserId: actor.userId, action: 'profile.archived', subject: locked.profile.name, details: { profileId } });
  });
  return detailOrThrow(db, actor.organisationId, profileId);
}
