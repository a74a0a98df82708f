/**
 * What a finished run turns into: a `.trace.jsonl` (trace.md: a header line, then one record a
 * line, messages with their decoded form) and a `negotiation` vector (vector.md) whose expectations
 * are the run's own outcome, for the library to hold it to later.
 */
import type { Contract } from '../../../../shared/core/contract.ts';
import type { Finding } from '../../../../shared/core/finding.ts';
import type { ScenarioInput } from '../../../../shared/sim/scenario.ts';
import type { TraceRecord } from '../../../../shared/trace/records.ts';
import { formatVector } from '../../../../shared/vectors/format.ts';

export function traceJsonl(records: readonly TraceRecord[], header: { title: string; seed: number; simulatedAt: string }): string {
  const head = { trace: 1, title: header.title, capturedAt: header.simulatedAt, simulatedBy: 'parley bench', seed: header.seed };
  const lines = [JSON.stringify(head), ...records.map((record) => JSON.stringify(record))];
  return `${lines.join('\n')}\n`;
}

/** Message types a negotiation is told apart by; GoodCRC and retries add nothing to a sequence. */
const KEY_TYPES = new Set([
  'Source_Capabilities',
  'Request',
  'Accept',
  'Reject',
  'Wait',
  'PS_RDY',
  'Soft_Reset',
  'Get_Source_Cap',
  'Get_Sink_Cap',
  'Sink_Capabilities',
  'Not_Supported',
  'EPR_Request',
  'EPR_Mode',
]);
const MAX_SEQUENCE = 12;

/** Key message types up to the first contract (or the start of the run), repeats collapsed. */
export function keySequence(records: readonly TraceRecord[], untilUs: number | undefined): string[] {
  const sequence: string[] = [];
  for (const record of records) {
    if (untilUs !== undefined && record.t > untilUs) break;
    if (!('msg' in record) || record.crcOk === false) continue;
    const type = record.message?.header.messageType;
    if (!type || !KEY_TYPES.has(type) || sequence[sequence.length - 1] === type) continue;
    sequence.push(type);
    if (sequence.length >= MAX_SEQUENCE) break;
  }
  return sequence;
}

export type RunOutcome = {
  contract: Contract | null;
  contracts: (Contract & { t: number })[];
  events: readonly TraceRecord[];
  findings: readonly Finding[];
};

/** A vector id from free text: lower-case words joined by "-", under `negotiation/bench/`. */
export function vectorIdOf(name: string): string {
  const slug = name
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return `negotiation/bench/${slug || 'scenario'}`;
}

export function vectorFromRun(scenario: ScenarioInput, outcome: RunOutcome, meta: { id: string; title: string; tags?: readonly string[] }): string {
  const errors = [...new Set(outcome.findings.filter((finding) => finding.severity === 'error').map((finding) => finding.rule))];
  const first = outcome.contracts[0];
  const vector = {
    vector: 1,
    id: meta.id,
    title: meta.title,
    tags: [...new Set(['bench', ...(meta.tags ?? [])])],
    ref: 'from memory: recorded from a Parley Bench run; check each expectation against the USB PD specification before relying on it',
    kind: 'negotiation',
    input: { scenario },
    expect: {
      contract: outcome.contract,
      sequence: keySequence(outcome.events, first?.t),
      findings: errors.length > 0 ? { include: errors } : { exclude: ['*error'] },
    },
  };
  return formatVector(vector);
}
