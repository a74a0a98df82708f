/**
 * Runs a plan's placements in this thread, with progress and a stop check; the CLI's worker
 * threads, the browser's Web Workers and the server each run a slice of a plan through this.
 */
import type { SweepPlan } from './plan.ts';
import { createFindingsMemo } from './analysis-memo.ts';
import { runPlacement, type Simulate, type SweepRun } from './run-placement.ts';

export interface RunSliceOptions {
  /** Placement indexes [start, end) of the plan; default all. */
  start?: number;
  end?: number;
  onProgress?(done: number, total: number): void;
  shouldStop?(): boolean;
  /** How often progress is reported, in runs. */
  progressEvery?: number;
  simulate?: Simulate;
}

export function runSlice(plan: Pick<SweepPlan, 'scenario' | 'placements' | 'reference' | 'pdos'>, options: RunSliceOptions = {}): { runs: SweepRun[]; stopped: boolean } {
  const start = options.start ?? 0;
  const end = Math.min(options.end ?? plan.placements.length, plan.placements.length);
  const every = options.progressEvery ?? 64;
  const runs: SweepRun[] = [];
  const engine = { simulate: options.simulate, memo: createFindingsMemo() };
  for (let i = start; i < end; i++) {
    if ((i - start) % every === 0) {
      if (options.shouldStop?.()) return { runs, stopped: true };
      options.onProgress?.(i - start, end - start);
    }
    runs.push(runPlacement(plan.scenario, plan.placements[i]!, plan.reference, plan.pdos, engine));
  }
  options.onProgress?.(end - start, end - start);
  return { runs, stopped: false };
}
