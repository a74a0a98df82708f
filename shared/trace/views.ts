/**
 * The stored form of an analysis and the views a trace page reads from it, so a page costs what it
 * shows, not the size of the trace:
 * - `StoredAnalysis`: the analysis without the decoded form of each timeline message (the hex is
 *   kept; a client decodes a message when someone opens it). That form was over half of the bytes.
 * - `AnalysisSummary`: everything but the lists (findings, contracts, timeline), with their lengths.
 * - Timeline chunks: messages (every one of the trace), events, contract spans and VBUS readings in time order, cut into
 *   chunks of at most `CHUNK_ITEMS`; VBUS readings also at coarser levels (each keeps the lowest
 *   and highest reading of every `LEVEL_FACTOR` of the level below), so a window of any width
 *   reads a bounded number of points and a sag never disappears from an overview.
 */
import type { Finding } from '../core/finding.ts';
import type { Analysis } from './analyser.ts';
import type { Timeline, TimelineContract, TimelineEvent, TimelineMeasurement, TimelineMessage } from './timeline.ts';

export type StoredTimelineMessage = Omit<TimelineMessage, 'decoded'>;
export type StoredTimeline = Omit<Timeline, 'messages'> & { messages: StoredTimelineMessage[] };
export type StoredAnalysis = Omit<Analysis, 'timeline'> & { timeline: StoredTimeline };

export interface AnalysisSummary extends Omit<Analysis, 'timeline' | 'findings' | 'contracts'> {
  /** Findings listed (`counts` covers all; `findingsOmitted` were counted but not listed). */
  findingsListed: number;
  contractsListed: number;
  /** The end of the trace on the timeline, in µs. */
  endUs: number;
  timeline: {
    messages: number;
    measurements: number;
    events: number;
    contracts: number;
    omitted: Timeline['omitted'];
    measurementStride: number;
  };
}

export const CHUNK_ITEMS = 500;
export const LEVEL_FACTOR = 8;

export type ChunkKind = 'message' | 'event' | 'contract' | 'measurement';

export interface TimelineChunk {
  kind: ChunkKind;
  /** 0 for the items themselves; higher levels hold VBUS readings only. */
  level: number;
  seq: number;
  /** Index in the whole list (level 0) of the chunk's first item. */
  firstIndex: number;
  startUs: number;
  endUs: number;
  items: unknown[];
}

export function withoutDecodedMessages(analysis: Analysis): StoredAnalysis {
  const messages = analysis.timeline.messages.map(({ decoded: _decoded, ...rest }) => rest);
  return { ...analysis, timeline: { ...analysis.timeline, messages } };
}

export function endOfTrace(analysis: StoredAnalysis | Analysis): number {
  const { timeline } = analysis;
  const lastMessage = timeline.messages[timeline.messages.length - 1];
  const lastMeasurement = timeline.measurements[timeline.measurements.length - 1];
  const lastEvent = timeline.events[timeline.events.length - 1];
  let lastFindingUs = 0;
  for (const f of analysis.findings) if ((f.t ?? 0) > lastFindingUs) lastFindingUs = f.t ?? 0;
  return Math.max(1, lastMessage ? lastMessage.t + lastMessage.durationUs : 0, lastMeasurement?.t ?? 0, lastEvent?.t ?? 0, lastFindingUs);
}

export function summaryOf(analysis: StoredAnalysis | Analysis): AnalysisSummary {
  const { timeline, findings, contracts, ...rest } = analysis;
  return {
    ...rest,
    findingsListed: findings.length,
    contractsListed: contracts.length,
    endUs: endOfTrace(analysis),
    timeline: {
      messages: timeline.messages.length,
      measurements: timeline.measurements.length,
      events: timeline.events.length,
      contracts: timeline.contracts.length,
      omitted: timeline.omitted,
      measurementStride: timeline.measurementStride,
    },
  };
}

function chunksOf<T>(kind: ChunkKind, level: number, items: readonly T[], startOf: (item: T) => number, endOf: (item: T) => number): TimelineChunk[] {
  const chunks: TimelineChunk[] = [];
  for (let first = 0, seq = 0; first < items.length; first += CHUNK_ITEMS, seq++) {
    const part = items.slice(first, first + CHUNK_ITEMS);
    let startUs = Number.POSITIVE_INFINITY;
    let endUs = Number.NEGATIVE_INFINITY;
    for (const item of part) {
      startUs = Math.min(startUs, startOf(item));
      endUs = Math.max(endUs, endOf(item));
    }
    chunks.push({ kind, level, seq, firstIndex: first, startUs, endUs, items: part });
  }
  return chunks;
}

/** The lowest and the highest reading of each `LEVEL_FACTOR` readings, in time order. */
export function coarserReadings(readings: readonly TimelineMeasurement[]): TimelineMeasurement[] {
  const out: TimelineMeasurement[] = [];
  for (let first = 0; first < readings.length; first += LEVEL_FACTOR) {
    let low = first;
    let high = first;
    const last = Math.min(readings.length, first + LEVEL_FACTOR);
    for (let i = first + 1; i < last; i++) {
      if (readings[i]!.mv < readings[low]!.mv) low = i;
      if (readings[i]!.mv > readings[high]!.mv) high = i;
    }
    out.push(readings[Math.min(low, high)]!);
    if (low !== high) out.push(readings[Math.max(low, high)]!);
  }
  return out;
}

/**
 * The chunks of the timeline's events, contract spans and VBUS readings (at every level down to one
 * chunk). Messages are not cut from here: the timeline keeps only the first of a long trace's, so
 * the server stores every message as the analysis reads it (`AnalyserOptions.onMessage`).
 */
export function timelineChunks(analysis: StoredAnalysis): TimelineChunk[] {
  const { timeline } = analysis;
  const endUs = endOfTrace(analysis);
  const chunks = [
    ...chunksOf<TimelineEvent>(
      'event',
      0,
      timeline.events,
      (e) => e.t,
      (e) => e.t,
    ),
    ...chunksOf<TimelineContract>(
      'contract',
      0,
      timeline.contracts,
      (c) => c.startUs,
      (c) => c.endUs ?? endUs,
    ),
  ];
  let readings: readonly TimelineMeasurement[] = timeline.measurements;
  for (let level = 0; ; level++) {
    chunks.push(
      ...chunksOf<TimelineMeasurement>(
        'measurement',
        level,
        readings,
        (m) => m.t,
        (m) => m.t,
      ),
    );
    if (readings.length <= CHUNK_ITEMS) break;
    readings = coarserReadings(readings);
  }
  return chunks;
}

/** A finding as a timeline pin. */
export interface FindingPin {
  index: number;
  t: number;
  severity: Finding['severity'];
  rule: string;
}

/** What `GET /api/traces/:id/timeline` answers for one window. */
export interface TimelineWindow {
  startUs: number;
  endUs: number;
  /** The level the readings come from: 0 every stored reading, n each `LEVEL_FACTOR`ⁿ reduced to its extremes. */
  measurementLevel: number;
  /** The readings inside the window. */
  measurements: TimelineMeasurement[];
  /**
   * The last reading before the window and the first after it (same level), or null: what VBUS
   * held as the window opens and until when, so a window between two readings still shows it.
   */
  readingBefore: TimelineMeasurement | null;
  readingAfter: TimelineMeasurement | null;
  /** Messages with their index in the whole timeline (GoodCRC links refer to it). */
  messages: (StoredTimelineMessage & { index: number })[];
  /** Messages in the window beyond those sent (zoom in to see them). */
  messagesOmitted: number;
  events: TimelineEvent[];
  eventsOmitted: number;
  contracts: TimelineContract[];
  findings: FindingPin[];
  findingsOmitted: number;
}

/** Messages a report lists around a finding: this many before its time and this many from it on. */
export const REPORT_MESSAGES_AROUND = 3;
/** Findings a report shows with the messages around them (the first ones with a time; the rest are in its table only). */
export const REPORT_FINDINGS_WITH_MESSAGES = 12;

/**
 * The messages around each of a report's first timed findings (GoodCRC left out), read from every
 * stored message of the trace, not only the timeline's first 20,000: `items[i]` belongs to the
 * i-th finding that has a time.
 */
export interface MessagesAroundFindings {
  items: { t: number; messages: (StoredTimelineMessage & { index: number })[] }[];
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** What `GET /api/traces/:id/messages` answers: messages of the whole trace by index. */
export interface MessageRange {
  /** The first row (the first message at `atUs` when asked by time); with `fold=goodcrc` rows are the messages other than GoodCRC. */
  offset: number;
  /** Rows in the whole list: every message, or with `fold=goodcrc` those other than GoodCRC. */
  total: number;
  /** Consecutive messages from the first row's (with `fold`, up to the next row's, so each row's GoodCRC is there). */
  items: (StoredTimelineMessage & { index: number })[];
  /** The last Source_Capabilities with a good CRC before `offset` (a Request's objects are read against it). */
  capabilities: (StoredTimelineMessage & { index: number }) | null;
}
