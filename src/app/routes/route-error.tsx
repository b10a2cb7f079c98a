import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { AlertTriangle } from 'lucide-react';
import { NotFoundRoute } from './not-found';
import { paths } from '@shared/paths';

/** Shown when a route's loader or render throws. */
export function RouteErrorBoundary() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFoundRoute />;
  const message = error instanceof Error ? error.message : isRouteErrorResponse(error) ? error.statusText : 'Unknown error';
  return (
    <div role="alert" className="flex min-h-[60vh] flex-col items-center justify-center gap-3 px-6 text-center">
      <AlertTriangle className="h-10 w-10 text-short-500" aria-hidden />
      <h1 className="text-xl font-semibold">This page ran into a problem</h1>
      <p className="max-w-md text-sm text-ink-600">{message}</p>
      <Link to={paths.home.to()} className="text-sm font-medium text-lamp-700 underline">Go to the overview</Link>
    </div>
  );
}
