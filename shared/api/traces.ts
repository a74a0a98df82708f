/** Stored traces, their analyses and the analysis progress stream (`/api/traces…`). */
import type { Finding } from '../core/finding.ts';
import type { StoredAnalysis, AnalysisSummary, FindingPin, MessageRange, MessagesAroundFindings, Page, TimelineWindow } from '../trace/views.ts';
import type { DeviceRef } from './devices.ts';

/**
 * The analysis as the server stores and sends it: timeline messages carry their hex, never the
 * decoded form (decode on demand, in a worker). The trace page reads the views below instead.
 */
export type Analysis = StoredAnalysis;
export type { AnalysisSummary, FindingPin, MessageRange, MessagesAroundFindings, Page, TimelineWindow };

export const traceStatuses = ['queued', 'analysing', 'done', 'failed'] as const;
export type TraceStatus = (typeof traceStatuses)[number];
export type SeverityCounts = { error: number; warning: number; info: number };

/** An engine or analysis failure kept with the trace; `code` is the engine's (`trace.*`, `analysis.failed`). */
export interface TraceError {
  code: string;
  message: string;
}

/** A stored trace, as lists and the trace page show it. */
export interface TraceItem {
  id: number;
  title: string;
  fileName: string;
  sizeBytes: number;
  format: string;
  sha256: string;
  status: TraceStatus;
  uploader: { id: number; name: string };
  device: DeviceRef | null;
  customerRef: string;
  notes: string;
  summary: string | null;
  messages: number;
  counts: SeverityCounts;
  rules: string[];
  error: TraceError | null;
  createdAt: string;
  analysedAt: string | null;
}

export interface TraceProgress {
  bytesRead: number;
  totalBytes: number;
}

/** `GET /api/traces/:id` and `POST /api/traces`: the trace and its analysis (null until done). */
export interface TraceDetail {
  trace: TraceItem;
  analysis: Analysis | null;
  progress?: TraceProgress | null;
  duplicate?: boolean;
}

/** `GET /api/traces/:id/summary`: the trace, its analysis without the lists (null until done), progress while it runs. */
export interface TraceSummaryDetail {
  trace: TraceItem;
  analysis: AnalysisSummary | null;
  progress: TraceProgress | null;
}

/** `GET /api/traces/:id/findings` and `/contracts`: pages in list order; `index` is the place in the whole list. */
export type IndexedFinding = Finding & { index: number };
export type IndexedContract = StoredAnalysis['contracts'][number] & { index: number };
export type FindingPage = Page<IndexedFinding>;
export type ContractPage = Page<IndexedContract>;

export type TraceSort = 'createdAt' | '-createdAt' | 'title' | '-title' | 'sizeBytes' | '-sizeBytes' | 'errors' | '-errors';

export interface TraceListResponse {
  items: TraceItem[];
  total: number;
  page: number;
  pageSize: number;
  uploaders: { id: number; name: string }[];
}

export interface TraceComment {
  id: number;
  author: { id: number; name: string; role: string };
  body: string;
  createdAt: string;
}

/** Server-sent analysis progress (`GET /api/traces/:id/events`): the event name is `type`. */
export type AnalysisEvent =
  | ({ type: 'progress'; status: 'queued' | 'analysing' } & TraceProgress)
  | { type: 'done'; status: 'done'; summary: string; counts: SeverityCounts }
  | { type: 'failed'; status: 'failed'; error: TraceError };

export interface ShareTraceResponse {
  sent: true;
  to: string;
  subject: string;
}

/** The report a read-only link opens (`GET /api/shared/reports/:token`): no links into the team's Parley, no file hash. */
export interface SharedReport {
  report: {
    trace: {
      id: number;
      title: string;
      fileName: string;
      format: string;
      sizeBytes: number;
      device: string | null;
      customerRef: string;
      notes: string;
      uploadedBy: string;
      createdAt: string;
      link: null;
    };
    summary: string;
    messages: number;
    counts: Analysis['counts'];
    contracts: Analysis['contracts'];
    findings: (Finding & { title: string })[];
    findingsOmitted: number;
  };
  timeline: Pick<Analysis['timeline'], 'messages' | 'measurements' | 'events' | 'contracts' | 'omitted' | 'measurementStride'>;
  /** The messages around the first timed findings, from every message of the trace. */
  aroundFindings: MessagesAroundFindings;
  expiresAt: string;
}
