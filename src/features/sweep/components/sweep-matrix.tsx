import { OUTCOME_CLASSES, OUTCOME_LABELS } from '../../../../shared/sweep/outcome.ts';
import type { SweepRun } from '../../../../shared/sweep/run-placement.ts';
import { cn } from '../../../lib/cn.ts';
import { brokenRing, outcomeColour } from '../lib/outcome-style.ts';

export type MatrixMessage = { index: number; t: number; from: string; messageType: string; nth: number };

export function OutcomeLegend() {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-slate-600 dark:text-slate-300" aria-label="Legend" data-testid="sweep-legend">
      {OUTCOME_CLASSES.map((outcome) => (
        <li key={outcome} className="flex items-center gap-1.5">
          <span className={cn('inline-block h-3 w-3 rounded-sm', outcomeColour[outcome])} aria-hidden />
          {OUTCOME_LABELS[outcome]}
        </li>
      ))}
      <li className="flex items-center gap-1.5">
        <span className={cn('inline-block h-3 w-3 rounded-sm bg-slate-200 dark:bg-slate-700', brokenRing)} aria-hidden />
        Breaks an invariant
      </li>
    </ul>
  );
}

/** Messages of the fault-free run (rows) × fault columns; a cell opens its run. */
export function SweepMatrix({ messages, columns, runs, onOpen }: { messages: MatrixMessage[]; columns: string[]; runs: SweepRun[]; onOpen(run: SweepRun): void }) {
  const byCell = new Map<string, SweepRun>();
  for (const run of runs) if (run.cell) byCell.set(`${run.cell.messageIndex}|${run.cell.column}`, run);
  return (
    <div className="overflow-x-auto">
      <table className="text-xs" data-testid="sweep-matrix">
        <thead>
          <tr>
            <th className="px-2 py-1 text-left font-medium text-slate-500">#</th>
            <th className="px-2 py-1 text-left font-medium text-slate-500">Message (fault-free run)</th>
            {columns.map((column) => (
              <th key={column} className="px-2 py-1 text-center font-medium text-slate-500">
                {column}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {messages.map((message) => (
            <tr key={message.index} className="border-t border-slate-100 dark:border-slate-800">
              <td className="px-2 py-1 font-mono text-slate-500 tabular">{message.index}</td>
              <td className="px-2 py-1 whitespace-nowrap">
                <span className="font-mono">{message.messageType}</span>
                <span className="text-slate-500">
                  {' '}
                  {message.from === 'source' ? 'SRC→SNK' : 'SNK→SRC'} · {(message.t / 1_000).toFixed(1)} ms
                </span>
              </td>
              {columns.map((column) => {
                const run = byCell.get(`${message.index}|${column}`);
                if (!run)
                  return (
                    <td key={column} className="px-2 py-1 text-center text-slate-400" title="This fault cannot hit this message">
                      ·
                    </td>
                  );
                const broken = run.broken.length > 0;
                const label = `${message.messageType} #${message.index}, ${column}: ${OUTCOME_LABELS[run.outcome]}${broken ? `; breaks ${run.broken[0]!.invariant}` : ''}. Open on the Bench`;
                return (
                  <td key={column} className="px-2 py-1 text-center">
                    <button
                      type="button"
                      aria-label={label}
                      title={label}
                      data-run={run.placement}
                      onClick={() => onOpen(run)}
                      className={cn('h-5 w-8 rounded-sm hover:opacity-80 focus-visible:outline-2 focus-visible:outline-amber-500', outcomeColour[run.outcome], broken && brokenRing)}
                    />
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
