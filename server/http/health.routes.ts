import { Router } from 'express';
import { sql } from 'kysely';
import type { Health } from '../../shared/schemas/health.schema.ts';
import type { Db } from '../db/connect.ts';

const CHECK_TIMEOUT_MS = 2000;

async function databaseAnswers(db: Db): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), CHECK_TIMEOUT_MS);
  });
  const probe = sql`select 1 as ok`.execute(db).then(
    () => true,
    () => false,
  );
  try {
    return await Promise.race([probe, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

export function healthRoutes(db: Db, version: string): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const up = await databaseAnswers(db);
    const body: Health = { status: up ? 'ok' : 'degraded', database: up ? 'ok' : 'unavailable', version };
    res.status(up ? 200 : 503).json(body);
  });
  return router;
}
