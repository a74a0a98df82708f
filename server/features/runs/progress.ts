/** The events of a vector run's job, as `/api/runs/:id/events` streams them (server/jobs). */
export interface LastVector {
  id: string;
  ok: boolean;
  message?: string;
  durationMs: number;
}

export type RunEvent =
  | { type: 'progress'; runId: number; done: number; total: number; passed: number; failed: number; last?: LastVector }
  | { type: 'done'; runId: number; status: 'done' | 'failed'; done: number; total: number; passed: number; failed: number; newFailures: number; error?: string };
