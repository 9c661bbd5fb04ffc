/**
 * The local identity stand-in: plays the hosted identity service (an OpenID Connect provider) on
 * loopback, so Planktide signs in through real OpenID Connect in development and tests.
 *
 * - Protocol: oidc-provider. Authorization code flow only, PKCE (S256) required for every client,
 *   client_secret_basic or client_secret_post at the token endpoint, scopes openid email profile,
 *   claims sub, email, email_verified, name (also in the ID token, so userinfo is optional).
 * - State: accounts live in PostgreSQL (identity_standin.accounts, its own schema and migration).
 *   Sessions, grants, codes and tokens use oidc-provider's default in-memory adapter: a restart
 *   signs everybody out of the stand-in (not out of the app), and one process is assumed. The signing
 *   key is made at start, so ID tokens from before a restart no longer verify.
 * - Pages: own sign-in and sign-up pages (interactions.routes.ts, pages.ts), CSRF-protected by the
 *   signed SameSite=Lax interaction cookie plus a per-interaction form token. Planktide's clients are
 *   first party: consent is granted without a page.
 * - Failed sign-ins, counted per IP address and e-mail, are delayed after a few and refused with 429
 *   after many (sign-in-limits.ts); wrong password and unknown e-mail answer alike, in about the same time.
 * - Sign-out: RP-initiated logout at end_session_endpoint. With an id_token_hint for the signed-in
 *   account the page posts itself (no click) and the browser lands on the post_logout_redirect_uri;
 *   without one it asks first.
 * - Cookies (standin_session, standin_interaction, standin_resume) are HttpOnly, SameSite=Lax, signed
 *   with cookieKeys, and not Secure on plain http. Behind https (a TLS-terminating proxy): give the
 *   https issuer URL, set `provider.proxy = true` and Express `trust proxy` so X-Forwarded-Proto and
 *   X-Forwarded-For count; the cookies then get Secure, and req.ip is the client rather than the proxy.
 *   This module does not do that yet; the hosted service replaces it outside development.
 * - Logs: events and account ids only; never passwords, codes, tokens, cookies or request bodies.
 */
import { createServer, type Server } from 'node:http';
import express from 'express';
import { Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import { pino, type Logger } from 'pino';
import { z } from 'zod';
import type { HostDb, StandInDatabase } from './accounts.ts';
import { createFormTokens } from './form-tokens.ts';
import { interactionRoutes } from './interactions.routes.ts';
import { prepareDummyHash } from './passwords.ts';
import { createStandInProvider, type StandInClient } from './provider.ts';
import { DEFAULT_SIGN_IN_LIMITS, DEFAULT_SIGN_UP_LIMIT, type SignInLimits, type SignUpLimit } from './sign-in-limits.ts';

export type { StandInClient } from './provider.ts';

export interface IdentityStandInOptions {
  /** Port to listen on; 0 picks a free one (the issuer then names the port given). */
  port: number;
  /** Loopback address to listen on: 127.0.0.1 unless told. */
  host?: string;
  /** The app's database (the migrations create identity_standin.accounts), or a connection string. */
  db: HostDb | string;
  clients: StandInClient[];
  /** Keys signing the stand-in's cookies and form tokens; the first signs, all verify (rotation). */
  cookieKeys: string[];
  logger?: Logger;
  /** Shows oidc-provider's error descriptions on error pages. */
  devMode?: boolean;
  signInLimits?: Partial<SignInLimits>;
  signUpLimit?: Partial<SignUpLimit>;
  /** email_verified for accounts made through the sign-up page (the stand-in sends no e-mail): false unless told. */
  markSignUpsVerified?: boolean;
}

export interface RunningIdentityStandIn {
  issuer: string;
  close(): Promise<void>;
}

const url = z.url({ protocol: /^https?$/ });
const optionsSchema = z.object({
  port: z.number().int().min(0).max(65535),
  host: z.string().min(1).default('127.0.0.1'),
  clients: z
    .array(
      z.object({
        clientId: z.string().min(1),
        clientSecret: z.string().min(16, 'client secrets need at least 16 characters'),
        redirectUris: z.array(url).min(1),
        postLogoutRedirectUris: z.array(url),
        tokenEndpointAuthMethod: z.enum(['client_secret_basic', 'client_secret_post']).optional(),
      }),
    )
    .min(1),
  cookieKeys: z.array(z.string().min(16, 'cookie keys need at least 16 characters')).min(1),
});

/** A pool whose idle clients losing the server (database restarted) do not crash the process. */
function quietPool(connectionString: string): pg.Pool {
  const pool = new pg.Pool({ connectionString, max: 4 });
  pool.on('error', () => {});
  return pool;
}

function originsOf(clients: readonly StandInClient[]): string[] {
  const uris = clients.flatMap((c) => [...c.redirectUris, ...c.postLogoutRedirectUris]);
  return [...new Set(uris.map((u) => new URL(u).origin))];
}

function listen(server: Server, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      const address = server.address();
      resolve(typeof address === 'object' && address ? address.port : port);
    });
  });
}

/**
 * Starts the local stand-in for the hosted identity service: an OpenID Connect provider (oidc-provider)
 * with its own sign-in and sign-up pages, on its own HTTP server. Issuer: http://HOST:PORT.
 */
export async function startIdentityStandIn(options: IdentityStandInOptions): Promise<RunningIdentityStandIn> {
  const parsed = optionsSchema.safeParse(options);
  if (!parsed.success) throw new Error(`Invalid identity stand-in options:\n${z.prettifyError(parsed.error)}`);
  const { host } = parsed.data;
  const logger = options.logger ?? pino({ level: 'info', base: { service: 'identity-standin' } });
  const ownDb = typeof options.db === 'string';
  const db: HostDb =
    typeof options.db === 'string'
      ? new Kysely<StandInDatabase>({ dialect: new PostgresDialect({ pool: quietPool(options.db) }) })
      : options.db;

  await prepareDummyHash();
  const server = createServer();
  let port: number;
  try {
    port = await listen(server, options.port, host);
  } catch (error) {
    if (ownDb) await db.destroy();
    throw error;
  }
  const issuer = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;
  const formActionSources = originsOf(options.clients);
  const provider = createStandInProvider({
    issuer,
    db,
    clients: options.clients,
    cookieKeys: options.cookieKeys,
    logger,
    devMode: options.devMode ?? false,
    formActionSources,
  });

  const app = express();
  app.disable('x-powered-by');
  app.use(
    interactionRoutes({
      provider,
      db,
      logger,
      formTokens: createFormTokens(options.cookieKeys),
      signInLimits: { ...DEFAULT_SIGN_IN_LIMITS, ...options.signInLimits },
      signUpLimit: { ...DEFAULT_SIGN_UP_LIMIT, ...options.signUpLimit },
      formActionSources,
      markSignUpsVerified: options.markSignUpsVerified ?? false,
    }),
  );
  app.use(provider.callback());
  server.on('request', app);
  logger.info({ issuer }, 'identity stand-in listening');

  return {
    issuer,
    async close() {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      if (ownDb) await db.destroy();
    },
  };
}
