/**
 * The pure generator of a sweep's runs from the fault-free run: every message × every fault kind
 * that can hit it (the sender is the message's side), optionally every pair of those, and the timer
 * edges (each timer of the table at its minimum and at its maximum while the others stay jittered
 * with the seed). It reads only the run's messages, so new message paths of the simulator are
 * covered as soon as they appear in a fault-free run.
 */
import { timersFor, type TimerName } from '../core/timers.ts';
import type { Fault } from '../sim/scenario.ts';
import type { RunMessage } from './messages.ts';

/** The fault kinds a sweep places on messages (vector.md faults; `silent` = that side stops from this message on). */
export const SWEEP_FAULT_KINDS = ['drop', 'corrupt', 'delay', 'reject', 'no-ps-rdy', 'silent'] as const;
export type SweepFaultKind = (typeof SWEEP_FAULT_KINDS)[number];
export const DEFAULT_FAULT_KINDS: readonly SweepFaultKind[] = ['drop', 'corrupt', 'delay'];

/**
 * The two delays a `delay` placement tries, from the timer table: one the partner's response timer
 * absorbs (tSenderResponse minimum less the simulator's 5 ms processing time and 2 ms of wire time)
 * and one just past that timer's maximum.
 */
export function delayEdgesMs(revision = '3.0'): { withinMs: number; pastMs: number } {
  const t = timersFor(revision).tSenderResponse;
  return { withinMs: Math.floor(t.minUs / 1_000) - 7, pastMs: Math.ceil(t.maxUs / 1_000) + 1 };
}

/** The run without added faults: the sweep's reference, and a run that must hold the invariants too. */
export const FAULT_FREE_ID = 'fault-free';

export type TimerEdge = 'min' | 'max';

export interface Placement {
  /** Stable id within a sweep: `drop@3`, `delay34@5`, `drop@3+corrupt@7`, `tPSTransition=min`, `fault-free`. */
  id: string;
  /** Faults added to the scenario's own. */
  faults: Fault[];
  /** Timers held at one end of their range. */
  timers?: Partial<Record<TimerName, TimerEdge>>;
  /** For the matrix: the message index and the column ("drop", "delay 34 ms", …); absent for pairs and timer edges. */
  cell?: { messageIndex: number; column: string };
}

export interface PlacementOptions {
  kinds?: readonly SweepFaultKind[];
  pairs?: boolean;
  timerEdges?: boolean;
  /** The revision whose timer table gives the edges and delays (the lower of the two ports'). */
  revision?: string;
}

interface Single {
  tag: string;
  column: string;
  fault: Fault;
}

/** The placements of one kind on one message, or none when the kind cannot hit it. */
function singlesFor(message: RunMessage, kind: SweepFaultKind, delays: { withinMs: number; pastMs: number }): Single[] {
  const at = { from: message.from, messageType: message.messageType, nth: message.nth };
  switch (kind) {
    case 'drop':
    case 'corrupt':
      return [{ tag: kind, column: kind, fault: { kind, ...at } }];
    case 'delay':
      // A GoodCRC goes out within tTransmit of the message it answers (§6.6.x); the simulator does not delay it.
      if (message.messageType === 'GoodCRC') return [];
      return [delays.withinMs, delays.pastMs].map((delayMs) => ({ tag: `delay${delayMs}`, column: `delay ${delayMs} ms`, fault: { kind, ...at, delayMs } }));
    case 'reject':
      return message.messageType === 'Request' && message.from === 'sink' ? [{ tag: kind, column: kind, fault: { kind, nth: message.nth } }] : [];
    case 'no-ps-rdy':
      return message.messageType === 'PS_RDY' && message.from === 'source' ? [{ tag: kind, column: kind, fault: { kind, nth: message.nth } }] : [];
    case 'silent':
      return [{ tag: `silent-${message.from}`, column: 'silent', fault: { kind, ...at } }];
  }
}

/** How many placements `generatePlacements` would give, without building them (a pair campaign grows with the square). */
export function countPlacements(messages: readonly RunMessage[], options: PlacementOptions = {}): number {
  const kinds = options.kinds ?? DEFAULT_FAULT_KINDS;
  const delays = delayEdgesMs(options.revision);
  let singles = 0;
  for (const message of messages) for (const kind of kinds) singles += singlesFor(message, kind, delays).length;
  const pairs = options.pairs ? (singles * (singles - 1)) / 2 : 0;
  const edges = options.timerEdges ? 2 * Object.values(timersFor(options.revision ?? '3.0')).filter((range) => range.minUs !== range.maxUs).length : 0;
  return 1 + singles + pairs + edges;
}

/** Every placement of a sweep, in a fixed order (the fault-free run, singles by message then kind, pairs, timer edges). */
export function generatePlacements(messages: readonly RunMessage[], options: PlacementOptions = {}): Placement[] {
  const kinds = options.kinds ?? DEFAULT_FAULT_KINDS;
  const delays = delayEdgesMs(options.revision);
  const singles: Placement[] = [];
  for (const message of messages) {
    for (const kind of kinds) {
      for (const single of singlesFor(message, kind, delays)) {
        singles.push({ id: `${single.tag}@${message.index}`, faults: [single.fault], cell: { messageIndex: message.index, column: single.column } });
      }
    }
  }
  const placements: Placement[] = [{ id: FAULT_FREE_ID, faults: [] }, ...singles];
  if (options.pairs) {
    for (let i = 0; i < singles.length; i++) {
      for (let j = i + 1; j < singles.length; j++) {
        const a = singles[i]!;
        const b = singles[j]!;
        placements.push({ id: `${a.id}+${b.id}`, faults: [...a.faults, ...b.faults] });
      }
    }
  }
  if (options.timerEdges) {
    for (const [name, range] of Object.entries(timersFor(options.revision ?? '3.0')) as [TimerName, { minUs: number; maxUs: number }][]) {
      if (range.minUs === range.maxUs) continue;
      for (const edge of ['min', 'max'] as const) placements.push({ id: `${name}=${edge}`, faults: [], timers: { [name]: edge } });
    }
  }
  return placements;
}

/** The matrix columns of the given kinds, in order (what `cell.column` can be). */
export function matrixColumns(kinds: readonly SweepFaultKind[] = DEFAULT_FAULT_KINDS, revision?: string): string[] {
  const delays = delayEdgesMs(revision);
  return kinds.flatMap((kind) => (kind === 'delay' ? [`delay ${delays.withinMs} ms`, `delay ${delays.pastMs} ms`] : [kind]));
}
