import { sql } from 'kysely';
import type { Db } from '../db/connect.ts';

export const RETENTION_DAYS = 14;

/**
 * Deletes forecasts made more than 14 days ago, except those a planned sample refers to, those whose
 * span covers a lab result of their site (the comparison needs them) and pinned ones. Returns how
 * many were deleted.
 */
export async function pruneForecasts(db: Db, nowMs: number): Promise<number> {
  const cutoff = new Date(nowMs - RETENTION_DAYS * 86_400_000);
  const result = await db
    .deleteFrom('forecasts as f')
    .where('f.created_at', '<', cutoff)
    .where('f.pinned', '=', false)
    .where(({ not, exists, selectFrom }) => not(exists(selectFrom('planned_samples as p').select('p.id').whereRef('p.forecast_id', '=', 'f.id'))))
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom('lab_results as l')
            .select('l.id')
            .whereRef('l.site_id', '=', 'f.site_id')
            .where(sql<boolean>`l.sampled_at between f.forecast_start and f.forecast_start + f.horizon_days * interval '1 day'`),
        ),
      ),
    )
    .executeTakeFirst();
  return Number(result.numDeletedRows);
}
