import { generateKeyPairSync, randomUUID } from 'node:crypto';
import Provider, { type ClientMetadata, type Configuration, type KoaContextWithOIDC } from 'oidc-provider';
import type { Logger } from 'pino';
import { findAccountById, type HostDb } from './accounts.ts';
import { messagePage, pageHeaders, signedOutPage, signOutPage, type Page } from './pages.ts';

export interface StandInClient {
  clientId: string;
  clientSecret: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
  /** How the client authenticates at the token endpoint; client_secret_basic unless told. */
  tokenEndpointAuthMethod?: 'client_secret_basic' | 'client_secret_post';
}

export interface StandInProviderInput {
  issuer: string;
  db: HostDb;
  clients: readonly StandInClient[];
  cookieKeys: readonly string[];
  logger: Logger;
  devMode: boolean;
  formActionSources: readonly string[];
}

export const SCOPES = ['openid', 'email', 'profile'] as const;

// Lifetimes in seconds.
export const TTL = {
  AuthorizationCode: 60,
  AccessToken: 10 * 60,
  IdToken: 60 * 60,
  RefreshToken: 24 * 60 * 60,
  Interaction: 30 * 60,
  Session: 12 * 60 * 60,
  Grant: 12 * 60 * 60,
} as const;

/** One RSA signing key per start; ID tokens signed before a restart no longer verify (fine locally). */
function signingKey() {
  const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  return { ...privateKey.export({ format: 'jwk' }), kid: randomUUID(), use: 'sig', alg: 'RS256' };
}

function toClientMetadata(client: StandInClient): ClientMetadata {
  return {
    client_id: client.clientId,
    client_secret: client.clientSecret,
    redirect_uris: client.redirectUris,
    post_logout_redirect_uris: client.postLogoutRedirectUris,
    grant_types: ['authorization_code'],
    response_types: ['code'],
    token_endpoint_auth_method: client.tokenEndpointAuthMethod ?? 'client_secret_basic',
  };
}

export function createStandInProvider(input: StandInProviderInput): Provider {
  const { db, logger, devMode } = input;

  const render = (ctx: KoaContextWithOIDC, page: Page) => {
    ctx.status = page.status;
    ctx.set(pageHeaders(page, input.formActionSources));
    ctx.body = page.html;
  };

  const configuration: Configuration = {
    // oidc-provider's default adapter keeps sessions, grants and codes in process memory (an LRU of
    // 1000 entries): a restart signs everybody out of the stand-in. Acceptable for a local stand-in.
    clients: input.clients.map(toClientMetadata),
    clientAuthMethods: ['client_secret_basic', 'client_secret_post'],
    responseTypes: ['code'],
    pkce: { required: () => true },
    scopes: [...SCOPES],
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name'] },
    // Put the scope's claims into the ID token too, so a relying party need not call userinfo.
    conformIdTokenClaims: false,
    cookies: {
      keys: [...input.cookieKeys],
      // Own names: cookies are not separated by port, and the app runs on the same host.
      names: { session: 'standin_session', interaction: 'standin_interaction', resume: 'standin_resume' },
      // Secure is set by oidc-provider (through Koa) when the request is https, or behind a proxy
      // with provider.proxy = true and X-Forwarded-Proto: https. On plain http on loopback it is not.
      long: { httpOnly: true, sameSite: 'lax' },
      short: { httpOnly: true, sameSite: 'lax' },
    },
    jwks: { keys: [signingKey()] },
    ttl: { ...TTL },
    interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
    async findAccount(_ctx, sub) {
      const account = await findAccountById(db, sub);
      if (!account) return undefined;
      return {
        accountId: account.id,
        claims: () => ({ sub: account.id, email: account.email, email_verified: account.emailVerified, name: account.displayName }),
      };
    },
    features: {
      devInteractions: { enabled: false },
      revocation: { enabled: true },
      rpInitiatedLogout: {
        enabled: true,
        async logoutSource(ctx) {
          const { session } = ctx.oidc;
          const secret = session?.state?.secret;
          if (typeof secret !== 'string') {
            render(ctx, messagePage({ status: 400, title: 'Cannot sign out', text: 'The sign-out request could not be read. Try again.' }));
            return;
          }
          // Sign out without a click when the relying party proves who it signs out: an id_token_hint
          // (signature checked by oidc-provider) for the account of this session. Anything else asks first,
          // so that a link on another site cannot sign people out.
          const hintSubject = ctx.oidc.entities.IdTokenHint?.payload.sub;
          const auto = typeof hintSubject === 'string' && hintSubject === session?.accountId;
          render(ctx, signOutPage({ action: ctx.oidc.urlFor('end_session_confirm'), xsrf: secret, auto }));
        },
        async postLogoutSuccessSource(ctx) {
          render(ctx, signedOutPage());
        },
      },
    },
    async renderError(ctx, out) {
      const text = devMode && out.error_description ? `${out.error}: ${out.error_description}` : 'The sign-in request could not be handled. Go back to Planktide and try again.';
      render(ctx, messagePage({ status: ctx.status >= 400 ? ctx.status : 400, title: 'Sign-in request refused', text }));
    },
  };

  const provider = new Provider(input.issuer, configuration);

  // Errors are logged by name and description only: never tokens, codes, cookies or request bodies.
  const describe = (error: unknown) => {
    const e = error as { name?: unknown; message?: unknown; error_description?: unknown };
    return { name: String(e?.name ?? 'Error'), message: String(e?.error_description ?? e?.message ?? '') };
  };
  provider.on('server_error', (_ctx, error) => logger.error({ err: describe(error) }, 'identity stand-in: server error'));
  const refused = (event: string) => (_ctx: unknown, error: unknown) => logger.warn({ event, err: describe(error) }, 'identity stand-in: request refused');
  provider.on('authorization.error', refused('authorization.error'));
  provider.on('grant.error', refused('grant.error'));
  provider.on('end_session.error', refused('end_session.error'));
  provider.on('userinfo.error', refused('userinfo.error'));
  provider.on('revocation.error', refused('revocation.error'));
  provider.on('end_session.success', () => logger.info({ event: 'signed out' }, 'identity stand-in: signed out'));
  return provider;
}
