import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ApiError } from '../lib/api-client.ts';

/** Route error boundary: explains 404s and API errors; anything else shows a plain apology. */
export function RouteError() {
  const err = useRouteError();
  const notFound = (isRouteErrorResponse(err) && err.status === 404) || (err instanceof ApiError && err.status === 404);
  return (
    <main className="mx-auto max-w-xl p-8">
      <h1 className="text-2xl font-bold">{notFound ? 'Not found' : 'Something went wrong'}</h1>
      <p className="mt-2 text-ink-soft">{notFound ? 'This page does not exist, or it belongs to a channel you are not in.' : err instanceof Error ? err.message : 'Reload the page to try again.'}</p>
      <Link to="/board" className="mt-4 inline-block text-accent underline">
        Go to the board
      </Link>
    </main>
  );
}
