import type { z } from 'zod';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';

/** An error answered by the API, with its code and message from the body. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/**
 * Fetches a JSON endpoint and parses the body with the schema the server uses.
 * `okStatuses` lets a caller accept a non-2xx answer whose body has the success shape (e.g. health's 503).
 */
export async function apiGet<T>(path: string, schema: z.ZodType<T>, okStatuses: number[] = []): Promise<T> {
  const response = await fetch(`/api${path}`, { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
  const body: unknown = await response.json().catch(() => null);
  if (response.ok || okStatuses.includes(response.status)) return schema.parse(body);
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    throw new ApiError(response.status, code, message, details);
  }
  throw new ApiError(response.status, 'unexpected_response', `The server answered ${response.status} without an error body.`);
}
