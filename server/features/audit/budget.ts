/**
 * A bound on the audit rows anonymous traffic can write: at most `perMinute` rows of one action a
 * minute; the rest are counted and the next row written carries how many were left out.
 */
export interface AuditBudget {
  /** Whether to write this row, and how many were left out since the last one written. */
  take(nowMs: number): { write: boolean; suppressed: number };
}

export function createAuditBudget(perMinute: number): AuditBudget {
  let windowStartMs = 0;
  let written = 0;
  let suppressed = 0;
  return {
    take(nowMs) {
      if (nowMs - windowStartMs >= 60_000) {
        windowStartMs = nowMs;
        written = 0;
      }
      if (written >= perMinute) {
        suppressed++;
        return { write: false, suppressed };
      }
      written++;
      const left = suppressed;
      suppressed = 0;
      return { write: true, suppressed: left };
    },
  };
}
