/** The wire level's public data types (fields may be added, not renamed). */
import type { Sop } from '../pd/types.ts';

export type ResetOrderedSet = 'Hard_Reset' | 'Cable_Reset';

/** One packet to put on the CC wire: a message (header + objects, without CRC) or a reset ordered set. */
export type WirePacket = { sop: Sop; bytes: Uint8Array } | { orderedSet: ResetOrderedSet };

export interface WireMessageEvent {
  /** Microseconds from the start of the capture to the start of the preamble (integer). */
  t: number;
  kind: 'message';
  sop: Sop;
  /** Header + data objects, without the CRC. */
  bytes: Uint8Array;
  /** The CRC-32 as received (unsigned). */
  crc: number;
  crcOk: boolean;
  /** Bit rate measured over the preamble, in bits per second. */
  bitrateBps: number;
  /** False when the packet ended without an EOP K-code. */
  eop: boolean;
  /** Count of 5-bit symbols that were not valid data symbols (each read as nibble 0). */
  symbolErrors: number;
  /** True when the SOP* matched with one corrupted K-code out of four. */
  sopCorrected: boolean;
}

export interface WireResetEvent {
  t: number;
  kind: 'hard_reset' | 'cable_reset';
  bitrateBps: number;
}

/**
 * A burst of edges in which no packet could be read (no SOP* after a preamble, or too few symbols):
 * noise, a capture sampled too coarsely for the bit rate, or a damaged packet. Reported, never dropped.
 */
export interface WireUnreadableEvent {
  t: number;
  kind: 'unreadable';
  /** Edges in the burst and its length. */
  edges: number;
  durationUs: number;
  /** VCD line of the burst's first edge. */
  line: number;
  /** Why it could not be read, in words. */
  reason: string;
}

export type WireEvent = WireMessageEvent | WireResetEvent | WireUnreadableEvent;
