import { Router } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { invitationInputSchema } from '../../shared/schemas/team.schema.ts';
import { requireMember, requireSignedIn } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import type { Mailer } from '../mail/mailer.ts';
import { listInvitations } from './invitations.repository.ts';
import * as service from './invitations.service.ts';

const tokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/) });

function limiter(limit: number, windowMs: number) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => req.user?.id ?? ipKeyGenerator(req.ip ?? '0.0.0.0'),
    handler: (_req, _res, next) => next(new AppError('rate_limited', 'Too many invitation requests. Wait a few minutes and try again.')),
  });
}

/** /api/orgs/:orgId/invitations: owners and managers. */
export function organisationInvitationRoutes(deps: { db: Db; mailer: Mailer; appBaseUrl: string }): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  const managers = requireMember(db, ['owner', 'manager']);
  router.get('/', managers, async (req, res) => {
    res.json({ invitations: (await listInvitations(db, req.membership!.organisationId)).map(service.toDto) });
  });
  router.post('/', managers, limiter(30, 3600_000), validate({ body: invitationInputSchema }), async (req, res) => {
    res.status(201).json(await service.invite(deps, req.user!, req.membership!, req.body));
  });
  router.delete('/:invitationId', managers, validate({ params: z.object({ orgId: z.uuid(), invitationId: z.uuid() }) }), async (req, res) => {
    await service.revoke(db, req.user!, req.membership!.organisationId, String(req.params.invitationId));
    res.status(204).end();
  });
  return router;
}

/** /api/invitations/:token: the invited person, signed in. */
export function invitationAcceptRoutes(db: Db): Router {
  const router = Router();
  const tries = limiter(30, 15 * 60_000);
  router.get('/:token', requireSignedIn, tries, validate({ params: tokenParams }), async (req, res) => {
    res.json(await service.preview(db, req.user!, String(req.params.token)));
  });
  router.post('/:token/accept', requireSignedIn, tries, validate({ params: tokenParams }), async (req, res) => {
    res.json(await service.accept(db, req.user!, String(req.params.token)));
  });
  return router;
}
