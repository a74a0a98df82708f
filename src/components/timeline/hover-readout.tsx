import { useState, type PointerEvent } from 'react';
import { formatExactMs } from './chart-ticks.ts';
import { heldValueAt, type PlotArea } from './step-path.ts';
import type { StepPoint } from './trace-series.ts';

export type ReadoutSeries = { name: string; unit: 'V' | 'A'; colour: string; points: readonly StepPoint[]; yOf(value: number): number };

export type HoverReadoutProps = {
  plot: PlotArea;
  /** The plot's time domain (ms). */
  startMs: number;
  endMs: number;
  series: readonly ReadoutSeries[];
  dark: boolean;
};

/** The read-out box is this wide (px): it flips to the cursor's left where it would run past the plot. */
const BOX_WIDTH_PX = 168;

/**
 * What the lines hold under the pointer: a cursor across the plot, a dot on each line and a box
 * with the time and each value held there. An HTML layer over the plot, so it never reaches an
 * exported picture, and its own state, so moving the pointer redraws only this layer.
 */
export function HoverReadout({ plot, startMs, endMs, series, dark }: HoverReadoutProps) {
  const [xPx, setXPx] = useState<number | null>(null);
  const move = (event: PointerEvent<HTMLDivElement>) => {
    const box = event.currentTarget.getBoundingClientRect();
    setXPx(Math.min(Math.max(0, event.clientX - box.left), plot.width));
  };
  const tMs = xPx === null ? null : startMs + (xPx / Math.max(1, plot.width)) * (endMs - startMs);
  const values = tMs === null ? [] : series.map((line) => ({ line, value: heldValueAt(line.points, tMs) }));
  const flip = xPx !== null && xPx + 12 + BOX_WIDTH_PX > plot.width;
  return (
    <div className="absolute" style={{ left: plot.x, top: plot.y, width: plot.width, height: plot.height }} onPointerMove={move} onPointerLeave={() => setXPx(null)} data-testid="chart-readout-layer">
      {xPx !== null && tMs !== null && (
        <>
          <div aria-hidden="true" className="pointer-events-none absolute inset-y-0 w-px bg-slate-400/70" style={{ left: xPx }} />
          {values.map(({ line, value }) =>
            value === null ? null : (
              <div
                key={line.name}
                aria-hidden="true"
                className="pointer-events-none absolute size-1.5 -translate-x-1/2 -translate-y-1/2 rounded-full"
                style={{ left: xPx, top: line.yOf(value) - plot.y, background: line.colour }}
              />
            ),
          )}
          <div
            role="status"
            className={
              dark
                ? 'pointer-events-none absolute top-1 rounded border border-slate-700 bg-slate-900/95 px-2 py-1 text-xs text-slate-200 shadow'
                : 'pointer-events-none absolute top-1 rounded border border-slate-200 bg-white/95 px-2 py-1 text-xs text-slate-800 shadow'
            }
            style={{ width: BOX_WIDTH_PX, left: flip ? xPx - 12 - BOX_WIDTH_PX : xPx + 12 }}
            data-testid="chart-readout"
          >
            <p className="font-mono tabular">{formatExactMs(tMs)}</p>
            {values.map(({ line, value }) => (
              <p key={line.name} className="flex justify-between gap-2">
                <span style={{ color: line.colour }}>{line.name}</span>
                <span className="font-mono tabular">{value === null ? 'no reading' : `${value.toFixed(3)} ${line.unit}`}</span>
              </p>
            ))}
          </div>
        </>
      )}
    </div>
  );
}
