import { startTransition, useEffect, useState } from 'react';

/**
 * Reveals a heavy view in `steps` parts, one per task: a part's render, style and layout stay
 * well under the 50 ms a long task starts at, where all parts at once would not. Starts over when
 * `key` changes (a new run).
 */
export function useStagedReveal(key: unknown, steps: number): number {
  const [state, setState] = useState({ key, shown: 1 });
  const shown = state.key === key ? state.shown : 1;
  if (state.key !== key) setState({ key, shown: 1 });
  useEffect(() => {
    if (shown >= steps) return;
    // After this paint, in a fresh task: the browser gets to breathe between the parts.
    // As a transition, so React may also slice the part's own render.
    const timer = setTimeout(() => startTransition(() => setState((current) => (current.key === key ? { key, shown: current.shown + 1 } : current))), 0);
    return () => clearTimeout(timer);
  }, [key, shown, steps]);
  return shown;
}
