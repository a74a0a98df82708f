import type { Analysis } from '../../../../shared/trace/index.ts';

export type { Analysis };
export type TraceStatus = 'queued' | 'analysing' | 'done' | 'failed';
export type Severity = 'error' | 'warning' | 'info';

/** A stored trace as the API presents it (server/features/traces/present.ts). */
export type TraceItem = {
  id: number;
  title: string;
  fileName: string;
  sizeBytes: number;
  format: 'jsonl' | 'text' | 'vcd' | string;
  sha256: string;
  status: TraceStatus;
  uploader: { id: number; name: string };
  device: { id: number; name: string } | null;
  customerRef: string;
  notes: string;
  summary: string | null;
  messages: number;
  counts: Record<Severity, number>;
  rules: string[];
  error: { code: string; message: string } | null;
  createdAt: string;
  analysedAt: string | null;
};

export type TraceDetail = {
  trace: TraceItem;
  analysis: Analysis | null;
  progress?: { bytesRead: number; totalBytes: number } | null;
  duplicate?: boolean;
};

/** Server-sent analysis progress (`GET /api/traces/:id/events`). */
export type AnalysisEvent =
  | { type: 'progress'; status: 'queued' | 'analysing'; bytesRead: number; totalBytes: number }
  | { type: 'done'; status: 'done'; summary: string; counts: Record<Severity, number> }
  | { type: 'failed'; status: 'failed'; error: { code: string; message: string } };
