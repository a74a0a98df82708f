/**
 * Run progress per run id, for the server-sent events route: the job publishes each finished
 * vector and the end; every open `/events` stream subscribes. In-process only (one server).
 */
import { EventEmitter } from 'node:events';

export interface LastVector {
  id: string;
  ok: boolean;
  message?: string;
  durationMs: number;
}

export type RunEvent =
  | { type: 'progress'; runId: number; done: number; total: number; passed: number; failed: number; last?: LastVector }
  | { type: 'done'; runId: number; status: 'done' | 'failed'; done: number; total: number; passed: number; failed: number; newFailures: number; error?: string };

const hub = new EventEmitter();
hub.setMaxListeners(0);
const latest = new Map<number, RunEvent>();

export function publishRun(event: RunEvent): void {
  if (event.type === 'progress') latest.set(event.runId, event);
  else latest.delete(event.runId);
  hub.emit(String(event.runId), event);
}

export function currentRunProgress(runId: number): RunEvent | undefined {
  return latest.get(runId);
}

export function subscribeRun(runId: number, listener: (event: RunEvent) => void): () => void {
  hub.on(String(runId), listener);
  return () => hub.off(String(runId), listener);
}
