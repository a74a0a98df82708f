/**
 * The protocol layers of a run (protocol.ts: one per port on SOP, one per port on SOP', one for
 * the cable plug) and each port's chunking of extended messages (chunking.ts), wired to the line
 * (line.ts), the timers and the policy engines: what a layer transmits becomes a frame on the line,
 * what arrives is acknowledged and delivered, and the cable plug answers Discover Identity.
 */
import { countersFor, timersPd3, type TimerName } from '../core/timers.ts';
import { extendedControlName } from '../pd/extended-data.ts';
import { identityAck, vdmCommandType } from './cable-identity.ts';
import { chunkStep, initialChunks, type ChunkEffect, type ChunkEvent, type ChunkState } from './chunking.ts';
import type { Frame, LayerKey } from './entries.ts';
import type { LineHooks } from './line.ts';
import { initialProtocol, protocolStep, type PendingTx, type ProtocolEffect, type ProtocolEvent, type ProtocolState } from './protocol.ts';
import type { RunParts } from './run-parts.ts';
import { responseDelayUs } from './timing.ts';
import { otherSide, type Side } from './types.ts';
import { isExtendedType, packHeader, type MessageType, type Revision } from './wire.ts';

const TRANSMIT = timersPd3.tTransmit;

/** The port a layer belongs to (the cable plug's layer answers for the source's side of the run). */
export function portOfLayer(layer: LayerKey): Side {
  return layer === 'sink' || layer === "sink'" ? 'sink' : 'source';
}

function primeLayerOf(port: Side): LayerKey {
  return port === 'source' ? "source'" : "sink'";
}

export class ProtocolLayers implements LineHooks {
  readonly prl: Record<LayerKey, ProtocolState> = { source: initialProtocol, sink: initialProtocol, "source'": initialProtocol, "sink'": initialProtocol, cable: initialProtocol };
  readonly chunks: Record<Side, ChunkState> = { source: initialChunks, sink: initialChunks };
  /** When each layer's last GoodCRC ends on the wire (µs). */
  readonly goodCrcEndUs: Partial<Record<LayerKey, number>> = {};
  /** The port that last spoke on SOP' (the cable answers it). */
  private primePort: Side = 'source';

  constructor(private readonly run: RunParts) {}

  // ---- the line's hooks ----
  pending(layer: LayerKey): PendingTx | null {
    return this.prl[layer].pending;
  }
  startReceiveTimer(layer: LayerKey, endUs: number): void {
    this.run.startTimer(layer, portOfLayer(layer), 'tReceive', endUs);
  }

  /** A policy engine's send: SOP' to the cable, an extended message with its data block through chunking, else SOP. */
  send(port: Side, type: MessageType, objects: readonly number[], bytes: readonly number[] | undefined, sop: "SOP'" | undefined): void {
    if (sop === "SOP'") {
      this.primePort = port;
      this.runProtocol(primeLayerOf(port), { kind: 'send', type, objects });
    } else if (bytes && isExtendedType(type)) this.runChunks(port, { kind: 'send', type, bytes });
    else this.runProtocol(port, { kind: 'send', type, objects });
  }

  runProtocol(layer: LayerKey, event: ProtocolEvent, partnerRevision: Revision = '3.0'): void {
    const port = portOfLayer(layer);
    const revision = layer === 'cable' ? '3.0' : this.run.ports.revisionOf(port);
    const [next, effects] = protocolStep(this.prl[layer], event, countersFor(revision).nRetryCount);
    this.prl[layer] = next;
    for (const effect of effects) this.performProtocol(layer, effect, partnerRevision);
  }

  private frameOf(layer: LayerKey, type: MessageType, objects: readonly number[], messageId: number, attempt: number): Frame {
    const ports = this.run.ports;
    const port = portOfLayer(layer);
    const cable = layer === 'cable';
    const prime = cable || layer.endsWith("'");
    const bits = prime ? { roleBit: cable, dfp: false } : { roleBit: ports.role[port] === 'source', dfp: ports.dfp[port] };
    const revision = cable ? '3.0' : ports.revisionOf(port);
    const header = packHeader(type, objects.length, messageId, bits, revision);
    // Faults name an Extended_Control by its own type (vector.md).
    const faultName = type === 'Extended_Control' ? (extendedControlName(((objects[0] ?? 0) >>> 16) & 0xff) ?? type) : type;
    return { layer, sop: prime ? "SOP'" : 'SOP', from: cable ? 'cable' : ports.role[port], type, objects, messageId, attempt, header, faultName };
  }

  private performProtocol(layer: LayerKey, effect: ProtocolEffect, partnerRevision: Revision): void {
    const run = this.run;
    const nowUs = run.clock.nowUs;
    const port = portOfLayer(layer);
    switch (effect.kind) {
      case 'transmit': {
        // The first copy after the port's processing time; a retry within tTransmit of the timeout.
        const delayUs = effect.attempt === 1 ? responseDelayUs(run.random) : run.random.between(TRANSMIT.minUs, TRANSMIT.maxUs);
        run.line.request(this.frameOf(layer, effect.type, effect.objects, effect.messageId, effect.attempt), nowUs + delayUs);
        return;
      }
      case 'good-crc':
        // tTransmit: the GoodCRC starts within 195 µs of the message's end (§6.6 Time Values).
        this.goodCrcEndUs[layer] = run.line.reserveGoodCrc(nowUs + run.random.between(TRANSMIT.minUs, TRANSMIT.maxUs), this.frameOf(layer, 'GoodCRC', [], effect.messageId, 0));
        return;
      case 'stop-crc-timer':
        run.timers.stop(layer, 'tReceive', nowUs);
        break;
      case 'deliver':
        if (effect.type === 'other') return;
        if (layer === 'cable') this.cableHeard(effect.type, effect.objects);
        else if (layer !== port) run.ports.runPe(port, { kind: 'message', type: effect.type, objects: effect.objects, revision: partnerRevision, sop: "SOP'" });
        else if (isExtendedType(effect.type)) this.runChunks(port, { kind: 'received', type: effect.type, objects: effect.objects }, partnerRevision);
        else run.ports.deliver(port, effect.type, effect.objects, undefined, partnerRevision);
        return;
      case 'sent':
      case 'failed': {
        if (layer === 'cable') return;
        const kind = effect.kind;
        if (layer !== port) run.ports.runPe(port, kind === 'sent' ? { kind, type: effect.type, sop: "SOP'" } : { kind, type: effect.type, sop: "SOP'" });
        else if (isExtendedType(effect.type)) this.runChunks(port, kind === 'sent' ? { kind, type: effect.type } : { kind, type: effect.type });
        else run.ports.runPe(port, kind === 'sent' ? { kind, type: effect.type } : { kind, type: effect.type });
        return;
      }
      case 'discarded':
        if (layer === port) run.ports.runPe(port, { kind: 'discarded', type: effect.type });
        return;
    }
  }

  // ---- chunking of extended messages ----
  private runChunks(port: Side, event: ChunkEvent, partnerRevision: Revision = '3.0'): void {
    const [next, effects] = chunkStep(this.chunks[port], event);
    this.chunks[port] = next;
    for (const effect of effects) this.performChunk(port, effect, partnerRevision);
  }
  private performChunk(port: Side, effect: ChunkEffect, partnerRevision: Revision): void {
    switch (effect.kind) {
      case 'transmit':
        this.runProtocol(port, { kind: 'send', type: effect.type, objects: effect.objects });
        break;
      case 'deliver':
        this.run.ports.deliver(port, effect.type, [], effect.bytes, partnerRevision);
        break;
      case 'sent':
      case 'failed':
        this.run.ports.runPe(port, { kind: effect.kind, type: effect.type });
        break;
      case 'start-timer':
        this.run.startTimer(port, port, effect.name);
        break;
      case 'stop-timer':
        this.run.timers.stop(port, effect.name, this.run.clock.nowUs);
        break;
    }
  }
  /** A chunk timer ran out. */
  chunkTimer(port: Side, name: TimerName): void {
    this.runChunks(port, { kind: 'timer', name });
  }

  /** A passive cable answers Discover Identity REQ with its VDOs within tVDMReceiverResponse. */
  private cableHeard(type: MessageType, objects: readonly number[]): void {
    const run = this.run;
    if (type !== 'Vendor_Defined' || !run.marker || vdmCommandType(objects[0] ?? 0) !== 'REQ') return;
    run.loop.schedule(run.clock.nowUs + responseDelayUs(run.random), { kind: 'cable-answer', objects: identityAck(run.marker) });
  }

  /** A frame's last bit is in: the receiving layer hears it (a corrupt frame is not heard at all). */
  arrive(frame: Frame, corrupt: boolean): void {
    if (corrupt) return;
    const ports = this.run.ports;
    const event: ProtocolEvent =
      frame.type === 'GoodCRC' ? { kind: 'good-crc', messageId: frame.messageId } : { kind: 'received', type: frame.type, messageId: frame.messageId, objects: frame.objects };
    if (frame.sop === "SOP'") {
      // The cable plug listens only when it has an e-marker; its answer goes to the port that asked.
      if (frame.layer === 'cable') this.runProtocol(primeLayerOf(this.primePort), event, '3.0');
      else if (this.run.marker) this.runProtocol('cable', event, ports.revisionOf(portOfLayer(frame.layer)));
      return;
    }
    const to = otherSide(portOfLayer(frame.layer));
    // A port's protocol layer listens once Type-C is attached and its policy engine runs.
    if (ports.pe[to].state === 'idle') return;
    this.runProtocol(to, event, ports.revisionOf(portOfLayer(frame.layer)));
  }

  /** A policy engine's protocol reset (Soft Reset): the SOP layer and its chunking start over. */
  protocolReset(port: Side): void {
    this.runProtocol(port, { kind: 'reset' });
    this.chunks[port] = initialChunks;
  }

  /** Clears a port's layers on a Hard Reset: no queued or deferred transmission survives it. */
  reset(port: Side): void {
    const { clock, timers, collision } = this.run;
    const nowUs = clock.nowUs;
    const prime = primeLayerOf(port);
    this.prl[port] = initialProtocol;
    this.prl[prime] = initialProtocol;
    this.chunks[port] = initialChunks;
    timers.stop(port, 'tReceive', nowUs);
    timers.stop(prime, 'tReceive', nowUs);
    timers.stop(port, 'tChunkSenderRequest', nowUs);
    timers.stop(port, 'tChunkSenderResponse', nowUs);
    collision.voidWaiting();
  }

  /** ErrorRecovery: the cable plug's layer starts over too. */
  resetCable(): void {
    this.prl.cable = initialProtocol;
  }
}
