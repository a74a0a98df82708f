import { useSyncExternalStore } from 'react';

/** The user's colour-scheme choice; 'system' follows prefers-color-scheme. */
export type ThemeChoice = 'system' | 'light' | 'dark';

// Keep in step with public/theme-init.js, which applies the choice before the first paint.
const storageKey = 'parley.theme';
const darkQuery = '(prefers-color-scheme: dark)';
const listeners = new Set<() => void>();

function readChoice(): ThemeChoice {
  try {
    const stored = localStorage.getItem(storageKey);
    return stored === 'light' || stored === 'dark' ? stored : 'system';
  } catch {
    return 'system';
  }
}

function apply(choice: ThemeChoice): void {
  const dark = choice === 'dark' || (choice === 'system' && window.matchMedia(darkQuery).matches);
  document.documentElement.classList.toggle('dark', dark);
}

let current: ThemeChoice = typeof window === 'undefined' ? 'system' : readChoice();

/** Applies the stored choice and follows system changes while the choice is 'system'. */
export function initTheme(): void {
  apply(current);
  window.matchMedia(darkQuery).addEventListener('change', () => {
    if (current === 'system') apply(current);
  });
}

export function setTheme(choice: ThemeChoice): void {
  current = choice;
  try {
    if (choice === 'system') localStorage.removeItem(storageKey);
    else localStorage.setItem(storageKey, choice);
  } catch {
    // Storage blocked: the choice lasts for this page only.
  }
  apply(choice);
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The current choice, re-rendering when it changes. */
export function useTheme(): ThemeChoice {
  return useSyncExternalStore(
    subscribe,
    () => current,
    () => 'system',
  );
}

function subscribeDark(listener: () => void): () => void {
  const observer = new MutationObserver(listener);
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['class'] });
  return () => observer.disconnect();
}

/** Whether the page is dark right now (the choice resolved against the system). */
export function useIsDark(): boolean {
  return useSyncExternalStore(
    subscribeDark,
    () => document.documentElement.classList.contains('dark'),
    () => false,
  );
}
