import { Link } from 'react-router';
import { buttonClasses } from '../../components/button.tsx';
import { paths } from '../../config/paths.ts';

export function NotFoundRoute() {
  return (
    <div className="mx-auto max-w-lg py-16 text-center">
      <p className="font-mono text-xs tracking-widest text-amber-700 uppercase dark:text-amber-400">404</p>
      <h1 className="mt-2 text-xl font-semibold text-slate-900 dark:text-slate-50">Page not found</h1>
      <p className="mt-2 text-sm text-slate-600 dark:text-slate-400">There is no page at this address.</p>
      <Link to={paths.home.getHref()} className={buttonClasses('secondary', 'md', 'mt-6')}>
        Go to Home
      </Link>
    </div>
  );
}
