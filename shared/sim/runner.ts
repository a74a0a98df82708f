/**
 * The thin runner: builds one run's parts and drives its event loop. The pure actors — Type-C
 * (typec.ts), each protocol layer (protocol.ts), chunking (chunking.ts), the two policy engines
 * (source-pe.ts, sink-pe.ts) and the cable plug — are wired to the line (line.ts), the power path
 * (vbus-path.ts) and the timers (timer-book.ts) by the ports (ports.ts, pe-effects.ts), the
 * protocol layers (protocol-layers.ts) and collision avoidance (collision-avoidance.ts); the queue's
 * entries are performed by dispatch.ts, and what happened is recorded as plain data
 * (run-record.ts, run-samples.ts) that simulate.ts dresses up.
 */
import type { TimerName } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { EMarker } from './cable-identity.ts';
import type { SimClock } from './clock.ts';
import { CollisionAvoidance } from './collision-avoidance.ts';
import { dispatchEntry, MEASURE_EVERY_US } from './dispatch.ts';
import { EventLoop, type LoopControl } from './event-loop.ts';
import { createFaultBook, type FaultBook } from './faults.ts';
import { Line } from './line.ts';
import { cableMarker, portContexts } from './port-contexts.ts';
import { Ports } from './ports.ts';
import * as power from './power.ts';
import { ProtocolLayers } from './protocol-layers.ts';
import { createRandom, type Random } from './random.ts';
import { runOutput, type RunOutput } from './run-output.ts';
import type { RunParts } from './run-parts.ts';
import { RunRecord } from './run-record.ts';
import { RunSamples } from './run-samples.ts';
import type { Scenario } from './scenario.ts';
import { timerDurationUs } from './timing.ts';
import { TimerBook } from './timer-book.ts';
import type { Side } from './types.ts';
import { VbusPath } from './vbus-path.ts';

export type { RunOutput };

export interface RunOptions extends LoopControl {
  sampleEveryUs?: number;
  untilContract?: boolean;
}

/** Runs one scenario to its end (or the first contract, or a stop request). */
export function runScenario(scenario: Scenario, caps: { words: number[]; pdos: SourcePdo[] }, options: RunOptions = {}): RunOutput {
  return new Run(scenario, caps, options).execute();
}

/** One run's parts (a class: a run allocates its state, not a set of closures; hot path). */
class Run implements RunParts {
  readonly durationUs: number;
  readonly untilContract: boolean;
  readonly loop = new EventLoop();
  readonly clock: SimClock = this.loop.clock;
  readonly random: Random;
  readonly book: FaultBook;
  readonly record: RunRecord;
  readonly timers = new TimerBook();
  readonly line: Line;
  readonly vbus: VbusPath;
  readonly marker: EMarker | null;
  readonly ports: Ports;
  readonly layers: ProtocolLayers;
  readonly collision: CollisionAvoidance;
  private readonly samples: RunSamples | undefined;

  constructor(
    readonly scenario: Scenario,
    caps: { words: number[]; pdos: SourcePdo[] },
    private readonly options: RunOptions,
  ) {
    this.durationUs = scenario.durationMs * 1_000;
    this.untilContract = options.untilContract ?? false;
    this.random = createRandom(scenario.seed);
    this.book = createFaultBook(scenario.faults);
    this.record = new RunRecord(this.clock);
    this.layers = new ProtocolLayers(this);
    // One bound method, not a closure per call site: a run is built thousands of times a second.
    const schedule = this.loop.schedule.bind(this.loop);
    this.line = new Line(this.clock, schedule, this.record.records, this.book, this.layers);
    const behaviour = scenario.source.behaviour;
    this.vbus = new VbusPath(this.clock, schedule, this.record.records, behaviour.slewMvPerMs / 1_000, power.rpCurrentMa(behaviour.rp), scenario.cable.resistanceMohm, scenario.sink.load.currentMa);
    this.samples = options.sampleEveryUs ? new RunSamples(this.vbus, options.sampleEveryUs, this.durationUs) : undefined;
    this.marker = cableMarker(scenario.cable);
    this.ports = new Ports(this, portContexts(scenario, caps, this.marker, this.vbus));
    this.collision = new CollisionAvoidance(this);
  }

  startTimer(layer: string, port: Side, name: TimerName, startUs = this.clock.nowUs): void {
    const durationUs = timerDurationUs(name, port, this.ports.revisionOf(port), this.scenario, this.random);
    const gen = this.timers.start(layer, port, name, startUs, durationUs);
    this.loop.schedule(startUs + durationUs, { kind: 'timer', layer, side: port, name, gen });
  }

  execute(): RunOutput {
    const { scenario, options, durationUs, clock, loop } = this;
    this.record.lane('source', this.ports.typec.source.state);
    this.record.lane('sink', this.ports.typec.sink.state);
    loop.schedule(0, { kind: 'cc' });
    loop.schedule(MEASURE_EVERY_US, { kind: 'measure' });
    const { changes } = scenario.sink;
    for (let index = 0; index < changes.length; index++) loop.schedule(changes[index]!.atMs * 1_000, { kind: 'policy', index });
    const { actions } = scenario;
    for (let index = 0; index < actions.length; index++) loop.schedule(actions[index]!.atMs * 1_000, { kind: 'action', index });
    for (const step of scenario.sink.load.steps) loop.schedule(step.atMs * 1_000, { kind: 'load', currentMa: step.currentMa });
    loop.schedule(durationUs, { kind: 'end' });

    const stopped = loop.run(durationUs, dispatchEntry, this, options, this.samples);
    const samples = this.samples?.finish(clock.nowUs);
    this.timers.close(clock.nowUs);
    options.onProgress?.(1);
    return runOutput(this.record, this.timers.spans, this.vbus.contract, this.ports.views(), clock.nowUs, stopped, samples);
  }
}
