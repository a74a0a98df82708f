import { Suspense, useCallback, useEffect, useId, useRef, useState } from 'react';
import { Link, Navigate, Outlet, useLocation, useNavigation } from 'react-router';
import { ParleyMark } from '../../components/parley-mark.tsx';
import { ThemeSwitch } from '../../components/theme-switch.tsx';
import { paths } from '../../config/paths.ts';
import { SessionContext, useMe } from '../../lib/auth.ts';
import { cn } from '../../lib/cn.ts';
import { UserMenu } from '../components/user-menu.tsx';
import { SideNav } from '../components/side-nav.tsx';

/** The signed-in shell: top bar (brand, colour scheme, account), the sectioned nav on the left, the page beside it. */
export function AppLayout() {
  const { data: session } = useMe();
  const navigation = useNavigation();
  const location = useLocation();
  const navId = useId();
  const menuButtonRef = useRef<HTMLButtonElement>(null);
  const [menuOpen, setMenuOpen] = useState(false);
  const closeMenu = useCallback(() => {
    setMenuOpen(false);
    // Hands the focus back to the button (a no-op at lg and up, where the button is hidden).
    menuButtonRef.current?.focus();
  }, []);
  // A new page closes the drawer on narrow windows.
  // biome-ignore lint/correctness/useExhaustiveDependencies: the path is the trigger, not an input
  useEffect(() => setMenuOpen(false), [location.pathname]);

  // The loader made sure of a session; it ends here on sign-out or when the server says 401.
  if (!session) return <Navigate to={paths.auth.signIn.getHref(location.pathname + location.search)} replace />;
  const { user, organisation } = session;

  return (
    <SessionContext value={session}>
      <div className="flex min-h-screen flex-col">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-amber-400 focus:px-3 focus:py-1 focus:text-slate-950">
          Skip to content
        </a>
        <header className="sticky top-0 z-30 bg-slate-900 text-slate-100 shadow-sm">
          <div className="flex h-14 items-center gap-3 px-3 sm:px-4">
            <button
              ref={menuButtonRef}
              type="button"
              aria-expanded={menuOpen}
              aria-controls={navId}
              onClick={() => (menuOpen ? closeMenu() : setMenuOpen(true))}
              className="flex h-9 items-center gap-2 rounded-md px-2.5 text-sm text-slate-200 hover:bg-slate-800 hover:text-white lg:hidden"
            >
              <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round">
                <path d={menuOpen ? 'M3.5 3.5l9 9M12.5 3.5l-9 9' : 'M2 4h12M2 8h12M2 12h12'} />
              </svg>
              Menu
            </button>
            <Link to={paths.home.getHref()} className="flex min-w-0 shrink-0 items-center gap-2.5 rounded-md px-1" aria-label="Parley home">
              <ParleyMark className="size-7 shrink-0" />
              <span className="text-[15px] font-semibold tracking-tight">Parley</span>
              {organisation && <span className="hidden border-l border-slate-700 pl-2.5 font-mono text-[11px] whitespace-nowrap text-slate-400 md:inline">{organisation.name}</span>}
            </Link>
            <div className="ml-auto flex items-center gap-3">
              <ThemeSwitch />
              <UserMenu />
            </div>
          </div>
          {/* The signal line: amber while a page loads, a quiet rule otherwise. */}
          <div
            aria-hidden="true"
            className={cn('h-0.5 bg-gradient-to-r from-amber-500 via-amber-400/40 to-transparent transition-opacity', navigation.state === 'idle' ? 'opacity-40' : 'animate-pulse opacity-100')}
          />
        </header>
        <div className="flex flex-1">
          <SideNav id={navId} role={user.role} open={menuOpen} onClose={closeMenu} />
          <div className="flex min-w-0 flex-1 flex-col">
            <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-8 sm:px-6 2xl:px-8">
              <Suspense fallback={<p className="text-xs text-slate-500 dark:text-slate-400">Loading…</p>}>
                <Outlet />
              </Suspense>
            </main>
            <footer className="border-t border-slate-200 px-4 py-4 text-center text-[11px] text-slate-500 dark:border-slate-800 dark:text-slate-400">
              Parley simulates USB Power Delivery; it does not drive hardware.
            </footer>
          </div>
        </div>
      </div>
    </SessionContext>
  );
}
