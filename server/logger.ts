import { pino, type DestinationStream, type Logger } from 'pino';

export type { Logger };

const SECRET_QUERY = /([?&](?:code|state|token|id_token_hint|session_state)=)[^&]*/gi;
const SECRET_PATH = /(\/invitations\/)[A-Za-z0-9_-]{20,}/g;

/** A URL fit for logs: one-time codes, states and invitation tokens replaced by a mark. */
export function redactUrl(url: string): string {
  return url.replace(SECRET_QUERY, '$1[redacted]').replace(SECRET_PATH, '$1[redacted]');
}

/** Structured JSON logs; cookies, authorisation headers and secrets in URLs are never written. */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  return pino(
    {
      level,
      base: { service: 'planktide' },
      redact: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]', 'res.headers.location', 'req.headers.referer'],
    },
    destination,
  );
}

/** The request as logged by pino-http: the standard fields with the URL redacted and no parsed query. */
export function logRequest(req: { url?: string; query?: unknown; [key: string]: unknown }) {
  return { ...req, url: redactUrl(String(req.url ?? '')), query: undefined };
}
