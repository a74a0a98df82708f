/**
 * The two ports of a run. Each runs Type-C (typec.ts) and the policy engine of its power role
 * (source-pe.ts or sink-pe.ts; a PR_Swap exchanges them), keeps its data role, and records a lane
 * and a port view (port-views.ts) whenever what it believes moves. Ports are named by their power
 * role at attach.
 */
import { timersPd3 } from '../core/timers.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import { answerFault } from './faults.ts';
import type { PeEffect, PeEvent } from './pe-types.ts';
import { performPeEffect } from './pe-effects.ts';
import type { PortContexts } from './port-contexts.ts';
import type { PortView, PortViews } from './port-views.ts';
import type { RunParts } from './run-parts.ts';
import { initialSinkPe, sinkStep, type SinkPe } from './sink-pe.ts';
import { initialSourcePe, sourceStep, type SourcePe } from './source-pe.ts';
import { initialTypec, typecStep, type TypecEvent, type TypecState } from './typec.ts';
import type { Side } from './types.ts';
import type { MessageType, Revision } from './wire.ts';

const SIDES: readonly Side[] = ['source', 'sink'];
const CC_DEBOUNCE = timersPd3.tCCDebounce;

export class Ports {
  /** Each port's power role now. */
  readonly role: Record<Side, Side> = { source: 'source', sink: 'sink' };
  /** Each port's data role now: true for DFP. */
  readonly dfp: Record<Side, boolean> = { source: true, sink: false };
  readonly pe: Record<Side, SourcePe | SinkPe>;
  readonly typec: Record<Side, TypecState> = { source: initialTypec('source'), sink: initialTypec('sink') };

  constructor(
    private readonly run: RunParts,
    private readonly contexts: PortContexts,
  ) {
    this.pe = { source: initialSourcePe(run.scenario.source.specRevision), sink: initialSinkPe(run.scenario.sink.specRevision, run.scenario.sink.policy) };
  }

  revisionOf(port: Side): Revision {
    return this.pe[port].revision;
  }
  portWithRole(role: Side): Side {
    return this.role.source === role ? 'source' : 'sink';
  }

  runTypec(side: Side, event: TypecEvent): void {
    const run = this.run;
    const before = this.typec[side].state;
    const [next, effects] = typecStep(this.typec[side], event);
    this.typec[side] = next;
    if (next.state !== before) run.record.lane(side, next.state);
    for (const effect of effects) {
      if (effect.kind === 'start-debounce') {
        run.loop.schedule(run.clock.nowUs + run.random.between(CC_DEBOUNCE.minUs, CC_DEBOUNCE.maxUs), { kind: 'debounced', side });
      } else if (effect.kind === 'vbus-on') {
        run.vbus.setMv = 5_000;
        run.vbus.supplier = side;
        run.vbus.startRamp(5_000, 'typec');
      } else if (side === 'sink') this.runPe('sink', { kind: 'start' });
    }
  }

  /** One step of the port's policy engine; its effects are performed in order (pe-effects.ts). */
  runPe(port: Side, event: PeEvent): void {
    const run = this.run;
    const before = this.pe[port];
    let effects: PeEffect[];
    if (this.role[port] === 'source') {
      const [next, out] = sourceStep(before as SourcePe, event, this.contexts.source[port]);
      this.pe[port] = next;
      effects = out;
    } else {
      const [next, out] = sinkStep(before as SinkPe, event, this.contexts.sink[port]);
      this.pe[port] = next;
      effects = out;
    }
    const next = this.pe[port];
    if (next.state !== before.state && next.state !== 'idle') run.record.lane(port, next.state);
    if (next.state !== before.state || next.contract !== before.contract || next.eprMode !== before.eprMode) {
      run.record.portChanges.push({ tUs: run.clock.nowUs, side: port, state: next.state, contract: next.contract, eprMode: next.eprMode });
    }
    for (const effect of effects) performPeEffect(run, port, effect);
    // The source allows the sink to start exchanges again once it is back in Ready (§5.7).
    if (this.role[port] === 'source' && this.pe[port].state === 'PE_SRC_Ready' && before.state !== 'PE_SRC_Ready') run.collision.sourceReady();
  }

  /** A message for the policy engine; a source's answer to a Request may be turned by a `reject` or `wait` fault. */
  deliver(port: Side, type: MessageType, objects: readonly number[], bytes: readonly number[] | undefined, revision: Revision): void {
    const event: Extract<PeEvent, { kind: 'message' }> = bytes ? { kind: 'message', type, objects, bytes, revision } : { kind: 'message', type, objects, revision };
    if (this.role[port] === 'source' && (type === 'Request' || type === 'EPR_Request')) {
      const fault = answerFault(this.run.book, this.run.clock.nowUs);
      if (fault === 'reject') {
        this.run.record.note('fault: the source answers Reject instead of Accept');
        event.reject = true;
      } else if (fault === 'wait') {
        this.run.record.note('fault: the source answers Wait instead of Accept');
        event.wait = true;
      }
    }
    this.runPe(port, event);
  }

  /** After a PR_Swap: the port starts the policy engine of its new power role. */
  become(port: Side, role: Side): void {
    this.role[port] = role;
    if (role === 'source') {
      this.pe[port] = { ...initialSourcePe(this.revisionOf(port)), phase: 'on' };
    } else {
      const policy: SinkPolicy = this.run.scenario.source.swapPolicy ?? { kind: 'max-power' };
      this.pe[port] = initialSinkPe(this.revisionOf(port), policy);
      this.run.vbus.contract = null;
      this.run.vbus.loadMa = null;
    }
    this.runPe(port, { kind: 'start' });
  }

  /** The Type-C ErrorRecovery: both ports detach, VBUS goes to vSafe0V, and they attach again after tErrorRecovery. */
  errorRecovery(): void {
    const { clock, record, layers, timers, vbus, scenario, random } = this.run;
    const nowUs = clock.nowUs;
    record.records.push({ t: nowUs, event: 'detach' });
    for (const port of SIDES) {
      layers.reset(port);
      timers.stopLayer(port, nowUs);
      this.role[port] = port;
      // Both ports still see the VBUS the source drove until it has discharged to vSafe0V.
      this.typec[port] = initialTypec(port, vbus.sinkVbusPresent);
      record.lane(port, this.typec[port].state);
    }
    layers.resetCable();
    this.dfp.source = true;
    this.dfp.sink = false;
    this.pe.source = initialSourcePe(scenario.source.specRevision);
    this.pe.sink = initialSinkPe(scenario.sink.specRevision, scenario.sink.policy);
    for (const port of SIDES) record.portChanges.push({ tUs: nowUs, side: port, state: this.typec[port].state, contract: null, eprMode: false });
    this.run.collision.restart();
    vbus.contract = null;
    vbus.sinkMode = 'off';
    vbus.setMv = 0;
    vbus.limitMa = null;
    vbus.startRamp(0, 'typec');
    const t = timersPd3.tErrorRecovery;
    this.run.loop.schedule(nowUs + random.between(t.minUs, t.maxUs), { kind: 'cc' });
  }

  /** What each port believes at the end: its policy engine's state, or its Type-C state before that started. */
  views(): PortViews {
    return { changes: this.run.record.portChanges, final: { source: this.finalView('source'), sink: this.finalView('sink') } };
  }
  private finalView(port: Side): PortView {
    const pe = this.pe[port];
    const state = pe.state === 'idle' ? this.typec[port].state : pe.state;
    return { tUs: this.run.clock.nowUs, side: port, state, contract: pe.contract, eprMode: pe.eprMode };
  }
}
