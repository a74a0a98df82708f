/** Vector runs from the Library and from CI, fault sweeps run for the team, their results and the run progress stream (`/api/runs…`). */
import type { OutcomeSummary } from '../sweep/summary.ts';
import type { SweepFaultKind } from '../sweep/placements.ts';

export type RunSource = 'ui' | 'ci';
export type RunStatus = 'running' | 'done' | 'failed';
/** `vectors`: library vectors or CI results; `sweep`: a fault sweep's campaign (each run a placement). */
export type RunKind = 'vectors' | 'sweep';

/** The campaign options a server sweep was started with (`POST /api/runs/sweep`). */
export interface SweepRunOptions {
  kinds: SweepFaultKind[];
  pairs: boolean;
  timerEdges: boolean;
  max?: number;
  seed?: number;
}

/** A sweep run's campaign and, once it is done, its outcome classes. */
export interface SweepRunSummary {
  /** The scenario as posted (vector.md), so the page can open it again. */
  scenario: unknown;
  options: SweepRunOptions;
  /** Messages of the fault-free run. */
  messages: number;
  /** Outcome classes with counts and one example each (empty while running). */
  outcomes: OutcomeSummary[];
  /** The invariants every run was judged by. */
  invariants: { id: string; title: string; explanation: string }[];
  /** Broken runs found (results list at most `MAX_SWEEP_BROKEN_STORED` of them). */
  broken: number;
}

export interface Run {
  id: number;
  kind: RunKind;
  project: string;
  build: string | null;
  source: RunSource;
  status: RunStatus;
  selection: string;
  total: number;
  done: number;
  passed: number;
  failed: number;
  newFailures: number;
  startedBy: string;
  error: string | null;
  createdAt: string;
  finishedAt: string | null;
  /** Only for `kind: 'sweep'`. */
  sweep?: SweepRunSummary;
}

/** One difference between what a vector expects and what the engine produced. */
export interface Mismatch {
  path: string;
  expected?: unknown;
  actual?: unknown;
  message: string;
}

export interface RunResult {
  id: number;
  vectorId: string;
  title: string | null;
  kind: string | null;
  revision: number | null;
  ok: boolean;
  message: string | null;
  durationMs: number;
  newFailure: boolean;
  /** Whether the vector is still in the library, so the page can open it. */
  inLibrary: boolean;
  expected?: unknown;
  actual?: unknown;
  mismatches?: Mismatch[];
  counterexampleVector?: unknown;
}

export interface RunsResponse {
  items: Run[];
  total: number;
  page: number;
  pageSize: number;
  projects: string[];
}

export interface RunResponse {
  run: Run;
}

/** `GET /api/runs/:id`, and `POST /api/runs/start` with `wait: true`. */
export interface RunWithResults {
  run: Run;
  results: RunResult[];
}

/** The vector that finished last, in a progress event. */
export interface LastVector {
  id: string;
  ok: boolean;
  message?: string;
  durationMs: number;
}

/** Server-sent run progress (`GET /api/runs/:id/events`): the event name is `type`. */
export type RunEvent =
  | { type: 'progress'; runId: number; done: number; total: number; passed: number; failed: number; last?: LastVector }
  | { type: 'done'; runId: number; status: 'done' | 'failed'; done: number; total: number; passed: number; failed: number; newFailures: number; error?: string };
