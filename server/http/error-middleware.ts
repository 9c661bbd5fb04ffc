import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from './app-error.ts';

export const notFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', `No API route ${req.method} ${req.path}. Check the address and method.`));
};

function fromBodyParser(error: unknown): AppError | null {
  if (!error || typeof error !== 'object' || !('type' in error)) return null;
  if (error.type === 'entity.parse.failed') {
    return new AppError('bad_request', 'The request body is not valid JSON. Send a JSON object with Content-Type: application/json.');
  }
  if (error.type === 'entity.too.large') {
    return new AppError('payload_too_large', 'The request body is too large.');
  }
  return null;
}

// Errors that mean the database cannot be reached right now (refused, reset, shut down, starting up).
const DATABASE_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', '57P01', '57P02', '57P03', '08000', '08001', '08003', '08006']);

function fromDatabaseOutage(error: unknown): AppError | null {
  if (!error || typeof error !== 'object') return null;
  const code = 'code' in error ? String(error.code) : '';
  const message = error instanceof Error ? error.message : '';
  if (DATABASE_DOWN_CODES.has(code) || /Connection terminated|timeout exceeded when trying to connect|the database system is (starting up|shutting down)/i.test(message)) {
    return new AppError('service_unavailable', 'The database is not reachable right now, so nothing was read or saved. Try again in a minute.');
  }
  return null;
}

export const errorMiddleware: ErrorRequestHandler = (error, req, res, _next) => {
  const known = error instanceof AppError ? error : (fromBodyParser(error) ?? fromDatabaseOutage(error));
  const appError = known ?? new AppError('internal', 'Something went wrong on our side. The error was logged; try again.');
  if (!known) req.log?.error({ err: error }, 'unhandled error');
  const body: { code: string; message: string; details?: unknown; requestId?: string } = {
    code: appError.code,
    message: appError.message,
  };
  if (appError.details !== undefined) body.details = appError.details;
  body.requestId = String(req.id);
  if (appError.status === 503) res.setHeader('Retry-After', '30');
  res.status(appError.status).json({ error: body });
};
