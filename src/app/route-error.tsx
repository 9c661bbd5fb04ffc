import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { ErrorPanel } from '../components/ui/error-panel.tsx';

/** Shown in place of a route whose loader or render failed; the rest of the app keeps working. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'An unexpected error happened.';
  return <ErrorPanel title="This page could not be shown" message={`${message} Reload the page to try again.`} />;
}
