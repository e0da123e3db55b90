import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Button } from '../../components/ui/button';

/** Shown when a screen fails to load or throws while rendering. */
export function RouteError() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : error instanceof Error ? error.message : null;
  return (
    <div role="alert" className="mx-auto flex max-w-lg flex-col items-center gap-3 px-4 py-16 text-center">
      <h1 className="text-2xl font-semibold text-ink-900">Something went wrong</h1>
      <p className="text-sm text-ink-600">The page could not be shown. Reload to try again; your work on the server is safe.</p>
      {detail && <p className="rounded bg-ink-100 px-3 py-1.5 font-mono text-xs text-ink-700">{detail}</p>}
      <Button onClick={() => window.location.reload()}>Reload</Button>
    </div>
  );
}
