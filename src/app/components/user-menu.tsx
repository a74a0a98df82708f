import { useEffect, useId, useRef, useState } from 'react';
import { useNavigate } from 'react-router';
import { Badge } from '../../components/badge.tsx';
import { paths } from '../../config/paths.ts';
import { useSession, useSignOut } from '../../lib/auth.ts';
import { roleLabels } from '../../lib/roles.ts';

function initialsOf(name: string, email: string): string {
  const words = name.trim().split(/\s+/).filter(Boolean);
  const letters = words.length > 0 ? words.slice(0, 2).map((word) => word[0] ?? '') : [email[0] ?? '?'];
  return letters.join('').toUpperCase();
}

/** The signed-in person, their role, and sign-out. */
export function UserMenu() {
  const { user } = useSession();
  const [open, setOpen] = useState(false);
  const menuId = useId();
  const rootRef = useRef<HTMLDivElement>(null);
  const navigate = useNavigate();
  const signOut = useSignOut();

  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!rootRef.current?.contains(event.target as Node)) setOpen(false);
    };
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setOpen(false);
    };
    document.addEventListener('pointerdown', onPointer);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  const onSignOut = () => {
    signOut.mutate(undefined, {
      onSettled: () => void navigate(paths.auth.signIn.getHref(), { replace: true }),
    });
  };

  return (
    <div ref={rootRef} className="relative">
      <button
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={menuId}
        aria-label={`Account: ${user.name}, ${roleLabels[user.role]}`}
        onClick={() => setOpen((value) => !value)}
        className="flex items-center gap-2 rounded-md py-1 pr-2 pl-1 text-slate-200 hover:bg-slate-800"
      >
        <span aria-hidden="true" className="grid size-7 place-items-center rounded bg-amber-500 font-mono text-[11px] font-semibold text-slate-950">
          {initialsOf(user.name, user.email)}
        </span>
        <span className="hidden text-sm sm:inline">{user.name}</span>
        <Badge tone="accent" className="hidden sm:inline-flex">
          {roleLabels[user.role]}
        </Badge>
      </button>
      {open && (
        <div
          id={menuId}
          role="menu"
          aria-label="Account"
          className="absolute right-0 z-20 mt-2 w-64 overflow-hidden rounded-lg border border-slate-200 bg-white shadow-lg dark:border-slate-700 dark:bg-slate-900"
        >
          <div className="border-b border-slate-200 px-4 py-3 dark:border-slate-800">
            <p className="text-sm font-medium text-slate-900 dark:text-slate-100">{user.name}</p>
            <p className="truncate font-mono text-xs text-slate-500 dark:text-slate-400">{user.email}</p>
            <p className="mt-2 text-xs text-slate-600 dark:text-slate-400">
              Role: <Badge tone="accent">{roleLabels[user.role]}</Badge>
            </p>
          </div>
          <button
            type="button"
            role="menuitem"
            onClick={onSignOut}
            disabled={signOut.isPending}
            className="w-full px-4 py-2.5 text-left text-sm text-slate-700 hover:bg-slate-100 dark:text-slate-200 dark:hover:bg-slate-800"
          >
            {signOut.isPending ? 'Signing out…' : 'Sign out'}
          </button>
        </div>
      )}
    </div>
  );
}
