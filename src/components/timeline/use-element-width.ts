import { startTransition, useEffect, useRef, useState, type RefObject } from 'react';

/**
 * The element's width in whole px, from a ResizeObserver: its first report (after the browser's own
 * layout, so nothing is measured by force) is taken at once, later ones are debounced so a window
 * being dragged wider redraws a chart once it settles instead of on every frame. Until the first
 * report the width is 0, so a chart waits for its own task instead of adding to its parent's; the
 * width arrives as a transition, so React renders what depends on it in slices.
 */
export function useElementWidth<T extends HTMLElement>(debounceMs = 120): [RefObject<T | null>, number] {
  const ref = useRef<T>(null);
  const [widthPx, setWidthPx] = useState(0);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let first = true;
    const observer = new ResizeObserver((entries) => {
      const next = Math.floor(entries[entries.length - 1]?.contentRect.width ?? 0);
      clearTimeout(timer);
      if (first) {
        first = false;
        startTransition(() => setWidthPx(next));
        return;
      }
      timer = setTimeout(() => startTransition(() => setWidthPx((current) => (current === next ? current : next))), debounceMs);
    });
    observer.observe(element);
    return () => {
      clearTimeout(timer);
      observer.disconnect();
    };
  }, [debounceMs]);
  return [ref, widthPx];
}
