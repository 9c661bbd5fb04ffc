import { Link } from 'react-router-dom';

export function NotFoundRoute() {
  return (
    <div className="space-y-3">
      <h1 className="text-2xl font-bold text-tide-900">Page not found</h1>
      <p className="text-ink-soft">There is no page at this address. It may have moved, or the link may be mistyped.</p>
      <Link to="/" className="font-semibold text-tide-700 underline">
        Back to the overview
      </Link>
    </div>
  );
}
