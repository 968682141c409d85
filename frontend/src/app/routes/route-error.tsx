import { isRouteErrorResponse, useRouteError } from 'react-router';

/** Last resort when a screen fails to load or throws: say so and offer a reload. */
export function RouteError() {
  const error = useRouteError();
  const chunkMissing =
    error instanceof Error && /dynamically imported module|Importing a module script/i.test(error.message);
  return (
    <div className="page status-page" role="alert">
      <i className="pi pi-exclamation-triangle status-page__icon" aria-hidden="true" />
      <h1 className="status-page__title">
        {isRouteErrorResponse(error) && error.status === 404 ? 'Page not found' : 'This screen did not load'}
      </h1>
      <p className="status-page__text">
        {chunkMissing
          ? 'Loambook was updated since this page was opened. Reload to get the new version.'
          : 'Something went wrong while showing this screen. Reloading usually helps.'}
      </p>
      <button type="button" className="p-button p-component" onClick={() => window.location.reload()}>
        <i className="pi pi-refresh p-button-icon p-button-icon-left" aria-hidden="true" />
        <span className="p-button-label">Reload</span>
      </button>
    </div>
  );
}
