import { Link, isRouteErrorResponse, useRouteError } from 'react-router';
import { ApiFailure } from '../../lib/api';

export function RouteError() {
  const err = useRouteError();
  let title = 'Something went wrong';
  let detail = 'Reload the page; if it happens again, tell your administrator.';
  if (err instanceof ApiFailure) {
    title = err.status === 404 ? 'Not found' : err.status === 403 ? 'Not for your role' : title;
    detail = err.message;
  } else if (isRouteErrorResponse(err)) {
    title = `${err.status} ${err.statusText}`;
  }
  return (
    <main className="mx-auto max-w-xl p-6">
      <h1 className="text-2xl font-semibold">{title}</h1>
      <p className="mt-2">{detail}</p>
      <Link className="btn-quiet mt-4" to="/">
        Back to the pieces
      </Link>
    </main>
  );
}
