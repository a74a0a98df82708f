/**
 * The parts of one run as each part sees the others. runner.ts builds them once per run; every
 * part keeps this object instead of closures (a run is built thousands of times a second).
 */
import type { TimerName } from '../core/timers.ts';
import type { EMarker } from './cable-identity.ts';
import type { SimClock } from './clock.ts';
import type { CollisionAvoidance } from './collision-avoidance.ts';
import type { EventLoop } from './event-loop.ts';
import type { FaultBook } from './faults.ts';
import type { Line } from './line.ts';
import type { Ports } from './ports.ts';
import type { ProtocolLayers } from './protocol-layers.ts';
import type { Random } from './random.ts';
import type { RunRecord } from './run-record.ts';
import type { Scenario } from './scenario.ts';
import type { TimerBook } from './timer-book.ts';
import type { Side } from './types.ts';
import type { VbusPath } from './vbus-path.ts';

export interface RunParts {
  readonly scenario: Scenario;
  /** The scenario's duration (µs). */
  readonly durationUs: number;
  /** End the run at the first explicit contract (the fast path). */
  readonly untilContract: boolean;
  readonly loop: EventLoop;
  readonly clock: SimClock;
  readonly random: Random;
  readonly book: FaultBook;
  readonly record: RunRecord;
  readonly timers: TimerBook;
  readonly line: Line;
  readonly vbus: VbusPath;
  /** The cable plug's e-marker, or null for a cable that does not answer on SOP'. */
  readonly marker: EMarker | null;
  readonly ports: Ports;
  readonly layers: ProtocolLayers;
  readonly collision: CollisionAvoidance;
  /** Starts (or restarts) a timer for a seeded draw inside its range (timing.ts), from `startUs` (default now). */
  startTimer(layer: string, port: Side, name: TimerName, startUs?: number): void;
}
