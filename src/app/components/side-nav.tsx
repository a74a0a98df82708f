import { useEffect, useRef } from 'react';
import { NavLink } from 'react-router';
import { paths } from '../../config/paths.ts';
import { cn } from '../../lib/cn.ts';
import type { Role } from '../../lib/roles.ts';
import { navSectionsFor } from '../nav.ts';

export type SideNavProps = {
  id: string;
  role: Role;
  /** Below the lg breakpoint the nav is a drawer over the page; at lg and up it is always shown. */
  open: boolean;
  onClose: () => void;
};

const linkBase =
  'relative flex items-center rounded-md px-2.5 py-1.5 text-sm whitespace-nowrap text-slate-700 hover:bg-slate-100 hover:text-slate-950 ' +
  'dark:text-slate-300 dark:hover:bg-slate-800 dark:hover:text-white';
// The active page: amber tint and a bar on the left edge, like a lit indicator.
const linkActive =
  'bg-amber-50 font-medium text-amber-900 hover:bg-amber-100/70 hover:text-amber-950 before:absolute before:inset-y-1.5 before:-left-3 ' +
  'before:w-0.5 before:rounded-full before:bg-amber-500 dark:bg-amber-400/10 dark:text-amber-200 dark:hover:bg-amber-400/15 dark:hover:text-amber-100';

/** The main navigation: the role's pages in sections (Analyse, Simulate, Test, Admin). */
export function SideNav({ id, role, open, onClose }: SideNavProps) {
  const navRef = useRef<HTMLElement>(null);
  const sections = navSectionsFor(role);

  // An opened drawer takes the focus to its first link; Escape closes it.
  useEffect(() => {
    if (!open) return;
    navRef.current?.querySelector<HTMLAnchorElement>('a')?.focus();
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') onClose();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [open, onClose]);

  return (
    <>
      {open && <div aria-hidden="true" onClick={onClose} className="fixed inset-0 top-[3.625rem] z-20 bg-slate-950/40 lg:hidden" />}
      {/* At lg and up this column runs the full height of the page, so its rule and tint never stop short. */}
      <div className="contents lg:block lg:w-52 lg:shrink-0 lg:border-r lg:border-slate-200 lg:bg-white/70 lg:dark:border-slate-800 lg:dark:bg-slate-900/50">
        <nav
          ref={navRef}
          id={id}
          aria-label="Main"
          className={cn(
            'fixed top-[3.625rem] bottom-0 left-0 z-30 w-60 max-w-[85vw] overflow-y-auto border-r border-slate-200 bg-white shadow-xl dark:border-slate-800 dark:bg-slate-900',
            'lg:sticky lg:z-0 lg:block lg:h-[calc(100vh-3.625rem)] lg:w-full lg:max-w-none lg:border-r-0 lg:bg-transparent lg:shadow-none lg:dark:bg-transparent',
            open ? 'block' : 'hidden',
          )}
        >
          <div className="space-y-5 px-3 py-5">
            {sections.map((section) => {
              const headingId = `${id}-${section.id}`;
              return (
                <div key={section.id}>
                  {section.id !== 'home' && (
                    <p id={headingId} className="mb-1.5 px-2.5 font-mono text-[10.5px] font-medium tracking-widest text-slate-500 uppercase dark:text-slate-400">
                      {section.label}
                    </p>
                  )}
                  <ul className="space-y-0.5" aria-labelledby={section.id === 'home' ? undefined : headingId}>
                    {section.entries.map((entry) => (
                      <li key={entry.to}>
                        <NavLink to={entry.to} end={entry.to === paths.home.path} onClick={onClose} className={({ isActive }) => cn(linkBase, isActive && linkActive)}>
                          {entry.label}
                        </NavLink>
                      </li>
                    ))}
                  </ul>
                </div>
              );
            })}
          </div>
        </nav>
      </div>
    </>
  );
}
