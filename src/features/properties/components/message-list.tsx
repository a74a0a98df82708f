// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { Mono } from '../../../components/mono.tsx';
import { formatTimeUs } from '../../../components/timeline/time-window.ts';
import type { CounterexampleMessage } from '../../../../workers/property.worker.ts';

/** The counterexample's messages in order: time, sender, type and the wire-order hex. */
export function MessageList({ messages }: { messages: readonly CounterexampleMessage[] }) {
  if (messages.length === 0) return <p className="text-sm text-slate-500">No message was sent.</p>;
  return (
    <div className="max-h-72 overflow-auto rounded-md border border-slate-200 dark:border-slate-800">
      <table className="w-full text-left text-xs" aria-label="Counterexample messages">
        <thead className="sticky top-0 bg-slate-50 text-slate-500 dark:bg-slate-950 dark:text-slate-400">
          <tr>
            <th className="px-3 py-1.5 font-medium">#</th>
            <th className="px-3 py-1.5 text-right font-medium">Time</th>
            <th className="px-3 py-1.5 font-medium">From</th>
            <th className="px-3 py-1.5 font-medium">Message</th>
            <th className="px-3 py-1.5 font-medium">Hex</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-slate-100 dark:divide-slate-800">
          {messages.map((m, i) => (
            <tr key={`${m.t}-${i}`} className={m.messageType === 'GoodCRC' ? 'text-slate-500 dark:text-slate-400' : 'text-slate-800 dark:text-slate-100'}>
              <td className="px-3 py-1 font-mono tabular">{i + 1}</td>
              <td className="px-3 py-1 text-right font-mono tabular whitespace-nowrap">{formatTimeUs(m.t)}</td>
              <td className="px-3 py-1">{m.from}</td>
              <td className="px-3 py-1 font-medium">
                {m.messageType}
                {!m.crcOk && <span className="ml-1 text-red-600 dark:text-red-400">(bad CRC)</span>}
              </td>
              <td className="px-3 py-1">
                <Mono>{m.hex}</Mono>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
