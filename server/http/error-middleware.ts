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

export const errorMiddleware: ErrorRequestHandler = (error, req, res, _next) => {
  const known = error instanceof AppError ? error : fromBodyParser(error);
  const appError = known ?? new AppError('internal', 'Something went wrong on our side. The error was logged; try again.');
  if (!known) req.log?.error({ err: error }, 'unhandled error');
  const body: { code: string; message: string; details?: unknown; requestId?: string } = {
    code: appError.code,
    message: appError.message,
  };
  if (appError.details !== undefined) body.details = appError.details;
  body.requestId = String(req.id);
  res.status(appError.status).json({ error: body });
};
