import type { ReactNode } from 'react';
import { Button } from '../button.tsx';
import { formatTimeUs, type TimeWindow } from './time-window.ts';
import { zoomWindow } from './trace-series.ts';

export type TimelineToolbarProps = {
  window: TimeWindow;
  endUs: number;
  onWindowChange(window: TimeWindow): void;
  foldGoodCrc: boolean;
  onFoldGoodCrcChange(fold: boolean): void;
  /** What the whole time axis is called: a stored trace or a Bench run. */
  subject: 'trace' | 'run';
  /** Extra buttons before the zoom buttons (the Bench's "First contract"). */
  children?: ReactNode;
};

/** The window shown, the GoodCRC fold and the zoom buttons above every timeline. */
export function TimelineToolbar({ window, endUs, onWindowChange, foldGoodCrc, onFoldGoodCrcChange, subject, children }: TimelineToolbarProps) {
  const whole = window.startUs <= 0 && window.endUs >= endUs;
  return (
    <div className="flex flex-wrap items-center justify-between gap-2">
      <p className="font-mono text-xs text-slate-500 tabular dark:text-slate-400" aria-live="polite" data-testid="timeline-window">
        {formatTimeUs(window.startUs)} – {formatTimeUs(window.endUs)}
        {whole ? ` (whole ${subject})` : ''}
      </p>
      <div className="flex flex-wrap items-center gap-2">
        <label className="mr-2 flex items-center gap-1.5 text-xs text-slate-600 dark:text-slate-300">
          <input type="checkbox" checked={foldGoodCrc} onChange={(event) => onFoldGoodCrcChange(event.target.checked)} className="accent-amber-500" />
          Fold GoodCRC away
        </label>
        {children}
        <Button size="sm" variant="secondary" onClick={() => onWindowChange(zoomWindow(window, 0.5, endUs))} aria-label="Zoom in">
          Zoom in
        </Button>
        <Button size="sm" variant="secondary" onClick={() => onWindowChange(zoomWindow(window, 2, endUs))} disabled={whole} aria-label="Zoom out">
          Zoom out
        </Button>
        <Button size="sm" variant="ghost" onClick={() => onWindowChange({ startUs: 0, endUs })} disabled={whole}>
          {subject === 'trace' ? 'Whole trace' : 'Whole run'}
        </Button>
      </div>
    </div>
  );
}
