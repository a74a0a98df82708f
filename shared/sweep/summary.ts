/**
 * What a sweep reports: outcome classes with counts and one example each, the broken runs, and
 * the matrix (messages of the fault-free run × columns) of outcome classes. Summaries of shards
 * or worker chunks merge by concatenating their runs.
 */
import { OUTCOME_CLASSES, OUTCOME_LABELS, type OutcomeClass } from './outcome.ts';
import type { SweepRun } from './run-placement.ts';

export interface OutcomeSummary {
  outcome: OutcomeClass;
  label: string;
  runs: number;
  example: { run: string; faults: SweepRun['faults']; timers?: SweepRun['timers']; contract: SweepRun['contract'] };
}

export interface BrokenRun {
  run: string;
  faults: SweepRun['faults'];
  timers?: SweepRun['timers'];
  /** The first invariant broken, and all of them. */
  invariant: string;
  message: string;
  invariants: string[];
}

export interface SweepSummary {
  ok: boolean;
  runs: number;
  brokenCount: number;
  outcomes: OutcomeSummary[];
  broken: BrokenRun[];
}

export function summarize(runs: readonly SweepRun[]): SweepSummary {
  const outcomes: OutcomeSummary[] = [];
  for (const outcome of OUTCOME_CLASSES) {
    const of = runs.filter((run) => run.outcome === outcome);
    const first = of[0];
    if (!first) continue;
    const example: OutcomeSummary['example'] = { run: first.placement, faults: first.faults, contract: first.contract };
    if (first.timers) example.timers = first.timers;
    outcomes.push({ outcome, label: OUTCOME_LABELS[outcome], runs: of.length, example });
  }
  const broken: BrokenRun[] = runs
    .filter((run) => run.broken.length > 0)
    .map((run) => {
      const entry: BrokenRun = { run: run.placement, faults: run.faults, invariant: run.broken[0]!.invariant, message: run.broken[0]!.message, invariants: run.broken.map((b) => b.invariant) };
      if (run.timers) entry.timers = run.timers;
      return entry;
    });
  return { ok: broken.length === 0, runs: runs.length, brokenCount: broken.length, outcomes, broken };
}

export interface MatrixCell {
  run: string;
  outcome: OutcomeClass;
  broken: boolean;
}

/** rows[messageIndex][column] → the cell's run. */
export function sweepMatrix(runs: readonly SweepRun[]): Map<number, Map<string, MatrixCell>> {
  const rows = new Map<number, Map<string, MatrixCell>>();
  for (const run of runs) {
    if (!run.cell) continue;
    let row = rows.get(run.cell.messageIndex);
    if (!row) {
      row = new Map();
      rows.set(run.cell.messageIndex, row);
    }
    row.set(run.cell.column, { run: run.placement, outcome: run.outcome, broken: run.broken.length > 0 });
  }
  return rows;
}
