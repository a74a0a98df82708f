import { useLayoutEffect, useRef, useState, type RefObject } from 'react';

/**
 * The element's width in whole px: read once before the first paint, then kept up to date by a
 * ResizeObserver whose reports are debounced, so a window being dragged wider redraws a chart once
 * it settles instead of on every frame (a fixed width also spares recharts its own measuring).
 */
export function useElementWidth<T extends HTMLElement>(debounceMs = 120): [RefObject<T | null>, number] {
  const ref = useRef<T>(null);
  const [widthPx, setWidthPx] = useState(0);
  useLayoutEffect(() => {
    const element = ref.current;
    if (!element) return;
    setWidthPx(Math.floor(element.clientWidth));
    let timer: ReturnType<typeof setTimeout> | undefined;
    const observer = new ResizeObserver((entries) => {
      const next = Math.floor(entries[entries.length - 1]?.contentRect.width ?? element.clientWidth);
      clearTimeout(timer);
      timer = setTimeout(() => setWidthPx((current) => (current === next ? current : next)), debounceMs);
    });
    observer.observe(element);
    return () => {
      clearTimeout(timer);
      observer.disconnect();
    };
  }, [debounceMs]);
  return [ref, widthPx];
}
