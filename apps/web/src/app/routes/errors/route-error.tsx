import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ApiError } from '../../../lib/api-client';
import { Button, buttonClass } from '../../../lib/ui/button';

function describe(error: unknown): { title: string; message: string; requestId?: string | undefined } {
  if (error instanceof ApiError) {
    if (error.status === 401) return { title: 'Your session has ended', message: 'Sign in again to carry on.' };
    if (error.status === 404)
      return { title: 'Not found', message: 'That record does not exist, or it belongs to a site outside yours.' };
    if (error.status === 403) return { title: 'Not for your role', message: error.message };
    return { title: 'Something went wrong', message: error.message, requestId: error.requestId };
  }
  if (isRouteErrorResponse(error)) {
    return error.status === 404
      ? { title: 'No page here', message: 'The address may be mistyped, or the page may have moved.' }
      : { title: 'Something went wrong', message: `${error.status} ${error.statusText}` };
  }
  return {
    title: 'Something went wrong',
    message: 'This page failed to load. Reload it; if it keeps happening, tell your administrator.',
  };
}

/** Shown in place of a page that failed: what happened in plain words, and a way back. */
export function RouteError() {
  const error = useRouteError();
  const { title, message, requestId } = describe(error);
  const signedOut = error instanceof ApiError && error.status === 401;
  return (
    <div role="alert" className="mx-auto max-w-prose space-y-4 px-4 py-10">
      <title>{`${title} · Kerfline`}</title>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{title}</h1>
      <p className="text-ink">{message}</p>
      {requestId ? <p className="text-sm text-ink-muted">Reference for your administrator: {requestId}</p> : null}
      <div className="flex flex-wrap gap-3">
        {signedOut ? (
          <Link to="/sign-in" className={buttonClass('primary')}>
            Sign in
          </Link>
        ) : (
          <>
            <Link to="/sites" className={buttonClass('primary')}>
              Back to sites
            </Link>
            <Button onClick={() => window.location.reload()}>Reload the page</Button>
          </>
        )}
      </div>
    </div>
  );
}
