import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ApiError } from '@/lib/api-client';
import { MullionWordmark } from '@/components/ui/logo';

/** Shown when a page cannot load: says what happened and what to do. */
export function RouteError() {
  const error = useRouteError();
  let title = 'This page could not be shown';
  let detail = 'Something went wrong while loading it. Reload the page; if it keeps happening, tell us what you were doing.';
  if (isRouteErrorResponse(error) && error.status === 404) {
    title = 'No such page';
    detail = 'The address may be mistyped, or the page has moved.';
  } else if (error instanceof ApiError) {
    if (error.status === 404) {
      title = 'Not found';
      detail = 'This record does not exist, or it belongs to someone else.';
    } else if (error.status === 403) {
      title = 'Not available to your role';
      detail = error.message;
    } else {
      detail = error.message;
    }
  }
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col justify-center gap-4 px-6">
      <MullionWordmark />
      <h1 className="text-xl font-semibold">{title}</h1>
      <p className="text-slate-500">{detail}</p>
      <p>
        <Link to="/" className="font-medium text-brass-700 underline">
          Go to the start page
        </Link>
      </p>
    </main>
  );
}
