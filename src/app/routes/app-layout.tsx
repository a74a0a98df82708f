import { Suspense } from 'react';
import { Link, Navigate, NavLink, Outlet, useLocation, useNavigation } from 'react-router';
import { ParleyMark } from '../../components/parley-mark.tsx';
import { ThemeSwitch } from '../../components/theme-switch.tsx';
import { paths } from '../../config/paths.ts';
import { SessionContext, useMe } from '../../lib/auth.ts';
import { cn } from '../../lib/cn.ts';
import { UserMenu } from '../components/user-menu.tsx';
import { navFor } from '../nav.ts';

/** The signed-in shell: top bar with nav, account menu and colour scheme; pages render below. */
export function AppLayout() {
  const { data: session } = useMe();
  const navigation = useNavigation();
  const location = useLocation();
  // The loader made sure of a session; it ends here on sign-out or when the server says 401.
  if (!session) return <Navigate to={paths.auth.signIn.getHref(location.pathname + location.search)} replace />;
  const { user, organisation } = session;
  const entries = navFor(user.role);

  return (
    <SessionContext value={session}>
      <div className="flex min-h-screen flex-col">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-amber-400 focus:px-3 focus:py-1 focus:text-slate-950">
          Skip to content
        </a>
        <header className="sticky top-0 z-10 bg-slate-900 text-slate-100 shadow-sm">
          <div className="mx-auto flex h-14 max-w-7xl items-center gap-6 px-4 sm:px-6">
            <Link to={paths.home.getHref()} className="flex items-center gap-2.5" aria-label="Parley home">
              <ParleyMark className="size-7" />
              <span className="text-[15px] font-semibold tracking-tight">Parley</span>
              {organisation && (
                <span className="hidden border-l border-slate-700 pl-2.5 font-mono text-[11px] text-slate-400 md:inline">
                  {organisation.name}
                </span>
              )}
            </Link>
            <nav aria-label="Main" className="flex min-w-0 flex-1 items-center gap-1 overflow-x-auto">
              {entries.map((entry) => (
                <NavLink
                  key={entry.to}
                  to={entry.to}
                  end={entry.to === paths.home.path}
                  className={({ isActive }) =>
                    cn(
                      'relative rounded-md px-3 py-1.5 text-sm whitespace-nowrap text-slate-300 hover:bg-slate-800 hover:text-white',
                      isActive && 'bg-slate-800 text-white after:absolute after:inset-x-3 after:-bottom-[11px] after:h-0.5 after:bg-amber-400',
                    )
                  }
                >
                  {entry.label}
                </NavLink>
              ))}
            </nav>
            <div className="flex items-center gap-3">
              <ThemeSwitch />
              <UserMenu />
            </div>
          </div>
          {/* The signal line: amber while a page loads, a quiet rule otherwise. */}
          <div
            aria-hidden="true"
            className={cn(
              'h-0.5 bg-gradient-to-r from-amber-500 via-amber-400/40 to-transparent transition-opacity',
              navigation.state === 'idle' ? 'opacity-40' : 'animate-pulse opacity-100',
            )}
          />
        </header>
        <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-8 sm:px-6">
          <Suspense fallback={<p className="text-xs text-slate-500">Loading…</p>}>
            <Outlet />
          </Suspense>
        </main>
        <footer className="border-t border-slate-200 py-4 text-center text-[11px] text-slate-500 dark:border-slate-800">
          Parley simulates USB Power Delivery; it does not drive hardware.
        </footer>
      </div>
    </SessionContext>
  );
}
