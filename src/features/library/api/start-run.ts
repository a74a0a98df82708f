import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { Run, RunResult } from '../../../../shared/api/index.ts';
import type { VectorFilter } from '../../../../shared/api/index.ts';

/** What the Library needs of a run; the full shape is in src/lib/run-types.ts. */
export type RunSummary = Omit<Run, 'startedBy' | 'error'>;

export type RunResultRow = Pick<RunResult, 'id' | 'vectorId' | 'ok' | 'message' | 'durationMs' | 'expected' | 'actual' | 'mismatches'>;

export type StartRunInput = { ids: string[] } | { filter: VectorFilter } | { all: true };

export function startRun(input: StartRunInput): Promise<{ run: RunSummary }> {
  return api.post<{ run: RunSummary }>('/runs/start', input);
}

/** Runs one vector and waits for its result ("Run this vector"). */
export function runOne(id: string): Promise<{ run: RunSummary; results: RunResultRow[] }> {
  return api.post<{ run: RunSummary; results: RunResultRow[] }>('/runs/start', { ids: [id], wait: true });
}

export function useStartRun() {
  return useMutation({ mutationFn: startRun });
}

export function useRunOne() {
  return useMutation({ mutationFn: runOne });
}
