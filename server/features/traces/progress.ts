/**
 * Analysis progress, per trace id, for the server-sent events route: the job publishes bytes
 * read and the outcome; each open `/events` stream subscribes. In-process only (one server).
 */
import { EventEmitter } from 'node:events';

export type ProgressEvent =
  | { type: 'progress'; status: 'queued' | 'analysing'; bytesRead: number; totalBytes: number }
  | { type: 'done'; status: 'done'; summary: string; counts: { error: number; warning: number; info: number } }
  | { type: 'failed'; status: 'failed'; error: { code: string; message: string } };

const hub = new EventEmitter();
hub.setMaxListeners(0);
const latest = new Map<number, ProgressEvent>();

export function publishProgress(traceId: number, event: ProgressEvent): void {
  if (event.type === 'progress') latest.set(traceId, event);
  else latest.delete(traceId);
  hub.emit(String(traceId), event);
}

/** The last progress of a running analysis, if any. */
export function currentProgress(traceId: number): ProgressEvent | undefined {
  return latest.get(traceId);
}

export function subscribeProgress(traceId: number, listener: (event: ProgressEvent) => void): () => void {
  hub.on(String(traceId), listener);
  return () => hub.off(String(traceId), listener);
}
