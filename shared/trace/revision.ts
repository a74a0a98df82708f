/**
 * The Specification Revision in operation: the lower of the two ports' Specification Revision
 * fields (USB PD R3.2 V1.1 §6.2.1.1.5; from memory), and with it the timer table in force.
 */
import { timersFor, type TimerTable } from '../core/timers.ts';
import type { SpecRevision } from '../pd/types.ts';
import type { SeenMessage } from './seen.ts';

export interface RevisionInOperation {
  /** A message a port sent on SOP: its header says the port's revision. */
  note(m: SeenMessage): void;
  timers(): TimerTable;
}

export function createRevisionInOperation(): RevisionInOperation {
  const revisions: { source?: SpecRevision; sink?: SpecRevision } = {};
  return {
    note(m) {
      if (m.from === 'source' || m.from === 'sink') revisions[m.from] = m.d.revision;
    },
    timers() {
      const a = revisions.source;
      const b = revisions.sink;
      return timersFor(a === '2.0' || a === '1.0' || b === '2.0' || b === '1.0' ? '2.0' : '3.0');
    },
  };
}
