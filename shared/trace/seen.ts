/** What the analyser's parts pass each other about one message on the wire. */
import type { Finding } from '../core/finding.ts';
import type { Sop } from '../pd/types.ts';
import type { RuleId } from '../rules/catalog.ts';
import type { DecodedMessage } from './decode-cache.ts';
import type { TraceSide } from './records.ts';

export interface SeenMessage {
  /** Preamble start, µs. */
  t: number;
  /** End of the EOP, µs (t + the message's time on the wire). */
  endUs: number;
  from: TraceSide;
  sop: Sop;
  d: DecodedMessage;
  crcOk: boolean;
  line: number | undefined;
  /** Index in the timeline's messages, or -1 when the timeline is full. */
  index: number;
  /** End of the GoodCRC that acknowledged it, once one did. */
  ackEndUs: number | undefined;
  /** For a retry: when the first copy was sent. */
  firstUs?: number;
  /** For a GoodCRC: the message it acknowledged. */
  acks: SeenMessage | undefined;
}

export interface FindingExtra {
  t?: number;
  line?: number;
  object?: number;
  ref?: string;
  /** Soften the catalog's severity (never raise it). */
  lowerTo?: 'warning' | 'info';
}

export type Report = (rule: RuleId, message: string, extra?: FindingExtra) => Finding;

/** "the source's Request at 0.31 s" style names. */
export const possessive = (side: TraceSide): string => `the ${side}'s`;
