import { pino, type Logger } from 'pino';

export type { Logger };

/** Structured JSON logs; secrets in headers are never written. */
export function createLogger(level: string): Logger {
  return pino({
    level,
    base: { service: 'planktide' },
    redact: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]'],
  });
}
