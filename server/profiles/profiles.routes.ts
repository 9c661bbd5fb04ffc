import { Router } from 'express';
import { profileInputSchema } from '../../shared/schemas/organism.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import { insertProfile, listProfiles } from './profiles.repository.ts';

/** /api/orgs/:orgId/profiles: organism profiles and their versions. Everyone reads; owners, managers and biologists change. */
export function profileRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const scientists = requireMember(db, ['owner', 'manager', 'biologist']);

  router.get('/', readers, async (req, res) => {
    res.json({ profiles: await listProfiles(db, req.membership!.organisationId) });
  });
  router.post('/', scientists, validate({ body: profileInputSchema }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    const created = await db
      .transaction()
      .execute(async (trx) => {
        const ids = await insertProfile(trx, { organisationId: orgId, ...req.body, createdBy: req.user!.id });
        await recordAudit(trx, { organisationId: orgId, actorUserId: req.user!.id, action: 'profile.created', subject: req.body.name, details: ids });
        return ids;
      })
      .catch((error: unknown) => {
        if (error && typeof error === 'object' && 'constraint' in error && error.constraint === 'organism_profiles_org_name_unique') {
          throw new AppError('conflict', 'A profile with this name exists already. Choose another name.');
        }
        throw error;
      });
    const profile = (await listProfiles(db, orgId)).find((p) => p.id === created.profileId);
    res.status(201).json(profile);
  });

  return router;
}
