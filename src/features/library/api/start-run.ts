import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import type { VectorFilter } from './types.ts';

export type RunSummary = {
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
  createdAt: string;
  finishedAt: string | null;
};

export type RunResultRow = {
  id: number;
  vectorId: string;
  ok: boolean;
  message: string | null;
  durationMs: number;
  expected?: unknown;
  actual?: unknown;
  mismatches?: { path: string; message: string }[];
};

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
