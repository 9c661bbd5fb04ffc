import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import { pinoHttp } from 'pino-http';
import type { Db } from './db/connect.ts';
import { errorMiddleware, notFound } from './http/error-middleware.ts';
import { healthRoutes } from './http/health.routes.ts';
import type { Logger } from './logger.ts';

export interface AppDeps {
  db: Db;
  logger: Logger;
  version: string;
  /** Folder of the built client; served with a fallback to index.html for client routes. */
  clientDir?: string;
}

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

export function createApp(deps: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  app.use(
    pinoHttp({
      logger: deps.logger,
      genReqId: (req, res) => {
        const given = req.headers['x-request-id'];
        const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      customLogLevel: (_req, res, error) => (error || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
    }),
  );

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRoutes(deps.db, deps.version));
  api.use(notFound);
  app.use('/api', api);

  if (deps.clientDir && existsSync(path.join(deps.clientDir, 'index.html'))) {
    const clientDir = deps.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(errorMiddleware);
  return app;
}
