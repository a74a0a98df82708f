// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import type { Contract } from '../../../../shared/core/contract.ts';
import type { Finding } from '../../../../shared/core/finding.ts';
import { Badge, SeverityBadge } from '../../../components/badge.tsx';
import { Mono } from '../../../components/mono.tsx';
import { RuleLink } from '../../../components/rule-link.tsx';
import { ruleTitle } from '../../../../shared/rules/catalog.ts';
import { formatTimeUs } from '../../../components/timeline/time-window.ts';

const volts = (mv: number) => `${(mv / 1_000).toFixed(mv % 1_000 === 0 ? 0 : 2)} V`;
const amps = (ma: number) => `${(ma / 1_000).toFixed(2)} A`;
const watts = (mw: number) => `${(mw / 1_000).toFixed(1)} W`;

export function describeContract(contract: Contract): string {
  return `${contract.kind} ${volts(contract.voltageMv)} at ${amps(contract.currentMa)} (${watts(contract.powerMw)}), object ${contract.objectPosition}`;
}

/** The contract in force at the end, and every contract reached on the way. */
export function ContractSummary({ contract, contracts, endUs }: { contract: Contract | null; contracts: (Contract & { t: number })[]; endUs: number }) {
  return (
    <div className="flex flex-col gap-3" data-testid="contract-summary">
      {contract ? (
        <div className="flex flex-wrap items-baseline gap-x-6 gap-y-2">
          <Stat label="Contract" value={`${volts(contract.voltageMv)} · ${amps(contract.currentMa)}`} />
          <Stat label="Power" value={watts(contract.powerMw)} />
          <Stat label="Kind" value={`${contract.kind}, object ${contract.objectPosition}`} />
          {contracts[0] && <Stat label="First contract at" value={formatTimeUs(contracts[0].t)} />}
        </div>
      ) : (
        <p className="text-sm text-slate-700 dark:text-slate-200">
          <Badge tone="warning" dot>
            no contract
          </Badge>{' '}
          No explicit contract was in place at the end of the run ({formatTimeUs(endUs)}).
        </p>
      )}
      {contracts.length > 1 && (
        <details className="text-xs text-slate-600 dark:text-slate-400">
          <summary className="cursor-pointer">{contracts.length} contracts during the run</summary>
          <ol className="mt-1 flex flex-col gap-0.5 font-mono">
            {contracts.slice(0, 200).map((item, index) => (
              <li key={`${item.t}-${index}`}>
                {formatTimeUs(item.t)} — {describeContract(item)}
              </li>
            ))}
          </ol>
        </details>
      )}
    </div>
  );
}

function Stat({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <p className="text-[11px] font-medium tracking-wide text-slate-500 uppercase dark:text-slate-400">{label}</p>
      <p className="font-mono text-lg font-semibold text-slate-900 tabular dark:text-slate-50">{value}</p>
    </div>
  );
}

/** The findings of the analyser over the simulated trace; rule ids link to their explanation. */
export function FindingsTable({ findings, onSelectTime }: { findings: readonly Finding[]; onSelectTime?(tUs: number): void }) {
  if (findings.length === 0) return <p className="text-sm text-slate-600 dark:text-slate-400">No findings: the analyser saw nothing to report.</p>;
  return (
    <table className="w-full text-left text-sm" aria-label="Findings">
      <thead className="text-[11px] text-slate-500 uppercase dark:text-slate-400">
        <tr>
          <th className="py-1.5 pr-3 font-medium">Severity</th>
          <th className="py-1.5 pr-3 font-medium">Rule</th>
          <th className="py-1.5 pr-3 font-medium">Time</th>
          <th className="py-1.5 font-medium">What happened</th>
        </tr>
      </thead>
      <tbody>
        {findings.slice(0, 500).map((finding, index) => (
          <tr key={`${finding.rule}-${finding.t ?? ''}-${index}`} className="border-t border-slate-100 align-top dark:border-slate-800">
            <td className="py-1.5 pr-3">
              <SeverityBadge severity={finding.severity} />
            </td>
            <td className="py-1.5 pr-3">
              <RuleLink rule={finding.rule} />
            </td>
            <td className="py-1.5 pr-3 whitespace-nowrap">
              {finding.t === undefined ? (
                '—'
              ) : onSelectTime ? (
                <button type="button" className="font-mono text-xs text-sky-700 underline-offset-2 hover:underline dark:text-sky-300" onClick={() => onSelectTime(finding.t!)}>
                  {formatTimeUs(finding.t)}
                </button>
              ) : (
                <Mono>{formatTimeUs(finding.t)}</Mono>
              )}
            </td>
            <td className="py-1.5 text-slate-700 dark:text-slate-300">
              <span className="font-medium text-slate-900 dark:text-slate-100">{ruleTitle(finding.rule)}.</span> {finding.message}
              {finding.object !== undefined && <span className="text-slate-500"> (object {finding.object})</span>}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
