import type { z } from 'zod';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';

/** An error answered by the API, with its code and message from the body. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: { path: string; message: string }[],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

async function toApiError(response: Response): Promise<ApiError> {
  const body: unknown = await response.json().catch(() => null);
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    return new ApiError(response.status, code, message, Array.isArray(details) ? (details as { path: string; message: string }[]) : undefined);
  }
  return new ApiError(response.status, 'unexpected_response', `The server answered ${response.status} without an error body.`);
}

/**
 * Fetches a JSON endpoint and parses the body with the schema the server uses.
 * `okStatuses` lets a caller accept a non-2xx answer whose body has the success shape (e.g. health's 503).
 */
export async function apiGet<T>(path: string, schema: z.ZodType<T>, okStatuses: number[] = []): Promise<T> {
  const response = await fetch(`/api${path}`, { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
  if (response.ok || okStatuses.includes(response.status)) return schema.parse(await response.json());
  throw await toApiError(response);
}

/** A write: JSON body, the anti-forgery header the server requires, and the parsed answer (or null for 204). */
export async function apiSend<T>(method: 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, body?: unknown, schema?: z.ZodType<T>): Promise<T | null> {
  const response = await fetch(`/api${path}`, {
    method,
    credentials: 'same-origin',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json', 'X-Planktide-CSRF': '1' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204 || !schema) return null;
  return schema.parse(await response.json());
}

/** Fetches a binary endpoint (e.g. a forecast grid) as bytes; the browser undoes any gzip Content-Encoding. */
export async function apiGetBinary(path: string): Promise<ArrayBuffer> {
  const response = await fetch(`/api${path}`, { headers: { Accept: 'application/octet-stream' }, credentials: 'same-origin' });
  if (!response.ok) throw await toApiError(response);
  return response.arrayBuffer();
}

/** A multipart upload (e.g. a CSV in the field "file") with the anti-forgery header; the browser sets the multipart boundary. */
export async function apiUpload<T>(path: string, form: FormData, schema: z.ZodType<T>): Promise<T> {
  const response = await fetch(`/api${path}`, {
    method: 'POST',
    credentials: 'same-origin',
    headers: { Accept: 'application/json', 'X-Planktide-CSRF': '1' },
    body: form,
  });
  if (!response.ok) throw await toApiError(response);
  return schema.parse(await response.json());
}

export const signInUrl = (returnTo = window.location.pathname + window.location.search) =>
  `/auth/login?returnTo=${encodeURIComponent(returnTo)}`;
