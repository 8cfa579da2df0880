import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { Button, Notice, buttonClasses } from '../components';
import { isApiError } from '../api/client';

function describe(error: unknown): { title: string; detail: string; requestId?: string } {
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return { title: 'Page not found', detail: 'There is nothing at this address.' };
    return { title: `Error ${error.status}`, detail: error.statusText || 'The page could not be loaded.' };
  }
  if (isApiError(error)) {
    return { title: 'Barmkeep could not load this page', detail: error.message, requestId: error.requestId };
  }
  if (
    error instanceof TypeError &&
    /dynamically imported module|Importing a module script failed/i.test(error.message)
  ) {
    return {
      title: 'Barmkeep was updated',
      detail: 'A newer version is available. Reload the page to continue.',
    };
  }
  return { title: 'Something went wrong', detail: 'The page hit an unexpected error. Reloading usually helps.' };
}

/** Shown in place of any page whose loader or rendering failed. */
export function RouteError() {
  const error = useRouteError();
  const { title, detail, requestId } = describe(error);
  return (
    <main id="main" className="mx-auto max-w-lg space-y-4 px-4 py-16">
      <title>{`${title} · Barmkeep`}</title>
      <Notice tone="danger" title={title} live="assertive">
        <p>{detail}</p>
        {requestId ? (
          <p className="mt-1 text-sm text-ink-muted">
            Reference: <span className="num">{requestId}</span>
          </p>
        ) : null}
      </Notice>
      <div className="flex flex-wrap gap-2">
        <Button onClick={() => window.location.reload()}>Reload</Button>
        <Link to="/" className={buttonClasses('secondary')}>
          Go to your cultures
        </Link>
      </div>
    </main>
  );
}
