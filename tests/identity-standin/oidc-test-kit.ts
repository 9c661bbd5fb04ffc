import { createHash, createPublicKey, randomBytes, verify, type JsonWebKey } from 'node:crypto';
import { createServer } from 'node:http';
import { Writable } from 'node:stream';
import { pino, type Logger } from 'pino';
import { freePort } from '../helpers/free-port.ts';
import { readForm, type CookieJarFetch, type Hop } from './cookie-jar-fetch.ts';

export const TEST_COOKIE_KEYS = ['test-cookie-key-0123456789abcdef', 'older-test-cookie-key-0123456789'];

/** A relying party's callback: answers 200 and records the query of each call. */
export interface CallbackServer {
  origin: string;
  redirectUri: string;
  postLogoutUri: string;
  calls: URL[];
  close(): Promise<void>;
}

export async function startCallbackServer(): Promise<CallbackServer> {
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  const calls: URL[] = [];
  const server = createServer((req, res) => {
    calls.push(new URL(req.url ?? '/', origin));
    res.writeHead(200, { 'content-type': 'text/plain' }).end('relying party reached');
  });
  await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', () => resolve()));
  return {
    origin,
    redirectUri: `${origin}/callback`,
    postLogoutUri: `${origin}/signed-out`,
    calls,
    close: () =>
      new Promise((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

export function testClient(callback: CallbackServer) {
  return {
    clientId: 'planktide-test',
    clientSecret: 'test-client-secret-0123456789',
    redirectUris: [callback.redirectUri],
    postLogoutRedirectUris: [callback.postLogoutUri],
  };
}

/** A logger that keeps every line it writes, to check what reaches the log. */
export function capturingLogger(): { logger: Logger; text: () => string } {
  const lines: string[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      lines.push(chunk.toString());
      done();
    },
  });
  return { logger: pino({ level: 'debug' }, stream), text: () => lines.join('') };
}

// RFC 7636 section 4.1-4.2: verifier of 43-128 unreserved characters, S256 challenge = BASE64URL(SHA256(verifier)).
export function pkcePair(): { verifier: string; challenge: string } {
  const verifier = randomBytes(32).toString('base64url');
  return { verifier, challenge: createHash('sha256').update(verifier).digest('base64url') };
}

export interface AuthRequest {
  clientId: string;
  redirectUri: string;
  state: string;
  nonce: string;
  challenge?: string;
}

export function authorizeUrl(issuer: string, request: AuthRequest): string {
  const url = new URL('/auth', issuer);
  url.searchParams.set('client_id', request.clientId);
  url.searchParams.set('redirect_uri', request.redirectUri);
  url.searchParams.set('response_type', 'code');
  url.searchParams.set('scope', 'openid email profile');
  url.searchParams.set('state', request.state);
  url.searchParams.set('nonce', request.nonce);
  if (request.challenge) {
    url.searchParams.set('code_challenge', request.challenge);
    url.searchParams.set('code_challenge_method', 'S256');
  }
  return url.href;
}

export function newAuthRequest(client: { clientId: string; redirectUris: string[] }) {
  const pkce = pkcePair();
  const request: AuthRequest = {
    clientId: client.clientId,
    redirectUri: client.redirectUris[0] ?? '',
    state: randomBytes(12).toString('base64url'),
    nonce: randomBytes(12).toString('base64url'),
    challenge: pkce.challenge,
  };
  return { request, verifier: pkce.verifier };
}

/** Starts an authorization request and follows it to the first page shown (normally the sign-in page). */
export async function openAuthorization(browser: CookieJarFetch, issuer: string, request: AuthRequest, redirectUri: string) {
  const first = await browser.request(authorizeUrl(issuer, request));
  return browser.follow(first, (url) => url.startsWith(redirectUri));
}

/** Posts the page's form with the given fields added to its hidden inputs, and follows the redirects. */
export async function submitForm(browser: CookieJarFetch, page: Hop, fields: Record<string, string>, stopAt: (url: string) => boolean) {
  const form = readForm(page.body, page.url);
  const posted = await browser.request(form.action, { form: { ...form.hidden, ...fields } });
  return { posted, ...(await browser.follow(posted, stopAt)) };
}

export interface Jwt {
  header: Record<string, unknown>;
  payload: Record<string, unknown>;
}

export function decodeJwt(token: string): Jwt {
  const [header = '', payload = ''] = token.split('.');
  return {
    header: JSON.parse(Buffer.from(header, 'base64url').toString('utf8')) as Record<string, unknown>,
    payload: JSON.parse(Buffer.from(payload, 'base64url').toString('utf8')) as Record<string, unknown>,
  };
}

/** RFC 7515 section 5.2 with RS256 (RFC 7518 section 3.3: RSASSA-PKCS1-v1_5 with SHA-256). */
export function verifyRs256(token: string, keys: JsonWebKey[]): boolean {
  const [header = '', payload = '', signature = ''] = token.split('.');
  const { kid, alg } = decodeJwt(token).header;
  if (alg !== 'RS256') return false;
  const jwk = keys.find((k) => k.kid === kid);
  if (!jwk) return false;
  const key = createPublicKey({ key: jwk, format: 'jwk' });
  return verify('sha256', Buffer.from(`${header}.${payload}`), key, Buffer.from(signature, 'base64url'));
}

export async function exchangeCode(
  tokenEndpoint: string,
  client: { clientId: string; clientSecret: string },
  input: { code: string; redirectUri: string; verifier?: string },
) {
  const form = new URLSearchParams({ grant_type: 'authorization_code', code: input.code, redirect_uri: input.redirectUri });
  if (input.verifier) form.set('code_verifier', input.verifier);
  // RFC 6749 section 2.3.1: client_secret_basic = form-urlencoded id and secret in HTTP Basic.
  const basic = Buffer.from(`${encodeURIComponent(client.clientId)}:${encodeURIComponent(client.clientSecret)}`).toString('base64');
  const response = await fetch(tokenEndpoint, {
    method: 'POST',
    headers: { authorization: `Basic ${basic}`, 'content-type': 'application/x-www-form-urlencoded' },
    body: form,
  });
  return { status: response.status, body: (await response.json()) as Record<string, unknown> };
}
