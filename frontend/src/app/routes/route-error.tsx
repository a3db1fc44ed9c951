import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { ErrorScreen } from '@/components/errors/error-screen';
import { NotFound } from '@/components/errors/not-found';

function describe(error: unknown) {
  if (isRouteErrorResponse(error)) return `${error.status} ${error.statusText}`;
  if (error instanceof Error) {
    // A new deployment removes old chunks; reloading fetches the current ones.
    if (/dynamically imported module|Importing a module script failed/i.test(error.message)) {
      return 'Part of the application could not be loaded, probably because it was just updated. Reload the page.';
    }
    return error.message;
  }
  return undefined;
}

/** The route `errorElement`: shown when a page throws while loading or rendering. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  return <ErrorScreen message={describe(error)} />;
}
