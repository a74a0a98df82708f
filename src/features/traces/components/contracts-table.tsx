import type { Analysis } from '../../../../shared/api/index.ts';
import { contractLabel, formatPower, formatSeconds } from '../lib/format.ts';

/** Each contract change at its PS_RDY, in order: what the sink got and for how long. */
export function ContractsTable({ contracts, endUs }: { contracts: Analysis['contracts']; endUs: number }) {
  if (contracts.length === 0) return <p className="text-sm text-slate-600 dark:text-slate-400">No contract was reached: the source and sink never finished a negotiation.</p>;
  return (
    <table className="w-full text-left text-sm" aria-label="Contracts over time">
      <thead className="text-[11px] tracking-wide text-slate-500 uppercase">
        <tr className="border-b border-slate-200 dark:border-slate-800">
          <th className="py-1.5 pr-3 font-semibold">In force</th>
          <th className="py-1.5 pr-3 font-semibold">Contract</th>
          <th className="py-1.5 text-right font-semibold">Power</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-slate-100 dark:divide-slate-800">
        {contracts.map((c, index) => (
          <tr key={`${c.t}-${index}`} className="align-top">
            <td className="py-2 pr-3 font-mono text-xs whitespace-nowrap tabular">
              {formatSeconds(c.t)}
              <span className="block text-slate-500">to {formatSeconds(contracts[index + 1]?.t ?? endUs)}</span>
            </td>
            <td className="py-2 pr-3">
              <span className="font-medium whitespace-nowrap text-slate-900 dark:text-slate-100">{contractLabel(c)}</span>
              <span className="block text-xs text-slate-500">
                {c.kind}, object {c.objectPosition}
              </span>
            </td>
            <td className="py-2 text-right font-mono text-xs whitespace-nowrap tabular">{formatPower(c.powerMw)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
