import { Router } from 'express';
import { z } from 'zod';
import { siteInputSchema, siteUpdateSchema } from '../../shared/schemas/site.schema.ts';
import { ALL_ROLES, requireMember } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';
import * as repo from './sites.repository.ts';
import * as service from './sites.service.ts';

const siteParams = z.object({ orgId: z.uuid(), siteId: z.uuid() });
const listQuery = z.object({ archived: z.enum(['include', 'exclude']).default('exclude') });

/** /api/orgs/:orgId/sites: everyone in the organisation reads; owners and managers change. */
export function siteRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  const readers = requireMember(db, ALL_ROLES);
  const editors = requireMember(db, ['owner', 'manager']);

  router.get('/', readers, validate({ query: listQuery }), async (req, res) => {
    const { archived } = req.query as z.infer<typeof listQuery>;
    const rows = await repo.listSites(db, req.membership!.organisationId, archived === 'include');
    res.json({ sites: rows.map(repo.toSiteDto) });
  });
  router.post('/', editors, validate({ body: siteInputSchema }), async (req, res) => {
    res.status(201).json(await service.createSite(db, req.user!, req.membership!.organisationId, req.body));
  });
  router.get('/:siteId', readers, validate({ params: siteParams }), async (req, res) => {
    const row = await repo.findSite(db, req.membership!.organisationId, String(req.params.siteId));
    if (!row) throw new AppError('not_found', 'No such site in this organisation.');
    res.json(repo.toSiteDto(row));
  });
  router.patch('/:siteId', editors, validate({ params: siteParams, body: siteUpdateSchema }), async (req, res) => {
    res.json(await service.updateSite(db, req.user!, req.membership!.organisationId, String(req.params.siteId), req.body));
  });
  router.post('/:siteId/archive', editors, validate({ params: siteParams }), async (req, res) => {
    res.json(await service.archiveSite(db, req.user!, req.membership!.organisationId, String(req.params.siteId)));
  });
  return router;
}
