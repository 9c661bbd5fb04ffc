import { Router } from 'express';
import { requireMember } from '../auth/authorize.ts';
import type { Db } from '../db/connect.ts';
import { listAudit } from './audit.repository.ts';

export function auditRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireMember(db, ['owner']), async (req, res) => {
    res.json({ events: await listAudit(db, req.membership!.organisationId) });
  });
  return router;
}
