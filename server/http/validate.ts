import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { AppError } from './app-error.ts';

function describe(where: string, error: z.ZodError): AppError {
  const details = error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
  const summary = details.map((d) => (d.path ? `${d.path}: ${d.message}` : d.message)).join('; ');
  return new AppError('validation_failed', `The ${where} has problems: ${summary}. Correct them and send again.`, details);
}

/** Parses body, query and params with zod and replaces them with the parsed values. */
export function validate(schemas: { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType }): RequestHandler {
  return (req, _res, next) => {
    if (schemas.params) {
      const parsed = schemas.params.safeParse(req.params);
      if (!parsed.success) {
        // A malformed id in the path names nothing that exists.
        return next(new AppError('not_found', 'Nothing exists at this address. Check the id in the path.'));
      }
      Object.assign(req.params, parsed.data);
    }
    if (schemas.query) {
      const parsed = schemas.query.safeParse(req.query);
      if (!parsed.success) return next(describe('query string', parsed.error));
      Object.defineProperty(req, 'query', { value: parsed.data, writable: true, configurable: true, enumerable: true });
    }
    if (schemas.body) {
      const parsed = schemas.body.safeParse(req.body ?? {});
      if (!parsed.success) return next(describe('request body', parsed.error));
      req.body = parsed.data;
    }
    next();
  };
}
