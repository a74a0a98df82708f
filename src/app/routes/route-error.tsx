import { isRouteErrorResponse, Link, useRouteError } from 'react-router';
import { buttonClasses } from '../../components/button.tsx';
import { errorText } from '../../components/error-message.tsx';
import { paths } from '../../config/paths.ts';
import { isApiError } from '../../lib/api-client.ts';

type Explained = { title: string; message: string; reload: boolean };

function explain(error: unknown): Explained {
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return { title: 'Page not found', message: 'There is no page at this address.', reload: false };
    if (error.status === 403) {
      const message = typeof error.data === 'string' ? error.data : 'This page is not available to your role.';
      return { title: 'Not available to your role', message, reload: false };
    }
    return { title: 'Something went wrong', message: 'The page could not be loaded.', reload: true };
  }
  if (isApiError(error)) return { title: 'The server could not answer', message: error.message, reload: error.status >= 500 || error.status === 0 };
  // A chunk that no longer exists after an update fails to import: a reload fetches the new one.
  if (error instanceof TypeError && /dynamically imported module|Importing a module script failed/i.test(error.message)) {
    return { title: 'Parley was updated', message: 'Reload the page to get the new version.', reload: true };
  }
  return { title: 'Something went wrong', message: errorText(error), reload: true };
}

/** The errorElement of every route: a plain explanation and a way on, never a stack trace. */
export function RouteError() {
  const error = useRouteError();
  const { title, message, reload } = explain(error);
  if (!isRouteErrorResponse(error)) console.warn('Route error', error);
  return (
    <div role="alert" className="mx-auto max-w-lg px-4 py-16 text-center">
      <p className="font-mono text-xs tracking-widest text-amber-700 uppercase dark:text-amber-400">Parley</p>
      <h1 className="mt-2 text-xl font-semibold text-slate-900 dark:text-slate-50">{title}</h1>
      <p className="mt-2 text-sm text-slate-600 dark:text-slate-400">{message}</p>
      <div className="mt-6 flex justify-center gap-3">
        <Link to={paths.home.getHref()} className={buttonClasses('secondary')}>
          Go to Home
        </Link>
        {reload && (
          <button type="button" className={buttonClasses('primary')} onClick={() => window.location.reload()}>
            Reload
          </button>
        )}
      </div>
    </div>
  );
}
