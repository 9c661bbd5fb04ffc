import type { RequestHandler } from 'express';
import { auth } from 'express-openid-connect';
import type { Db } from '../db/connect.ts';
import { userCache } from './access-cache.ts';
import '../http/request-context.ts';
import { PostgresSessionStore } from './session-store.ts';
import { findUserByIdentity, upsertUserFromIdentity, type IdentityClaims } from './users.repository.ts';

export interface OidcSettings {
  issuerUrl: string;
  clientId: string;
  clientSecret: string;
  appBaseUrl: string;
  sessionSecret: string;
}

function decodeClaims(idToken: string): Record<string, unknown> {
  const payload = idToken.split('.')[1] ?? '';
  return JSON.parse(Buffer.from(payload, 'base64url').toString('utf8')) as Record<string, unknown>;
}

function identityFrom(claims: Record<string, unknown>): IdentityClaims {
  const { iss, sub, email, name } = claims;
  if (typeof iss !== 'string' || typeof sub !== 'string' || typeof email !== 'string') {
    throw new Error('The identity provider did not return iss, sub and email in the ID token.');
  }
  return { issuer: iss, subject: sub, email, name: typeof name === 'string' ? name : undefined };
}

/**
 * The app as an OpenID Connect relying party (authorization code flow with PKCE), with its sessions
 * in PostgreSQL. Adds /auth/login, /auth/callback and /auth/logout; sign-out also ends the
 * provider's session (RP-initiated logout).
 */
export function oidcRelyingParty(db: Db, settings: OidcSettings): RequestHandler {
  const secure = settings.appBaseUrl.startsWith('https://');
  return auth({
    issuerBaseURL: settings.issuerUrl,
    baseURL: settings.appBaseUrl,
    clientID: settings.clientId,
    clientSecret: settings.clientSecret,
    clientAuthMethod: 'client_secret_basic',
    secret: settings.sessionSecret,
    authRequired: false,
    idpLogout: true,
    authorizationParams: { response_type: 'code', response_mode: 'query', scope: 'openid email profile' },
    routes: { login: '/auth/login', logout: '/auth/logout', callback: '/auth/callback', postLogoutRedirect: '/' },
    session: {
      store: new PostgresSessionStore(db) as never,
      name: 'planktide_session',
      rolling: true,
      rollingDuration: 12 * 3600,
      absoluteDuration: 7 * 24 * 3600,
      cookie: { httpOnly: true, sameSite: 'Lax', secure },
    },
    transactionCookie: { sameSite: 'Lax' },
    afterCallback: async (_req, _res, session) => {
      // First sign-in creates the user; later ones find it.
      await upsertUserFromIdentity(db, identityFrom(decodeClaims(session.id_token)));
      return session;
    },
  });
}

/** Puts the signed-in user (if any) on req.user. */
export function loadCurrentUser(db: Db): RequestHandler {
  return async (req, _res, next) => {
    if (!req.oidc?.isAuthenticated()) return next();
    const claims = req.oidc.idTokenClaims as Record<string, unknown> | undefined;
    if (!claims) return next();
    const identity = identityFrom(claims);
    const found = await userCache.get(userCache.key(identity.issuer, identity.subject), () => findUserByIdentity(db, identity.issuer, identity.subject));
    req.user = found ?? (await upsertUserFromIdentity(db, identity));
    next();
  };
}
