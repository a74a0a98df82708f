/** Shapes of the runs API (server/features/runs/routes.ts), shared by the Library and Runs features. */
export type Run = {
  id: number;
  project: string;
  build: string | null;
  source: 'ui' | 'ci';
  status: 'running' | 'done' | 'failed';
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
};

export type Mismatch = { path: string; expected?: unknown; actual?: unknown; message: string };

export type RunResult = {
  id: number;
  vectorId: string;
  title: string | null;
  kind: string | null;
  revision: number | null;
  ok: boolean;
  message: string | null;
  durationMs: number;
  newFailure: boolean;
  inLibrary: boolean;
  expected?: unknown;
  actual?: unknown;
  mismatches?: Mismatch[];
  counterexampleVector?: unknown;
};
