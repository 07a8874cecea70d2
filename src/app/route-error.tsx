import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

/** Shown when a page fails to load or throws: the rest of the app stays usable. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : 'Unknown error';
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <h1 className="text-2xl font-semibold">This page could not be shown</h1>
      <p className="mt-3 text-slate-700 dark:text-slate-300">{message}</p>
      <p className="mt-6">
        <Link className="font-semibold text-brass-600 underline dark:text-brass-400" to="/">
          Back to your studio
        </Link>
      </p>
    </main>
  );
}
