import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

/** The top-level error boundary: a page that failed to load or render. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Something went wrong.';
  return (
    <div role="alert" className="m-10 max-w-xl rounded border border-fail bg-fail-soft p-6 text-ink">
      <h1 className="text-xl font-bold mb-2">This page could not be shown</h1>
      <p className="mb-4">{message}</p>
      <Link className="underline" to="/">Back to the overview</Link>
    </div>
  );
}
