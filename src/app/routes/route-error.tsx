import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div className="mx-auto max-w-lg p-10">
      <h1 className="text-lg font-semibold text-ink-950">This page could not be shown</h1>
      <p className="mt-2 text-sm text-ink-500">{message}</p>
      <Link to="/" className="mt-4 inline-block text-sm font-medium text-copper-700 underline">Back to home</Link>
    </div>
  );
}
