import type { Analysis } from '../api/types.ts';
import { contractLabel, formatPower, formatSeconds } from '../lib/format.ts';

/** Each contract change at its PS_RDY, in order: what the sink got and when. */
export function ContractsTable({ contracts, endUs }: { contracts: Analysis['contracts']; endUs: number }) {
  if (contracts.length === 0) return <p className="text-sm text-slate-600 dark:text-slate-400">No contract was reached: the source and sink never finished a negotiation.</p>;
  return (
    <table className="w-full text-left text-sm" aria-label="Contracts over time">
      <thead className="text-[11px] tracking-wide text-slate-500 uppercase">
        <tr className="border-b border-slate-200 dark:border-slate-800">
          <th className="py-1.5 pr-3 font-semibold">From</th>
          <th className="py-1.5 pr-3 font-semibold">Until</th>
          <th className="py-1.5 pr-3 font-semibold">Contract</th>
          <th className="py-1.5 pr-3 font-semibold">Kind</th>
          <th className="py-1.5 pr-3 font-semibold">Object</th>
          <th className="py-1.5 text-right font-semibold">Power</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-slate-100 font-mono text-xs tabular dark:divide-slate-800">
        {contracts.map((c, index) => (
          <tr key={`${c.t}-${index}`}>
            <td className="py-1.5 pr-3">{formatSeconds(c.t)}</td>
            <td className="py-1.5 pr-3 text-slate-500">{formatSeconds(contracts[index + 1]?.t ?? endUs)}</td>
            <td className="py-1.5 pr-3 font-sans text-sm font-medium text-slate-900 dark:text-slate-100">{contractLabel(c)}</td>
            <td className="py-1.5 pr-3">{c.kind}</td>
            <td className="py-1.5 pr-3">{c.objectPosition}</td>
            <td className="py-1.5 text-right">{formatPower(c.powerMw)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
