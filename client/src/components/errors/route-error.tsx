import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { paths } from '@client/config/paths';

/** Shown in place of a route that threw while rendering or loading. The rest of the app keeps working. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Unknown error';
  return (
    <div role="alert" className="mx-auto max-w-xl p-6">
      <h1 className="text-2xl">This screen hit a problem</h1>
      <p className="mt-2 text-ink-soft">
        Nothing you entered on this device is lost: it is kept in the device store. Go back and try again; if it
        happens again, tell your coordinator what you were doing.
      </p>
      <pre className="mt-4 overflow-auto rounded border border-line bg-card p-3 text-sm">{message}</pre>
      <Link className="mt-4 inline-block rounded bg-hull px-4 py-3 font-bold text-paper" to={paths.home}>
        Back to the start
      </Link>
    </div>
  );
}
