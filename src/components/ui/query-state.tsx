import type { ReactNode } from 'react';
import { ApiError } from '../../lib/api-client.ts';
import { ErrorPanel } from './error-panel.tsx';

/** Loading and error states of a query, so screens only draw the data. */
export function QueryState<T>({ query, children }: { query: { isPending: boolean; error: Error | null; data: T | undefined }; children: (data: T) => ReactNode }) {
  if (query.isPending) return <p className="text-sm text-ink-soft">Loading…</p>;
  if (query.error) {
    const status = query.error instanceof ApiError ? query.error.status : 0;
    const title = status === 403 ? 'Not allowed' : status === 404 ? 'Not found' : 'Could not load';
    return <ErrorPanel title={title} message={query.error.message} />;
  }
  return <>{children(query.data as T)}</>;
}
