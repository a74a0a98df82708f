import { EVENT_COLOURS, PIN_COLOURS } from './chart-marks.ts';

export type TimelineLegendProps = {
  current?: boolean;
  sinkVbus?: boolean;
  bands?: boolean;
  timers?: boolean;
  /** The message lanes' marks (arrows, retries, bursts): off where no lanes are drawn (the report's chart). */
  messages?: boolean;
  /** Injected faults happen only in simulations: off for a captured trace. */
  faults?: boolean;
};

function Swatch({ children, label }: { children: React.ReactNode; label: string }) {
  return (
    <li className="flex items-center gap-1.5">
      {children}
      <span>{label}</span>
    </li>
  );
}

/**
 * What each colour and mark of the timeline means: the chart's lines and readings, events,
 * findings by severity, the message lanes, and (on the Bench) the timers, where a timer stopped in
 * time or expiring as it should is plain and only one that ran out unanswered is striped red.
 */
export function TimelineLegend({ current = true, sinkVbus = false, bands = false, timers = false, messages = true, faults = true }: TimelineLegendProps) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-[11px] text-slate-600 dark:text-slate-400" aria-label="Legend" data-testid="timeline-legend">
      <Swatch label="VBUS (V, held until the next reading)">
        <span className="relative h-0.5 w-5 bg-amber-600">
          <span className="absolute -top-[3px] left-0 size-2 rounded-full bg-amber-600" />
        </span>
      </Swatch>
      {sinkVbus && (
        <Swatch label="VBUS at the sink">
          <span className="w-5 border-t-2 border-dashed border-violet-600" />
        </Swatch>
      )}
      {current && (
        <Swatch label="IBUS (A)">
          <span className="h-0.5 w-5 bg-sky-600" />
        </Swatch>
      )}
      {bands && (
        <Swatch label="contract tolerance">
          <span className="h-2.5 w-5 bg-emerald-500/20" />
        </Swatch>
      )}
      <Swatch label="reset">
        <span className="h-3 w-0.5" style={{ background: EVENT_COLOURS.reset }} />
      </Swatch>
      <Swatch label="attach / detach">
        <span className="h-3 w-0.5" style={{ background: EVENT_COLOURS.attach }} />
      </Swatch>
      {faults && (
        <Swatch label="fault injected">
          <span className="h-3 w-0.5" style={{ background: EVENT_COLOURS.fault }} />
        </Swatch>
      )}
      <Swatch label="finding: error · warning · info">
        <span className="flex gap-0.5">
          {(['error', 'warning', 'info'] as const).map((tone) => (
            <span key={tone} className="h-3 w-0 border-l-2 border-dashed" style={{ borderColor: PIN_COLOURS[tone] }} />
          ))}
        </span>
      </Swatch>
      {messages && (
        <>
          <Swatch label="from source · from sink · GoodCRC · bad CRC">
            <span className="flex gap-0.5 font-mono text-[11px] leading-none">
              <span className="text-amber-600">↓</span>
              <span className="text-sky-600">↑</span>
              <span className="text-slate-400">↕</span>
              <span className="text-red-600">↓</span>
            </span>
          </Swatch>
          <Swatch label="retry (dashed) · no GoodCRC (hollow head) · burst (count)">
            <span className="rounded-full bg-slate-700 px-1 font-mono text-[9px] leading-3 text-white dark:bg-slate-300 dark:text-slate-900">3</span>
          </Swatch>
        </>
      )}
      {timers && (
        <>
          <Swatch label="timer stopped in time">
            <span className="h-3 w-5 rounded-[3px] bg-violet-100 ring-1 ring-violet-300 ring-inset dark:bg-violet-500/15" />
          </Swatch>
          <Swatch label="timer expired as planned (dotted end)">
            <span className="h-3 w-5 rounded-[3px] border-r-2 border-dotted border-violet-500 bg-violet-100 ring-1 ring-violet-300 ring-inset dark:bg-violet-500/15" />
          </Swatch>
          <Swatch label="timer ran out waiting for an answer">
            <span className="h-3 w-5 rounded-[3px] bg-[repeating-linear-gradient(135deg,var(--color-red-100),var(--color-red-100)_4px,var(--color-red-200)_4px,var(--color-red-200)_8px)] ring-1 ring-red-400 ring-inset" />
          </Swatch>
        </>
      )}
    </ul>
  );
}
