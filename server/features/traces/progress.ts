/** The events of a trace's analysis job, as `/api/traces/:id/events` streams them (server/jobs). */
export type ProgressEvent =
  | { type: 'progress'; status: 'queued' | 'analysing'; bytesRead: number; totalBytes: number }
  | { type: 'done'; status: 'done'; summary: string; counts: { error: number; warning: number; info: number } }
  | { type: 'failed'; status: 'failed'; error: { code: string; message: string } };
