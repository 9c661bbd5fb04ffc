import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { auditRoutes } from './audit/audit.routes.ts';
import { csrfGuard } from './auth/csrf.ts';
import { loadCurrentUser, oidcRelyingParty, type OidcSettings } from './auth/oidc.ts';
import { keepSessionCookieWhenUnreadable, refuseWhenSessionsUnreadable, trackSessionReads } from './auth/session-store.ts';
import type { Db } from './db/connect.ts';
import { errorMiddleware, notFound } from './http/error-middleware.ts';
import { dropOrgReadsOnWrite } from './http/org-read-cache.ts';
import { healthRoutes } from './http/health.routes.ts';
import { invitationAcceptRoutes, organisationInvitationRoutes } from './invitations/invitations.routes.ts';
import { logRequest, type Logger } from './logger.ts';
import { devMailRoutes } from './mail/dev-mail.routes.ts';
import type { Mailer } from './mail/mailer.ts';
import type { SmtpStandIn } from './mail/smtp-standin.ts';
import { accountRoutes, organisationRoutes } from './organisations/organisations.routes.ts';
import { siteRoutes } from './sites/sites.routes.ts';
import { forecastRoutes, type ForecastsDeps } from './forecasts/forecasts.routes.ts';
import { alertRoutes } from './forecasts/alerts.routes.ts';
import { mailSettingsRoutes } from './mail/mail-settings.routes.ts';
import { samplingRoutes, type SamplingDeps } from './sampling/sampling.routes.ts';
import { labRoutes, type LabDeps } from './lab/lab.routes.ts';
import { profileRoutes } from './profiles/profiles.routes.ts';
import { siteTideRoutes, type TidesDeps } from './tides/tides.routes.ts';
import { billingRoutes, billingWebhookRoutes, type BillingDeps } from './billing/billing.routes.ts';

export interface AppDeps {
  db: Db;
  logger: Logger;
  version: string;
  /** Public base URL of the app, e.g. http://127.0.0.1:3000. */
  appBaseUrl: string;
  oidc: Omit<OidcSettings, 'appBaseUrl'>;
  mailer: Mailer;
  /** Development only: show the mail caught by the local SMTP stand-in. */
  devMail?: SmtpStandIn;
  /** Extra deps of the tides area (defaults: just the database). */
  tides?: Omit<TidesDeps, 'db'>;
  /** Queue, tides and subscription gate for forecasts (default: read-only, run-now answers 503). */
  forecasts?: Omit<ForecastsDeps, 'db'>;
  /** Extra deps of the sampling-plan area. */
  sampling?: Omit<SamplingDeps, 'db'>;
  /** Extra deps of the biologist's workbench area. */
  lab?: Omit<LabDeps, 'db'>;
  /** Extra deps of the billing area (defaults: just the database). */
  billing?: Omit<BillingDeps, 'db'>;
  /** Folder of the built client; served with a fallback to index.html for client routes. */
  clientDir?: string;
}

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

export function createApp(deps: AppDeps): Express {
  const app = express();
  const secure = deps.appBaseUrl.startsWith('https://');
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
      serializers: { req: logRequest },
      customLogLevel: (_req, res, error) => (error || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'connect-src': ["'self'"],
          'worker-src': ["'self'", 'blob:'],
          'frame-ancestors': ["'none'"],
          'form-action': ["'self'"],
          'upgrade-insecure-requests': secure ? [] : null,
        },
      },
      strictTransportSecurity: secure,
    }),
  );

  app.use(trackSessionReads);
  app.use(oidcRelyingParty(deps.db, { ...deps.oidc, appBaseUrl: deps.appBaseUrl }));
  app.use(keepSessionCookieWhenUnreadable);
  if (deps.devMail) app.use(devMailRoutes(deps.devMail));

  const tides: TidesDeps = { db: deps.db, ...deps.tides } as TidesDeps;
  const billing: BillingDeps = { db: deps.db, ...deps.billing } as BillingDeps;

  const api = express.Router();
  // Payment webhooks verify a signature over the raw body: before the JSON parser.
  api.use(billingWebhookRoutes(billing));
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRoutes(deps.db, deps.version));
  api.use(refuseWhenSessionsUnreadable);
  api.use(loadCurrentUser(deps.db));
  api.use(csrfGuard(new URL(deps.appBaseUrl).origin));
  api.use(accountRoutes(deps.db));
  api.use('/orgs/:orgId', dropOrgReadsOnWrite);
  api.use(mailSettingsRoutes(deps.db));
  api.use('/invitations', invitationAcceptRoutes(deps.db));
  api.use('/orgs/:orgId', organisationRoutes(deps.db));
  api.use('/orgs/:orgId/sites/:siteId/tides', siteTideRoutes(tides));
  api.use('/orgs/:orgId/sites', siteRoutes(deps.db));
  api.use('/orgs/:orgId/billing', billingRoutes(billing));
  api.use('/orgs/:orgId/alerts', alertRoutes(deps.db));
  api.use('/orgs/:orgId/profiles', profileRoutes(deps.db));
  api.use('/orgs/:orgId', forecastRoutes({ db: deps.db, ...deps.forecasts }));
  api.use('/orgs/:orgId', samplingRoutes({ db: deps.db, ...deps.sampling } as SamplingDeps));
  api.use('/orgs/:orgId', labRoutes({ db: deps.db, ...deps.lab } as LabDeps));
  api.use('/orgs/:orgId/invitations', organisationInvitationRoutes({ db: deps.db, mailer: deps.mailer, appBaseUrl: deps.appBaseUrl }));
  api.use('/orgs/:orgId/audit', auditRoutes(deps.db));
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
