/**
 * Findings kept for the report, bounded: the first `limit` are kept (ordered by time at the end),
 * the rest only counted, so a trace with a fault on every line cannot exhaust memory.
 */
import type { Finding, Severity } from '../core/finding.ts';

export interface FindingStore {
  add(finding: Finding, sortKeyUs: number): void;
  counts: Record<Severity, number>;
  omitted(): number;
  /** Kept findings, ordered by time (stable). */
  list(): Finding[];
}

export function createFindingStore(limit: number): FindingStore {
  const kept: { finding: Finding; key: number; seq: number }[] = [];
  const counts: Record<Severity, number> = { error: 0, warning: 0, info: 0 };
  let dropped = 0;
  return {
    counts,
    add(finding, sortKeyUs) {
      counts[finding.severity]++;
      if (kept.length < limit) kept.push({ finding, key: sortKeyUs, seq: kept.length });
      else dropped++;
    },
    omitted: () => dropped,
    list: () => [...kept].sort((a, b) => a.key - b.key || a.seq - b.seq).map((k) => k.finding),
  };
}
