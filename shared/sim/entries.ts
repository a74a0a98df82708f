/** The runner's event-queue entries and the frames on the line (runner.ts, line.ts, vbus-path.ts). */
import type { TimerName } from '../core/timers.ts';
import type { PeEffect } from './pe-types.ts';
import type { Side } from './types.ts';
import type { MessageType, Revision, Sender, Sop } from './wire.ts';

/** A protocol layer: a port's SOP layer, its SOP' layer (`source'`), or the cable plug's. */
export type LayerKey = Side | "source'" | "sink'" | 'cable';

export interface Frame {
  /** The protocol layer that sends it. */
  layer: LayerKey;
  sop: Sop;
  /** The trace's `from`: the sender's power role when it sent, or `cable`. */
  from: Sender;
  type: MessageType;
  objects: readonly number[];
  messageId: number;
  /** 0 for a GoodCRC, else the protocol layer's attempt number. */
  attempt: number;
  header: number;
  /** The name faults select it by (an Extended_Control by its own type, e.g. EPR_KeepAlive). */
  faultName: string;
}

export type Entry = { tUs: number; seq: number } & (
  | { kind: 'cc' }
  | { kind: 'debounced'; side: Side }
  | { kind: 'timer'; layer: string; side: Side; name: TimerName; gen: number }
  | { kind: 'tx'; frame: Frame }
  | { kind: 'hard-reset-tx'; from: Side }
  | { kind: 'arrive'; frame: Frame; corrupt: boolean }
  | { kind: 'hard-reset-arrive'; to: Side }
  | { kind: 'ramp-end'; gen: number }
  | { kind: 'vbus-cross'; present: boolean; gen: number }
  | { kind: 'policy'; index: number }
  | { kind: 'action'; index: number }
  | { kind: 'load'; currentMa: number }
  | { kind: 'deferred-send'; port: Side; effect: Extract<PeEffect, { kind: 'send' }>; gen: number }
  | { kind: 'cable-answer'; objects: readonly number[] }
  | { kind: 'error-recovery' }
  | { kind: 'measure' }
  | { kind: 'end' }
);

export type EntryBody = Entry extends infer E ? (E extends Entry ? Omit<E, 'tUs' | 'seq'> & { tUs?: number; seq?: number } : never) : never;

export type Scheduler = (tUs: number, body: EntryBody) => void;

export type { Revision };
