import { Router } from 'express';
import { z } from 'zod';
import { organisationInputSchema, roleChangeSchema } from '../../shared/schemas/team.schema.ts';
import { ALL_ROLES, requireMember, requireSignedIn } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import * as repo from './organisations.repository.ts';
import * as service from './organisations.service.ts';

const memberParams = z.object({ orgId: z.uuid(), userId: z.uuid() });

/** /api/me and /api/organisations: the caller's own account and organisations. */
export function accountRoutes(db: Db): Router {
  const router = Router();
  router.get('/me', requireSignedIn, async (req, res) => {
    const user = req.user!;
    res.json({ ...user, memberships: await repo.membershipsOf(db, user.id) });
  });
  router.post('/organisations', requireSignedIn, validate({ body: organisationInputSchema }), async (req, res) => {
    res.status(201).json(await service.createOrganisation(db, req.user!, req.body.name));
  });
  return router;
}

/** /api/orgs/:orgId and its members. */
export function organisationRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireMember(db, ALL_ROLES), async (req, res) => {
    const org = await repo.findOrganisation(db, req.membership!.organisationId);
    if (!org) throw new AppError('not_found', 'No such organisation.');
    res.json({ id: org.id, name: org.name, createdAt: org.created_at.toISOString(), role: req.membership!.role });
  });
  router.delete('/', requireMember(db, ['owner']), validate({ body: z.object({ confirmName: z.string() }) }), async (req, res) => {
    await service.deleteOrganisation(db, req.user!, req.membership!.organisationId, req.body.confirmName);
    res.status(204).end();
  });
  router.get('/members', requireMember(db, ['owner', 'manager']), async (req, res) => {
    res.json({ members: await repo.listMembers(db, req.membership!.organisationId) });
  });
  router.patch('/members/:userId', requireMember(db, ['owner']), validate({ params: memberParams, body: roleChangeSchema }), async (req, res) => {
    await service.changeRole(db, req.user!, req.membership!.organisationId, String(req.params.userId), req.body.role);
    res.status(204).end();
  });
  router.delete('/members/:userId', requireMember(db, ['owner']), validate({ params: memberParams }), async (req, res) => {
    await service.removeMember(db, req.user!, req.membership!.organisationId, String(req.params.userId));
    res.status(204).end();
  });
  return router;
}
