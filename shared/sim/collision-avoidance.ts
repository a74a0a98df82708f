/**
 * Collision avoidance between two PD 3.x ports with a contract (USB PD R3.2 V1.1 §5.7, USB Type-C
 * R2.3 §4.6.2.1; trace.md `rp` events): the source sets Rp to SinkTxNG (1.5 A) and waits tSinkTx
 * before it starts an exchange, and back to SinkTxOK (3.0 A) once it is in Ready again; the sink
 * starts an exchange only while Rp says SinkTxOK. Answers are never held back.
 */
import { timersPd3 } from '../core/timers.ts';
import type { PeEffect } from './pe-types.ts';
import type { RunParts } from './run-parts.ts';
import type { Side } from './types.ts';

const SINK_TX_NG = '1.5A';
const SINK_TX_OK = '3.0A';

export type SendEffect = Extract<PeEffect, { kind: 'send' }>;

export class CollisionAvoidance {
  /** Rp as the source drives it now. */
  rp: 'default' | '1.5A' | '3.0A';
  /** The sink's exchanges waiting for SinkTxOK. */
  private awaitingTxOk: { port: Side; effect: SendEffect }[] = [];
  /** Voids the sends deferred before a Hard Reset or ErrorRecovery. */
  private sendGen = 0;

  constructor(private readonly run: RunParts) {
    this.rp = run.scenario.source.behaviour.rp;
  }

  /** Both ports speak PD 3.x and the source holds a contract. */
  private applies(): boolean {
    const pe = this.run.ports.pe;
    return pe.source.revision === '3.0' && pe.sink.revision === '3.0' && pe[this.run.ports.portWithRole('source')].contract !== null;
  }

  private setRp(rp: '1.5A' | '3.0A'): void {
    this.rp = rp;
    this.run.record.records.push({ t: this.run.clock.nowUs, event: 'rp', from: 'source', rp });
    if (rp !== SINK_TX_OK) return;
    const waiting = this.awaitingTxOk;
    this.awaitingTxOk = [];
    for (const { port, effect } of waiting) this.send(port, effect);
  }

  /** A policy engine's send: an exchange it starts waits as above, anything else goes at once. */
  sendGuarded(port: Side, effect: SendEffect): void {
    if (!effect.initiate || !this.applies()) {
      this.send(port, effect);
      return;
    }
    const run = this.run;
    if (run.ports.role[port] === 'source') {
      if (this.rp !== SINK_TX_NG) this.setRp(SINK_TX_NG);
      const t = timersPd3.tSinkTx;
      run.loop.schedule(run.clock.nowUs + run.random.between(t.minUs, t.maxUs), { kind: 'deferred-send', port, effect, gen: this.sendGen });
      return;
    }
    if (this.rp === SINK_TX_NG) this.awaitingTxOk.push({ port, effect });
    else this.send(port, effect);
  }

  /** A send deferred by tSinkTx is due (unless a reset voided it). */
  deferredSend(port: Side, effect: SendEffect, gen: number): void {
    if (gen === this.sendGen) this.send(port, effect);
  }

  private send(port: Side, effect: SendEffect): void {
    this.run.layers.send(port, effect.type, effect.objects, effect.bytes, effect.sop);
  }

  /** The source's policy engine entered Ready. */
  sourceReady(): void {
    if (this.applies() && this.rp !== SINK_TX_OK) this.setRp(SINK_TX_OK);
  }

  /** A Hard Reset: no deferred or waiting send survives it. */
  voidWaiting(): void {
    this.sendGen++;
    this.awaitingTxOk = [];
  }

  /** ErrorRecovery: Rp is the scenario's again. */
  restart(): void {
    this.rp = this.run.scenario.source.behaviour.rp;
  }
}
