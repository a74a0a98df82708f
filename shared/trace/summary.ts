/**
 * The sentence that heads an analysis, e.g. "Contract 9 V 2 A at 0.24 s; Hard Reset at 13.5 s after
 * the sink stopped re-requesting its programmable contract; 1 error."
 */
import type { Contract } from '../core/contract.ts';
import type { Severity } from '../core/finding.ts';
import { contractText, seconds } from './format.ts';

export interface SummaryInput {
  records: number;
  messages: number;
  measurements: number;
  contracts: (Contract & { t: number })[];
  contractCount: number;
  sourceCapabilities: number;
  hardResets: { t: number; cause?: string }[];
  hardResetCount: number;
  counts: Record<Severity, number>;
  goodCrcSeen: boolean;
  /** The earliest error, named in the sentence when no Hard Reset cause already explains the trace. */
  firstError?: { title: string; t?: number };
}

const lowerFirst = (text: string): string => (/^[A-Z][a-z]/.test(text) ? text[0]!.toLowerCase() + text.slice(1) : text);

const plural = (n: number, one: string, many = `${one}s`): string => `${n} ${n === 1 ? one : many}`;

export function summarize(s: SummaryInput): string {
  const parts: string[] = [];
  const first = s.contracts[0];
  const last = s.contracts[s.contracts.length - 1];
  if (first && last) {
    parts.push(`Contract ${contractText(first)} at ${seconds(first.t)}`);
    if (s.contractCount > 1) parts.push(`${plural(s.contractCount, 'contract')} in all, the last ${contractText(last)} at ${seconds(last.t)}`);
  } else if (s.messages === 0) {
    parts.push(s.measurements > 0 ? `No USB PD messages, ${plural(s.measurements, 'VBUS measurement')}` : `No USB PD messages in ${plural(s.records, 'record')}`);
  } else if (s.sourceCapabilities > 0) {
    parts.push(`No contract: the source offered Source_Capabilities ${plural(s.sourceCapabilities, 'time')} but no Request was accepted`);
  } else {
    parts.push(`No contract in ${plural(s.messages, 'message')}`);
  }
  const reset = s.hardResets[0];
  if (reset) {
    parts.push(`Hard Reset at ${seconds(reset.t)}${reset.cause ? ` after ${reset.cause}` : ' with no cause found before it'}`);
    if (s.hardResetCount > 1) parts.push(`${plural(s.hardResetCount, 'Hard Reset')} in all`);
  }
  const { error, warning } = s.counts;
  const tally = error + warning === 0 ? 'no errors or warnings' : [error > 0 ? plural(error, 'error') : '', warning > 0 ? plural(warning, 'warning') : ''].filter(Boolean).join(' and ');
  const explained = reset?.cause !== undefined;
  const named = s.firstError && !explained ? `, the first: ${lowerFirst(s.firstError.title)}${s.firstError.t !== undefined ? ` at ${seconds(s.firstError.t)}` : ''}` : '';
  parts.push(tally + named);
  if (s.messages > 0 && !s.goodCrcSeen) parts.push('the trace holds no GoodCRC, so acknowledgements were not checked');
  return `${parts.join('; ')}.`;
}
