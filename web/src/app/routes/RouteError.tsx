import { isRouteErrorResponse, useRouteError } from 'react-router-dom';

/** Shown when a page fails to load or render (e.g. a chunk missing after a new deployment). */
export function RouteError() {
  const error = useRouteError();
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : '';
  return (
    <section className="sm-page sm-empty-page" role="alert">
      <h1>This page could not be shown</h1>
      <p>Reload the page to try again. If it keeps happening, tell your administrator.</p>
      {detail && <p className="sm-muted">{detail}</p>}
    </section>
  );
}
