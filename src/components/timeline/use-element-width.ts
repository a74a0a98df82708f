import { startTransition, useEffect, useRef, useState, type RefObject } from 'react';

/**
 * The element's width in whole px, from a ResizeObserver (its reports come after the browser's
 * own layout, so nothing is measured by force). A change after a quiet spell (the first report, a
 * panel opening) is taken at once; changes that keep coming (a window being dragged wider) are
 * debounced, so a chart redraws once they settle instead of on every frame. Until the first report
 * the width is 0, so a chart draws in its own task rather than in its parent's; the width arrives
 * as a transition, so React renders what depends on it in slices. `firstAtOnce`: the first width
 * is an ordinary update instead, for a part that should be drawn before the page's other updates
 * (a transition yields to each of them and starts over).
 */
export function useElementWidth<T extends HTMLElement>(debounceMs = 120, { firstAtOnce = false } = {}): [RefObject<T | null>, number] {
  const ref = useRef<T>(null);
  const [widthPx, setWidthPx] = useState(0);
  useEffect(() => {
    const element = ref.current;
    if (!element) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let lastReportMs = -Infinity;
    let first = firstAtOnce;
    const apply = (next: number) => {
      const update = () => setWidthPx((current) => (current === next ? current : next));
      if (first && next > 0) {
        first = false;
        update();
      } else startTransition(update);
    };
    let measured = false;
    const observer = new ResizeObserver((entries) => {
      const next = Math.floor(entries[entries.length - 1]?.contentRect.width ?? 0);
      // Once measured, a moment at no width (taken out of the layout, a full-page capture) keeps
      // the drawing: clearing it would leave the chart and lanes blank until the next report.
      if (next === 0 && measured) return;
      measured ||= next > 0;
      const nowMs = performance.now();
      const quiet = nowMs - lastReportMs > debounceMs;
      lastReportMs = nowMs;
      clearTimeout(timer);
      if (quiet) apply(next);
      else timer = setTimeout(() => apply(next), debounceMs);
    });
    observer.observe(element);
    return () => {
      clearTimeout(timer);
      observer.disconnect();
    };
  }, [debounceMs, firstAtOnce]);
  return [ref, widthPx];
}
