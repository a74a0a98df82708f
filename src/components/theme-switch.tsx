import { setTheme, useTheme, type ThemeChoice } from '../lib/theme.ts';
import { cn } from '../lib/cn.ts';

const choices: { value: ThemeChoice; label: string; icon: string }[] = [
  { value: 'system', label: 'Follow the system colour scheme', icon: 'M2 3h12v8H2zM6 13h4' },
  { value: 'light', label: 'Light colour scheme', icon: 'M8 4.5a3.5 3.5 0 1 1 0 7 3.5 3.5 0 0 1 0-7ZM8 1v1.5M8 13.5V15M1 8h1.5M13.5 8H15M3 3l1 1M12 12l1 1M3 13l1-1M12 4l1-1' },
  { value: 'dark', label: 'Dark colour scheme', icon: 'M13 9.5A5.5 5.5 0 0 1 6.5 3a5.5 5.5 0 1 0 6.5 6.5Z' },
];

/** Three-way switch: system, light, dark; the choice is remembered in this browser. */
export function ThemeSwitch({ className }: { className?: string }) {
  const current = useTheme();
  return (
    <div role="group" aria-label="Colour scheme" className={cn('flex rounded-md bg-slate-800 p-0.5 ring-1 ring-slate-700', className)}>
      {choices.map((choice) => (
        <button
          key={choice.value}
          type="button"
          aria-label={choice.label}
          aria-pressed={current === choice.value}
          title={choice.label}
          onClick={() => setTheme(choice.value)}
          className={cn('grid size-7 place-items-center rounded text-slate-400 hover:text-slate-100', current === choice.value && 'bg-slate-700 text-amber-400 hover:text-amber-300')}
        >
          <svg aria-hidden="true" viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round">
            <path d={choice.icon} />
          </svg>
        </button>
      ))}
    </div>
  );
}
