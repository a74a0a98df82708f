/**
 * The analysis as a timeline for charts: messages, measurements, events and contracts over time.
 * Bounded for huge traces: the first `limit` messages and events are kept and the rest counted
 * (every message still gets its index in the whole trace, so a store that keeps them all, like
 * the server's message chunks, and the kept ones agree on GoodCRC links);
 * measurements are thinned evenly (when the buffer fills, every second one goes and only every
 * `stride`-th later one is taken), so a chart still spans the whole trace.
 */
import type { Contract } from '../core/contract.ts';
import type { Message, Sop } from '../pd/types.ts';
import type { TraceEventKind, TraceSide } from './records.ts';

export interface TimelineMessage {
  t: number;
  durationUs: number;
  from: TraceSide;
  sop: Sop;
  messageType: string;
  messageId: number;
  hex: string;
  decoded: Message;
  crcOk: boolean;
  /** A retry of the message before it (same MessageID and content). */
  retry?: boolean;
  /** For a GoodCRC: the index of the message it acknowledges. */
  goodCrcFor?: number;
  line?: number;
}

export interface TimelineMeasurement {
  t: number;
  mv: number;
  ma?: number;
}
export interface TimelineEvent {
  t: number;
  event: TraceEventKind | 'note';
  from?: TraceSide;
  text?: string;
}
export interface TimelineContract {
  startUs: number;
  endUs?: number;
  contract: Contract;
  /** The VBUS range the analyser checks readings against under this contract (vbus.ts), drawn as a band. */
  vbus?: { minMv: number; maxMv: number };
}

export interface Timeline {
  messages: TimelineMessage[];
  measurements: TimelineMeasurement[];
  events: TimelineEvent[];
  contracts: TimelineContract[];
  /** Items not kept, by list; `measurementStride` = one measurement kept in that many. */
  omitted: { messages: number; measurements: number; events: number; contracts: number };
  measurementStride: number;
}

export interface TimelineBuilder {
  timeline: Timeline;
  /** Returns the message's index in the whole trace (kept or not). */
  message(item: TimelineMessage): number;
  measurement(t: number, mv: number, ma: number | undefined): void;
  event(item: TimelineEvent): void;
  contractStart(t: number, contract: Contract, vbus?: { minMv: number; maxMv: number }): void;
  contractEnd(t: number): void;
}

export function createTimeline(limit: number): TimelineBuilder {
  const timeline: Timeline = {
    messages: [],
    measurements: [],
    events: [],
    contracts: [],
    omitted: { messages: 0, measurements: 0, events: 0, contracts: 0 },
    measurementStride: 1,
  };
  let skip = 0;
  let seen = 0;
  let open: TimelineContract | undefined;
  return {
    timeline,
    message(item) {
      const index = seen++;
      if (timeline.messages.length >= limit) timeline.omitted.messages++;
      else timeline.messages.push(item);
      return index;
    },
    measurement(t, mv, ma) {
      if (++skip < timeline.measurementStride) {
        timeline.omitted.measurements++;
        return;
      }
      skip = 0;
      const list = timeline.measurements;
      if (list.length >= limit) {
        let w = 0;
        for (let r = 0; r < list.length; r += 2) list[w++] = list[r]!;
        timeline.omitted.measurements += list.length - w;
        list.length = w;
        timeline.measurementStride *= 2;
      }
      list.push(ma === undefined ? { t, mv } : { t, mv, ma });
    },
    event(item) {
      if (timeline.events.length >= limit) timeline.omitted.events++;
      else timeline.events.push(item);
    },
    contractStart(t, contract, vbus) {
      if (open && open.endUs === undefined) open.endUs = t;
      if (timeline.contracts.length >= limit) {
        timeline.omitted.contracts++;
        open = undefined;
        return;
      }
      open = vbus ? { startUs: t, contract, vbus: { minMv: vbus.minMv, maxMv: vbus.maxMv } } : { startUs: t, contract };
      timeline.contracts.push(open);
    },
    contractEnd(t) {
      if (open && open.endUs === undefined) open.endUs = t;
      open = undefined;
    },
  };
}
