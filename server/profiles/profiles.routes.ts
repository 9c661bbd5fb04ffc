import { Router } from 'express';
import { z } from 'zod';
import { profileInputSchema, profileUpdateSchema, profileVersionInputSchema } from '../../shared/schemas/organism.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import { findProfileDetail, listProfiles } from './profiles.repository.ts';
import * as service from './profiles.service.ts';

const profileParams = z.object({ orgId: z.uuid(), profileId: z.uuid() });
const versionParams = profileParams.extend({ versionId: z.uuid() });

/** /api/orgs/:orgId/profiles: organism profiles and their versions. Everyone reads; owners, managers and biologists change. */
export function profileRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const scientists = requireMember(db, ['owner', 'manager', 'biologist']);
  const actor = (req: { membership?: { organisationId: string }; user?: { id: string } }): service.Actor => ({ organisationId: req.membership!.organisationId, userId: req.user!.id });

  router.get('/', readers, async (req, res) => {
    res.json({ profiles: await listProfiles(db, req.membership!.organisationId) });
  });
  router.post('/', scientists, validate({ body: profileInputSchema }), async (req, res) => {
    const detail = await service.createProfile(db, actor(req), req.body);
    const { archivedAt: _archivedAt, versions: _versions, ...profile } = detail;
    res.status(201).json(profile);
  });
  router.get('/:profileId', readers, validate({ params: profileParams }), async (req, res) => {
    res.json(await service.getProfile(db, req.membership!.organisationId, String(req.params.profileId)));
  });
  router.patch('/:profileId', scientists, validate({ params: profileParams, body: profileUpdateSchema }), async (req, res) => {
    res.json(await service.editProfile(db, actor(req), String(req.params.profileId), req.body));
  });
  router.post('/:profileId/versions', scientists, validate({ params: profileParams, body: profileVersionInputSchema }), async (req, res) => {
    res.status(201).json(await service.addVersion(db, actor(req), String(req.params.profileId), req.body));
  });
  router.get('/:profileId/versions/:versionId', readers, validate({ params: versionParams }), async (req, res) => {
    const detail = await findProfileDetail(db, req.membership!.organisationId, String(req.params.profileId));
    const version = detail?.versions.find((v) => v.id === String(req.params.versionId));
    if (!version) throw new AppError('not_found', 'No such version of this organism profile.');
    res.json(version);
  });
  router.post('/:profileId/archive', scientists, validate({ params: profileParams }), async (req, res) => {
    res.json(await service.archive(db, actor(req), String(req.params.profileId)));
  });

  return router;
}
