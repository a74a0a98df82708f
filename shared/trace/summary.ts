/**
 * The sentence that heads an analysis, built from one reading of the trace so its parts never
 * disagree: what came of the negotiation (a contract; or how far it got), the Hard Resets, the
 * tally, and the most likely cause with the side it points at (adapter, device or cable), e.g.
 * "Contract PPS 9 V 2 A at 0.338 s; Hard Reset at 21.1 s; 2 errors; likely cause of the Hard Reset:
 * the sink stopped re-requesting its programmable contract, which points at the device (sink)."
 */
import type { Contract } from '../core/contract.ts';
import type { Severity } from '../core/finding.ts';
import { sideText, type Side } from './blame.ts';
import { contractText, seconds } from './format.ts';

export interface SummaryInput {
  records: number;
  messages: number;
  measurements: number;
  contracts: (Contract & { t: number })[];
  contractCount: number;
  sourceCapabilities: number;
  /** Requests (and EPR_Requests) the source received, and how many it accepted. */
  requests: number;
  requestsAccepted: number;
  hardResets: { t: number; cause?: string }[];
  hardResetCount: number;
  counts: Record<Severity, number>;
  goodCrcSeen: boolean;
  /** Side of the first Hard Reset's cause, when one was found. */
  hardResetSide?: Side;
  /** The earliest error (else warning), named when no Hard Reset cause explains the trace. */
  firstProblem?: { title: string; t?: number; side?: Side };
}

const lowerFirst = (text: string): string => (/^[A-Z][a-z]/.test(text) ? text[0]!.toLowerCase() + text.slice(1) : text);

const plural = (n: number, one: string, many = `${one}s`): string => `${n} ${n === 1 ? one : many}`;

const pointsAt = (side: Side | undefined): string => (side ? `, which points at ${sideText[side]}` : '');

function outcome(s: SummaryInput): string {
  const first = s.contracts[0];
  const last = s.contracts[s.contracts.length - 1];
  if (first && last) {
    const head = `Contract ${contractText(first)} at ${seconds(first.t)}`;
    return s.contractCount > 1 ? `${head}; ${plural(s.contractCount, 'contract')} in all, the last ${contractText(last)} at ${seconds(last.t)}` : head;
  }
  if (s.messages === 0) return s.measurements > 0 ? `No USB PD messages, ${plural(s.measurements, 'VBUS measurement')}` : `No USB PD messages in ${plural(s.records, 'record')}`;
  if (s.requestsAccepted > 0) return `No contract: the source accepted ${s.requestsAccepted === 1 ? 'a Request' : plural(s.requestsAccepted, 'Request')} but never completed it with PS_RDY`;
  if (s.requests > 0) return `No contract: the sink sent ${plural(s.requests, 'Request')} and none was accepted`;
  if (s.sourceCapabilities > 0) return `No contract: the source offered Source_Capabilities ${plural(s.sourceCapabilities, 'time')} and the sink never sent a Request`;
  return `No contract in ${plural(s.messages, 'message')}`;
}

export function summarize(s: SummaryInput): string {
  const reset = s.hardResets[0];
  const first = s.contracts[0];
  // Told in the order it happened: a reset before the first contract comes first.
  const resetFirst = reset !== undefined && first !== undefined && reset.t < first.t;
  const parts: string[] = [
    resetFirst ? `Hard Reset at ${seconds(reset.t)}${s.hardResetCount > 1 ? ` (${plural(s.hardResetCount, 'Hard Reset')} in all)` : ''}, then ${lowerFirst(outcome(s))}` : outcome(s),
  ];
  if (reset && !resetFirst) parts.push(s.hardResetCount > 1 ? `Hard Reset at ${seconds(reset.t)} (${plural(s.hardResetCount, 'Hard Reset')} in all)` : `Hard Reset at ${seconds(reset.t)}`);
  const { error, warning } = s.counts;
  parts.push(error + warning === 0 ? 'no errors or warnings' : [error > 0 ? plural(error, 'error') : '', warning > 0 ? plural(warning, 'warning') : ''].filter(Boolean).join(' and '));
  if (reset?.cause !== undefined) parts.push(`likely cause of the Hard Reset: ${reset.cause}${pointsAt(s.hardResetSide)}`);
  else if (s.firstProblem) {
    const p = s.firstProblem;
    parts.push(`likely cause: ${lowerFirst(p.title)}${p.t !== undefined ? ` at ${seconds(p.t)}` : ''}${pointsAt(p.side)}`);
  } else if (reset) parts.push('no cause of the Hard Reset was found before it');
  if (s.messages > 0 && !s.goodCrcSeen) parts.push('the trace holds no GoodCRC, so acknowledgements were not checked');
  return `${parts.join('; ')}.`;
}
