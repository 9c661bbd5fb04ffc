import { Router } from 'express';
import { z } from 'zod';
import { requireMember, ALL_ROLES } from '../auth/authorize.ts';
import { recordAudit } from '../audit/audit.repository.ts';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { validate } from '../http/validate.ts';

const alertParams = z.object({ orgId: z.uuid(), alertId: z.uuid() });

/** /api/orgs/:orgId/alerts: everyone reads; owners and managers acknowledge. */
export function alertRoutes(db: Db): Router {
  const router = Router({ mergeParams: true });
  router.get('/', requireMember(db, ALL_ROLES), async (req, res) => {
    const rows = await db
      .selectFrom('alerts as a')
      .innerJoin('sites as s', 's.id', 'a.site_id')
      .leftJoin('users as u', 'u.id', 'a.acknowledged_by')
      .select(['a.id', 'a.site_id', 's.name', 'a.kind', 'a.message', 'a.starts_at', 'a.created_at', 'a.acknowledged_at', 'u.email'])
      .where('a.organisation_id', '=', req.membership!.organisationId)
      .orderBy('a.created_at', 'desc')
      .limit(200)
      .execute();
    res.json({
      alerts: rows.map((r) => ({
        id: r.id,
        siteId: r.site_id,
        siteName: r.name,
        kind: r.kind,
        message: r.message,
        startsAt: r.starts_at?.toISOString() ?? null,
        createdAt: r.created_at.toISOString(),
        acknowledgedAt: r.acknowledged_at?.toISOString() ?? null,
        acknowledgedBy: r.email,
      })),
    });
  });
  router.post('/:alertId/ack', requireMember(db, ['owner', 'manager']), validate({ params: alertParams }), async (req, res) => {
    const orgId = req.membership!.organisationId;
    await db.transaction().execute(async (trx) => {
      const done = await trx
        .updateTable('alerts')
        .set({ acknowledged_at: new Date(), acknowledged_by: req.user!.id })
        .where('organisation_id', '=', orgId)
        .where('id', '=', String(req.params.alertId))
        .where('acknowledged_at', 'is', null)
        .returning('message')
        .executeTakeFirst();
      if (!done) throw new AppError('not_found', 'No unacknowledged alert with this id.');
      await recordAudit(trx, { organisationId: orgId, actorUserId: req.user!.id, action: 'alert.acknowledged', subject: String(req.params.alertId) });
    });
    res.status(204).end();
  });
  return router;
}
