import { memo, startTransition, useEffect, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { cn } from '../../lib/cn.ts';
import { formatTimeUs, positionIn, type TimeWindow } from './time-window.ts';
import type { SeriesPoint } from './trace-series.ts';
import { windowAround } from './trace-series.ts';

export type OverviewBrushProps = {
  /** The whole trace's VBUS (ms, V), already thinned. */
  points: readonly SeriesPoint[];
  endUs: number;
  window: TimeWindow;
  onWindowChange(window: TimeWindow): void;
  insetLeftPx: number;
  insetRightPx: number;
  dark: boolean;
};

type DragKind = 'start' | 'end' | 'range';
type Drag = { kind: DragKind; pointerId: number; originX: number; trackWidthPx: number; from: TimeWindow };

const VIEW_WIDTH = 1_000;
const VIEW_HEIGHT = 40;

/** The narrowest window the handles allow: 1/2000 of the trace, at least 10 µs. */
const minSpanUs = (endUs: number) => Math.max(10, Math.round(endUs / 2_000));

function moved(drag: Drag, deltaUs: number, endUs: number): TimeWindow {
  const { startUs, endUs: stopUs } = drag.from;
  const least = minSpanUs(endUs);
  if (drag.kind === 'start') return { startUs: Math.round(Math.min(Math.max(0, startUs + deltaUs), stopUs - least)), endUs: stopUs };
  if (drag.kind === 'end') return { startUs, endUs: Math.round(Math.max(Math.min(endUs, stopUs + deltaUs), startUs + least)) };
  const shift = Math.min(Math.max(deltaUs, -startUs), endUs - stopUs);
  return { startUs: Math.round(startUs + shift), endUs: Math.round(stopUs + shift) };
}

/**
 * The whole trace as a thin line with the visible window as a selection on it: drag a handle to
 * move that edge, drag the selection to pan, click elsewhere to centre the window there; the
 * handles are sliders for the keyboard. Plain SVG and CSS percentages, so drawing it needs no
 * measuring; while dragging, the window is handed up at most once a frame, as a transition.
 */
export const OverviewBrush = memo(function OverviewBrush({ points, endUs, window, onWindowChange, insetLeftPx, insetRightPx, dark }: OverviewBrushProps) {
  const track = useRef<HTMLDivElement>(null);
  const drag = useRef<Drag | null>(null);
  const frame = useRef<number | null>(null);
  const pending = useRef<TimeWindow | null>(null);
  const [preview, setPreview] = useState<TimeWindow | null>(null);
  useEffect(
    () => () => {
      if (frame.current !== null) cancelAnimationFrame(frame.current);
    },
    [],
  );

  const path = useMemo(() => {
    const endMs = Math.max(1e-3, endUs / 1_000);
    let maxV = 0;
    for (const p of points) if (p.value > maxV) maxV = p.value;
    const scaleY = (VIEW_HEIGHT - 6) / Math.max(1, maxV);
    return points.map((p, index) => `${index === 0 ? 'M' : 'L'}${((p.tMs / endMs) * VIEW_WIDTH).toFixed(1)} ${(VIEW_HEIGHT - 3 - p.value * scaleY).toFixed(1)}`).join('');
  }, [points, endUs]);

  const commit = (next: TimeWindow, now = false) => {
    pending.current = next;
    if (now) {
      if (frame.current !== null) cancelAnimationFrame(frame.current);
      frame.current = null;
      startTransition(() => onWindowChange(next));
      return;
    }
    if (frame.current !== null) return;
    frame.current = requestAnimationFrame(() => {
      frame.current = null;
      const latest = pending.current;
      if (latest) startTransition(() => onWindowChange(latest));
    });
  };

  const begin = (kind: DragKind) => (event: PointerEvent<HTMLElement>) => {
    if (event.button !== 0 || !track.current) return;
    event.stopPropagation();
    event.preventDefault();
    event.currentTarget.setPointerCapture(event.pointerId);
    drag.current = { kind, pointerId: event.pointerId, originX: event.clientX, trackWidthPx: Math.max(1, track.current.clientWidth), from: window };
  };
  const move = (event: PointerEvent<HTMLElement>) => {
    const current = drag.current;
    if (!current || current.pointerId !== event.pointerId) return;
    const next = moved(current, ((event.clientX - current.originX) / current.trackWidthPx) * endUs, endUs);
    setPreview(next);
    commit(next);
  };
  const end = (event: PointerEvent<HTMLElement>) => {
    const current = drag.current;
    if (!current || current.pointerId !== event.pointerId) return;
    drag.current = null;
    const next = moved(current, ((event.clientX - current.originX) / current.trackWidthPx) * endUs, endUs);
    setPreview(null);
    if (next.startUs !== window.startUs || next.endUs !== window.endUs) commit(next, true);
  };
  const centreAt = (event: PointerEvent<HTMLDivElement>) => {
    if (event.button !== 0 || !track.current) return;
    const box = track.current.getBoundingClientRect();
    const tUs = ((event.clientX - box.left) / Math.max(1, box.width)) * endUs;
    commit(windowAround(tUs, window.endUs - window.startUs, endUs), true);
  };
  const nudge = (edge: 'start' | 'end') => (event: KeyboardEvent<HTMLDivElement>) => {
    const stepUs = Math.max(1, endUs / 100) * (event.key === 'PageUp' || event.key === 'PageDown' ? 10 : 1);
    const deltas: Record<string, number> = { ArrowLeft: -stepUs, ArrowDown: -stepUs, PageDown: -stepUs, ArrowRight: stepUs, ArrowUp: stepUs, PageUp: stepUs, Home: -endUs, End: endUs };
    const delta = deltas[event.key];
    if (delta === undefined) return;
    event.preventDefault();
    commit(moved({ kind: edge, pointerId: -1, originX: 0, trackWidthPx: 1, from: window }, delta, endUs), true);
  };

  const shown = preview ?? window;
  const left = positionIn({ startUs: 0, endUs }, shown.startUs) * 100;
  const right = positionIn({ startUs: 0, endUs }, shown.endUs) * 100;
  const handle = 'absolute inset-y-0 z-10 -ml-1 w-2 cursor-ew-resize touch-none rounded-sm bg-amber-500 focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-amber-600';

  return (
    <div className="w-full" style={{ paddingLeft: insetLeftPx, paddingRight: insetRightPx }} data-testid="vbus-overview">
      <div
        ref={track}
        className="relative h-10 touch-none overflow-visible rounded-sm border border-slate-200 bg-slate-50 select-none dark:border-slate-800 dark:bg-slate-950"
        onPointerDown={centreAt}
        role="group"
        aria-label="Whole trace: drag the handles to choose the visible window"
      >
        <svg viewBox={`0 0 ${VIEW_WIDTH} ${VIEW_HEIGHT}`} preserveAspectRatio="none" className="absolute inset-0 h-full w-full" aria-hidden="true">
          <path d={path} fill="none" stroke={dark ? '#94a3b8' : '#475569'} strokeWidth={1} vectorEffect="non-scaling-stroke" />
        </svg>
        <div aria-hidden="true" className="absolute inset-y-0 left-0 bg-slate-500/15 dark:bg-slate-950/40" style={{ width: `${left.toFixed(3)}%` }} />
        <div aria-hidden="true" className="absolute inset-y-0 right-0 bg-slate-500/15 dark:bg-slate-950/40" style={{ width: `${(100 - right).toFixed(3)}%` }} />
        <div
          className={cn('absolute inset-y-0 cursor-grab touch-none border-y-2 border-amber-500/70 active:cursor-grabbing', dark ? 'bg-amber-400/10' : 'bg-amber-300/15')}
          style={{ left: `${left.toFixed(3)}%`, width: `${Math.max(0, right - left).toFixed(3)}%` }}
          onPointerDown={begin('range')}
          onPointerMove={move}
          onPointerUp={end}
          onPointerCancel={end}
          data-testid="vbus-overview-selection"
        />
        {(['start', 'end'] as const).map((edge) => (
          <div
            key={edge}
            role="slider"
            tabIndex={0}
            aria-label={edge === 'start' ? 'Start of the visible window' : 'End of the visible window'}
            aria-valuemin={0}
            aria-valuemax={endUs}
            aria-valuenow={edge === 'start' ? shown.startUs : shown.endUs}
            aria-valuetext={formatTimeUs(edge === 'start' ? shown.startUs : shown.endUs)}
            className={handle}
            style={{ left: `${(edge === 'start' ? left : right).toFixed(3)}%` }}
            onPointerDown={begin(edge)}
            onPointerMove={move}
            onPointerUp={end}
            onPointerCancel={end}
            onKeyDown={nudge(edge)}
          />
        ))}
      </div>
    </div>
  );
});
