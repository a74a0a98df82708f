/**
 * The analyser's findings for the `analyser.explained` invariant, computed once per distinct trace
 * of a campaign: runs whose records are identical (most held timers never fire in a fault-free
 * exchange, so each of those runs repeats the fault-free trace) get the same findings, since the
 * analyser is a pure function of the records. Decodings and offer checks are shared between the
 * distinct traces too (shared/trace/memo.ts). Bounded in entries and in key length.
 */
import type { Finding } from '../core/finding.ts';
import { analyseRecords } from '../trace/analyser.ts';
import { createAnalyserMemo, type AnalyserMemo } from '../trace/memo.ts';
import type { TraceRecord } from '../trace/records.ts';

/** Distinct traces remembered; past this the map starts again. */
const TRACES_LIMIT = 1_024;
/** Longer traces (as JSON) are analysed every time: their key would cost more memory than it saves. */
const KEY_CHARS_LIMIT = 32_768;

export interface FindingsMemo {
  analyser: AnalyserMemo;
  byTrace: Map<string, readonly Finding[]>;
}

export function createFindingsMemo(): FindingsMemo {
  return { analyser: createAnalyserMemo(), byTrace: new Map() };
}

/** The analyser's findings on `records` (only the findings: no timeline, no summary sentence). Read-only: shared between runs. */
export function analyserFindings(records: readonly TraceRecord[], memo?: FindingsMemo): readonly Finding[] {
  const analyse = () => analyseRecords(records, { timelineLimit: 0, summary: false, memo: memo?.analyser }).findings;
  if (!memo) return analyse();
  // The whole record, every field the analyser may read: equal keys are equal traces.
  const key = JSON.stringify(records);
  if (key.length > KEY_CHARS_LIMIT) return analyse();
  let findings = memo.byTrace.get(key);
  if (findings === undefined) {
    if (memo.byTrace.size >= TRACES_LIMIT) memo.byTrace.clear();
    findings = analyse();
    memo.byTrace.set(key, findings);
  }
  return findings;
}
