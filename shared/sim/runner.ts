/**
 * The thin runner: one discrete-event loop that owns the clock and the queue, and wires the pure
 * actors — Type-C (typec.ts), each protocol layer (protocol.ts), chunking (chunking.ts), the two
 * policy engines (source-pe.ts, sink-pe.ts) and the cable plug — to the line (line.ts), the power
 * path (vbus-path.ts) and the timers (timer-book.ts). It performs the actors' effects and records
 * plain data; simulate.ts dresses it up.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor, timersPd3, type TimerName } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { SinkPolicy } from '../rules/sink-policy.ts';
import type { TraceRecord } from '../trace/records.ts';
import { identityAck, UNMARKED_CABLE, vdmCommandType, type EMarker } from './cable-identity.ts';
import { chunkStep, initialChunks, type ChunkEffect, type ChunkEvent, type ChunkState } from './chunking.ts';
import { createClock } from './clock.ts';
import type { Entry, EntryBody, Frame, LayerKey, Scheduler } from './entries.ts';
import { createFaultBook, faultsFor, type FaultBook } from './faults.ts';
import { createHeap } from './heap.ts';
import { Line, type LineHooks } from './line.ts';
import { VbusPath } from './vbus-path.ts';
import { offersFor, type OffersFor } from './offers.ts';
import type { PeEffect, PeEvent } from './pe-types.ts';
import { derivedSinkCaps } from './port-answers.ts';
import type { PortView, PortViews } from './port-views.ts';
import * as power from './power.ts';
import { initialProtocol, protocolStep, type ProtocolEffect, type ProtocolEvent, type ProtocolState } from './protocol.ts';
import { createRandom, type Random } from './random.ts';
import { createSampleBuffer, type PackedSamples, type SampleBuffer } from './sample-buffer.ts';
import type { Scenario } from './scenario.ts';
import { initialSinkPe, sinkStep, type SinkContext, type SinkPe } from './sink-pe.ts';
import { initialSourcePe, sourceStep, type SourceContext, type SourcePe, type SwapAnswer } from './source-pe.ts';
import { responseDelayUs, timerDurationUs } from './timing.ts';
import { TimerBook } from './timer-book.ts';
import { initialTypec, typecStep, type TypecEvent, type TypecState } from './typec.ts';
import { otherSide, type LaneEntry, type Side, type TimedContract, type TimerSpan } from './types.ts';
import { isExtendedType, packHeader, type ExtendedType, type MessageType, type Revision } from './wire.ts';

export interface RunOptions {
  sampleEveryUs?: number;
  untilContract?: boolean;
  onProgress?(fraction: number): void;
  shouldStop?(): boolean;
}

export interface RunOutput {
  records: TraceRecord[];
  lanes: LaneEntry[];
  timers: TimerSpan[];
  contracts: TimedContract[];
  contract: Contract | null;
  ports: PortViews;
  samples?: PackedSamples;
  endUs: number;
  stopped: boolean;
}

const MEASURE_EVERY_US = 1_000_000;
const TRANSMIT = timersPd3.tTransmit;
const CC_DEBOUNCE = timersPd3.tCCDebounce;
const SIDES: readonly Side[] = ['source', 'sink'];
/** Collision avoidance (USB PD R3.2 V1.1 §5.7, USB Type-C R2.3 §4.6.2.1): SinkTxNG = Rp 1.5 A, SinkTxOK = Rp 3.0 A. */
const SINK_TX_NG = '1.5A';
const SINK_TX_OK = '3.0A';
const CHUNK_TIMERS = new Set<TimerName>(['tChunkSenderRequest', 'tChunkSenderResponse']);

type SendEffect = Extract<PeEffect, { kind: 'send' }>;

/** Runs one scenario to its end (or the first contract, or a stop request). */
export function runScenario(scenario: Scenario, caps: { words: number[]; pdos: SourcePdo[] }, options: RunOptions = {}): RunOutput {
  return new Run(scenario, caps, options).execute();
}

const wordsMemo = new WeakMap<readonly string[], number[]>();
/** A list of hex words as numbers, memoised by the scenario's array (runs of one scenario share it). */
function hexWords(pdos: readonly string[] | undefined): number[] | undefined {
  if (!pdos) return undefined;
  let words = wordsMemo.get(pdos);
  if (!words) wordsMemo.set(pdos, (words = pdos.map((text) => Number.parseInt(text.trim().replace(/^0x/i, ''), 16) >>> 0)));
  return words;
}
const VSAFE5V_1A5 = [0x0001_9096];

const pdpMemo = new WeakMap<readonly SourcePdo[], number>();
/** A source's PDP (W): its strongest fixed offer, memoised by the offers array (runs of one scenario share it). */
function pdpW(pdos: readonly SourcePdo[]): number {
  let watts = pdpMemo.get(pdos);
  if (watts === undefined) {
    watts = 0;
    for (const pdo of pdos) if (pdo.kind === 'fixed') watts = Math.max(watts, (pdo.voltageMv * pdo.maxCurrentMa) / 1e6);
    pdpMemo.set(pdos, (watts = Math.round(watts)));
  }
  return watts;
}

/** Some offer needs a 5 A cable: the source discovers the cable before its first offers. */
function needsFiveAmps(pdos: readonly SourcePdo[]): boolean {
  return pdos.some((pdo) => (pdo.kind === 'fixed' || pdo.kind === 'variable' || pdo.kind === 'pps') && pdo.maxCurrentMa > 3_000);
}

const sinkCapsMemo = new WeakMap<SinkPolicy, number[]>();
function sinkCapsOf(policy: SinkPolicy): number[] {
  let words = sinkCapsMemo.get(policy);
  if (!words) sinkCapsMemo.set(policy, (words = derivedSinkCaps(policy)));
  return words;
}

/** What a port's source policy engine may ask of the run (a class: no closures per run). */
class PortSourceContext implements SourceContext {
  private readonly pdp: { spr: number; epr: number };
  constructor(
    readonly offers: OffersFor,
    readonly eprCapable: boolean,
    readonly discoverCable: boolean,
    readonly swapAnswer: SwapAnswer,
    sprPdpW: number,
    eprPdpW: number,
    private readonly vbus: VbusPath,
  ) {
    this.pdp = { spr: sprPdpW, epr: eprPdpW };
  }
  pdpW(): { spr: number; epr: number } {
    return this.pdp;
  }
  vbusMv(): number {
    return this.vbus.vbusMv();
  }
}

/** One run's world. A class so that a run allocates its state, not a set of closures (hot path). */
class Run implements LineHooks {
  readonly durationUs: number;
  readonly clock = createClock();
  readonly random: Random;
  readonly queue = createHeap<Entry>();
  readonly book: FaultBook;
  readonly records: TraceRecord[] = [];
  readonly lanes: LaneEntry[] = [];
  readonly contracts: TimedContract[] = [];
  readonly portChanges: PortView[] = [];
  readonly timers = new TimerBook();
  readonly line: Line;
  readonly vbus: VbusPath;
  readonly samples: SampleBuffer | undefined;
  seq = 0;
  done = false;

  // The ports: each runs the policy engine of its power role (a PR_Swap exchanges them).
  readonly role: Record<Side, Side> = { source: 'source', sink: 'sink' };
  readonly dfp: Record<Side, boolean> = { source: true, sink: false };
  readonly pe: Record<Side, SourcePe | SinkPe>;
  readonly sourceContext: Record<Side, SourceContext>;
  readonly sinkContext: Record<Side, SinkContext>;
  readonly typec: Record<Side, TypecState> = { source: initialTypec('source'), sink: initialTypec('sink') };
  readonly prl: Record<LayerKey, ProtocolState> = { source: initialProtocol, sink: initialProtocol, "source'": initialProtocol, "sink'": initialProtocol, cable: initialProtocol };
  readonly chunks: Record<Side, ChunkState> = { source: initialChunks, sink: initialChunks };
  /** When each layer's last GoodCRC ends on the wire (µs). */
  readonly goodCrcEndUs: Partial<Record<LayerKey, number>> = {};
  readonly marker: EMarker | null;
  /** The port that last spoke on SOP' (the cable answers it). */
  primePort: Side = 'source';
  /** Rp as the source drives it now; sends waiting for SinkTxOK; a generation that voids deferred sends. */
  rp: 'default' | '1.5A' | '3.0A';
  awaitingTxOk: { port: Side; effect: SendEffect }[] = [];
  sendGen = 0;
  nextSampleUs = 0;
  private readonly offersOf: OffersFor;

  constructor(
    readonly scenario: Scenario,
    caps: { words: number[]; pdos: SourcePdo[] },
    readonly options: RunOptions,
  ) {
    this.durationUs = scenario.durationMs * 1_000;
    this.random = createRandom(scenario.seed);
    this.book = createFaultBook(scenario.faults);
    this.rp = scenario.source.behaviour.rp;
    // Bound methods and classes, not closures: a run is built thousands of times a second.
    const schedule: Scheduler = this.schedule.bind(this);
    this.line = new Line(this.clock, schedule, this.records, this.book, this);
    this.vbus = new VbusPath(
      this.clock,
      schedule,
      this.records,
      scenario.source.behaviour.slewMvPerMs / 1_000,
      power.rpCurrentMa(scenario.source.behaviour.rp),
      scenario.cable.resistanceMohm,
      scenario.sink.load.currentMa,
    );
    this.samples = options.sampleEveryUs ? createSampleBuffer(options.sampleEveryUs) : undefined;
    // A 5 A cable without an explicit e-marker still answers as 5 A, 20 V, not EPR capable (vector.md).
    const { eMarker, currentRatingMa } = scenario.cable;
    this.marker = eMarker ?? (currentRatingMa >= 5_000 ? { currentMa: 5_000, maxVoltageMv: 20_000, eprCapable: false } : null);
    const cableMa = (this.marker ?? UNMARKED_CABLE).currentMa === 5_000 ? Math.max(currentRatingMa, 5_000) : currentRatingMa;
    const eprWords = hexWords(scenario.source.eprCaps?.pdos) ?? null;
    const offers = offersFor(caps.words, eprWords, caps.pdos);
    const swapWords = hexWords(scenario.sink.swapCaps?.pdos) ?? VSAFE5V_1A5; // 5 V 1.5 A
    const swapOffers = offersFor(swapWords, null);
    const behaviour = scenario.source.behaviour;
    this.sourceContext = {
      source: new PortSourceContext(
        offers,
        eprWords !== null,
        eprWords !== null || needsFiveAmps(caps.pdos),
        behaviour.swapAnswer,
        pdpW(caps.pdos),
        eprWords ? pdpW(offers(this.marker, true).pdos) : 0,
        this.vbus,
      ),
      sink: new PortSourceContext(swapOffers, false, false, scenario.sink.behaviour.swapAnswer, pdpW(swapOffers(null, false).pdos), 0, this.vbus),
    };
    this.offersOf = offers;
    const mainSink: SinkContext = {
      cableMa,
      ownRevision: scenario.sink.specRevision,
      decodeOffers: this.decodedOffers.bind(this),
      eprPdpW: scenario.sink.epr?.pdpW ?? null,
      sinkCaps: hexWords(scenario.sink.caps?.pdos) ?? sinkCapsOf(scenario.sink.policy),
      swapAnswer: scenario.sink.behaviour.swapAnswer,
    };
    this.sinkContext = { sink: mainSink, source: { ...mainSink, ownRevision: scenario.source.specRevision, eprPdpW: null, sinkCaps: VSAFE5V_1A5, swapAnswer: behaviour.swapAnswer } };
    this.pe = { source: initialSourcePe(scenario.source.specRevision), sink: initialSinkPe(scenario.sink.specRevision, scenario.sink.policy) };
  }

  // ---- the line's hooks ----
  pending(layer: LayerKey) {
    return this.prl[layer].pending;
  }
  startReceiveTimer(layer: LayerKey, endUs: number): void {
    this.startTimer(layer, this.portOfLayer(layer), 'tReceive', endUs);
  }

  /** The sink's decode memo: the source's own offer arrays come back decoded (same result, no work). */
  decodedOffers(words: readonly number[]): SourcePdo[] | undefined {
    for (const cable of [null, this.marker]) {
      const offers = this.offersOf(cable, false);
      if (offers.words === words) return offers.pdos as SourcePdo[];
    }
    return undefined;
  }

  /** The body literal becomes the entry (no copy: this is the hot path). */
  schedule(tUs: number, body: EntryBody): void {
    body.tUs = tUs;
    body.seq = this.seq++;
    this.queue.push(body as Entry);
  }
  lane(side: Side, state: string): void {
    this.lanes.push({ t: this.clock.nowUs, side, state });
  }
  note(text: string): void {
    this.records.push({ t: this.clock.nowUs, note: text });
  }
  portOfLayer(layer: LayerKey): Side {
    return layer === 'sink' || layer === "sink'" ? 'sink' : 'source';
  }
  revisionOf(port: Side): Revision {
    return this.pe[port].revision;
  }
  portWithRole(role: Side): Side {
    return this.role.source === role ? 'source' : 'sink';
  }

  // ---- timers ----
  startTimer(layer: string, port: Side, name: TimerName, startUs = this.clock.nowUs): void {
    const durationUs = timerDurationUs(name, port, this.revisionOf(port), this.scenario, this.random);
    const gen = this.timers.start(layer, port, name, startUs, durationUs);
    this.schedule(startUs + durationUs, { kind: 'timer', layer, side: port, name, gen });
  }

  // ---- protocol layers ----
  runProtocol(layer: LayerKey, event: ProtocolEvent, partnerRevision: Revision = '3.0'): void {
    const port = this.portOfLayer(layer);
    const revision = layer === 'cable' ? '3.0' : this.revisionOf(port);
    const [next, effects] = protocolStep(this.prl[layer], event, countersFor(revision).nRetryCount);
    this.prl[layer] = next;
    for (const effect of effects) this.performProtocol(layer, effect, partnerRevision);
  }
  frameOf(layer: LayerKey, type: MessageType, objects: readonly number[], messageId: number, attempt: number): Frame {
    const port = this.portOfLayer(layer);
    const cable = layer === 'cable';
    const prime = cable || layer.endsWith("'");
    const bits = prime ? { roleBit: cable, dfp: false } : { roleBit: this.role[port] === 'source', dfp: this.dfp[port] };
    const revision = cable ? '3.0' : this.revisionOf(port);
    const header = packHeader(type, objects.length, messageId, bits, revision);
    // Faults name an Extended_Control by its own type (vector.md).
    const faultName = type === 'Extended_Control' ? (ECDB_NAMES[((objects[0] ?? 0) >>> 16) & 0xff] ?? type) : type;
    return { layer, sop: prime ? "SOP'" : 'SOP', from: cable ? 'cable' : this.role[port], type, objects, messageId, attempt, header, faultName };
  }
  performProtocol(layer: LayerKey, effect: ProtocolEffect, partnerRevision: Revision): void {
    const nowUs = this.clock.nowUs;
    const port = this.portOfLayer(layer);
    switch (effect.kind) {
      case 'transmit': {
        // The first copy after the port's processing time; a retry within tTransmit of the timeout.
        const delayUs = effect.attempt === 1 ? responseDelayUs(this.random) : this.random.between(TRANSMIT.minUs, TRANSMIT.maxUs);
        this.line.request(this.frameOf(layer, effect.type, effect.objects, effect.messageId, effect.attempt), nowUs + delayUs);
        return;
      }
      case 'good-crc':
        // tTransmit: the GoodCRC starts within 195 µs of the message's end (§6.6 Time Values).
        this.goodCrcEndUs[layer] = this.line.reserveGoodCrc(nowUs + this.random.between(TRANSMIT.minUs, TRANSMIT.maxUs), this.frameOf(layer, 'GoodCRC', [], effect.messageId, 0));
        return;
      case 'stop-crc-timer':
        this.timers.stop(layer, 'tReceive', nowUs);
        return;
      case 'deliver': {
        if (effect.type === 'other') return;
        if (layer === 'cable') return this.cableHeard(effect.type, effect.objects);
        if (layer !== port) return this.runPe(port, { kind: 'message', type: effect.type, objects: effect.objects, revision: partnerRevision, sop: "SOP'" });
        if (isExtendedType(effect.type)) return this.runChunks(port, { kind: 'received', type: effect.type, objects: effect.objects }, partnerRevision);
        return this.deliverToPe(port, effect.type, effect.objects, undefined, partnerRevision);
      }
      case 'sent':
      case 'failed': {
        if (layer === 'cable') return;
        const kind = effect.kind;
        if (layer !== port) return this.runPe(port, kind === 'sent' ? { kind, type: effect.type, sop: "SOP'" } : { kind, type: effect.type, sop: "SOP'" });
        if (isExtendedType(effect.type)) return this.runChunks(port, kind === 'sent' ? { kind, type: effect.type } : { kind, type: effect.type });
        return this.runPe(port, kind === 'sent' ? { kind, type: effect.type } : { kind, type: effect.type });
      }
      case 'discarded':
        if (layer === port) this.runPe(port, { kind: 'discarded', type: effect.type });
        return;
    }
  }
  deliverToPe(port: Side, type: MessageType, objects: readonly number[], bytes: readonly number[] | undefined, revision: Revision): void {
    const event: Extract<PeEvent, { kind: 'message' }> = bytes ? { kind: 'message', type, objects, bytes, revision } : { kind: 'message', type, objects, revision };
    if (this.role[port] === 'source' && (type === 'Request' || type === 'EPR_Request')) {
      const nowUs = this.clock.nowUs;
      if (faultsFor(this.book, ['reject'], 'sink', 'Request', nowUs).length > 0) {
        this.note('fault: the source answers Reject instead of Accept');
        event.reject = true;
      } else if (faultsFor(this.book, ['wait'], 'sink', 'Request', nowUs).length > 0) {
        this.note('fault: the source answers Wait instead of Accept');
        event.wait = true;
      }
    }
    this.runPe(port, event);
  }

  // ---- chunking of extended messages ----
  runChunks(port: Side, event: ChunkEvent, partnerRevision: Revision = '3.0'): void {
    const [next, effects] = chunkStep(this.chunks[port], event);
    this.chunks[port] = next;
    for (const effect of effects) this.performChunk(port, effect, partnerRevision);
  }
  performChunk(port: Side, effect: ChunkEffect, partnerRevision: Revision): void {
    switch (effect.kind) {
      case 'transmit':
        return this.runProtocol(port, { kind: 'send', type: effect.type, objects: effect.objects });
      case 'deliver':
        return this.deliverToPe(port, effect.type, [], effect.bytes, partnerRevision);
      case 'sent':
      case 'failed':
        return this.runPe(port, { kind: effect.kind, type: effect.type });
      case 'start-timer':
        return this.startTimer(port, port, effect.name);
      case 'stop-timer':
        return this.timers.stop(port, effect.name, this.clock.nowUs);
    }
  }

  // ---- the cable plug ----
  cableHeard(type: MessageType, objects: readonly number[]): void {
    // A passive cable answers Discover Identity REQ with its VDOs within tVDMReceiverResponse.
    if (type !== 'Vendor_Defined' || !this.marker || vdmCommandType(objects[0] ?? 0) !== 'REQ') return;
    this.schedule(this.clock.nowUs + responseDelayUs(this.random), { kind: 'cable-answer', objects: identityAck(this.marker) });
  }

  // ---- policy engines ----
  runPe(port: Side, event: PeEvent): void {
    const before = this.pe[port];
    let effects: PeEffect[];
    if (this.role[port] === 'source') {
      const [next, out] = sourceStep(before as SourcePe, event, this.sourceContext[port]);
      this.pe[port] = next;
      effects = out;
    } else {
      const [next, out] = sinkStep(before as SinkPe, event, this.sinkContext[port]);
      this.pe[port] = next;
      effects = out;
    }
    const next = this.pe[port];
    if (next.state !== before.state && next.state !== 'idle') this.lane(port, next.state);
    if (next.state !== before.state || next.contract !== before.contract || next.eprMode !== before.eprMode) {
      this.portChanges.push({ tUs: this.clock.nowUs, side: port, state: next.state, contract: next.contract, eprMode: next.eprMode });
    }
    for (const effect of effects) this.performPe(port, effect);
    // The source allows the sink to start exchanges again once it is back in Ready (§5.7).
    if (this.role[port] === 'source' && this.pe[port].state === 'PE_SRC_Ready' && before.state !== 'PE_SRC_Ready' && this.collisionAvoidance() && this.rp !== SINK_TX_OK) this.setRp(SINK_TX_OK);
  }
  performPe(port: Side, effect: PeEffect): void {
    const nowUs = this.clock.nowUs;
    switch (effect.kind) {
      case 'send':
        return this.sendGuarded(port, effect);
      case 'start-timer':
        return this.startTimer(port, port, effect.name, effect.afterGoodCrc ? Math.max(nowUs, this.goodCrcEndUs[port] ?? 0) : nowUs);
      case 'stop-timer':
        return this.timers.stop(port, effect.name, nowUs);
      case 'hard-reset':
        this.resetLayers(port);
        this.schedule(nowUs, { kind: 'hard-reset-tx', from: port });
        return;
      case 'protocol-reset':
        this.runProtocol(port, { kind: 'reset' });
        this.chunks[port] = initialChunks;
        return;
      case 'supply': {
        const overload = this.vbus.supply(port, effect.voltageMv, effect.limitMa, effect.floorMv ?? 0);
        if (overload) this.runPe(port, { kind: 'overload' });
        return;
      }
      case 'contract':
        if (this.role[port] === 'sink') {
          this.vbus.contract = effect.contract;
          if (effect.contract) this.contracts.push({ ...effect.contract, t: nowUs });
          if (effect.contract && this.options.untilContract) this.done = true;
        } else if (effect.contract === null) this.vbus.limitMa = null;
        return;
      case 'sink-mode':
        this.vbus.sinkMode = effect.mode;
        if (effect.mode === 'operating') {
          if (this.vbus.retarget()) this.runPe(this.portWithRole('source'), { kind: 'overload' });
          this.vbus.measure();
        }
        return;
      case 'error-recovery':
        return this.schedule(nowUs, { kind: 'error-recovery' });
      case 'data-role-swap':
        // Each port changes its own data role once the Accept has gone over (§6.3.9).
        this.dfp[port] = !this.dfp[port];
        return this.note(`${this.role[port]} port is now the ${this.dfp[port] ? 'DFP' : 'UFP'}`);
      case 'vconn-swap':
        return this.note(`VCONN swapped (the ${this.role[port]} port took part)`);
      case 'become':
        return this.become(port, effect.role);
      case 'note':
        return this.note(effect.text);
    }
  }

  /** Clears a port's layers on a Hard Reset: no queued or deferred transmission survives it. */
  resetLayers(port: Side): void {
    const nowUs = this.clock.nowUs;
    const prime: LayerKey = port === 'source' ? "source'" : "sink'";
    this.prl[port] = initialProtocol;
    this.prl[prime] = initialProtocol;
    this.chunks[port] = initialChunks;
    this.timers.stop(port, 'tReceive', nowUs);
    this.timers.stop(prime, 'tReceive', nowUs);
    this.timers.stop(port, 'tChunkSenderRequest', nowUs);
    this.timers.stop(port, 'tChunkSenderResponse', nowUs);
    this.sendGen++;
    this.awaitingTxOk = [];
  }

  // ---- collision avoidance (USB PD R3.2 V1.1 §5.7; rp events, trace.md) ----
  collisionAvoidance(): boolean {
    return this.pe.source.revision === '3.0' && this.pe.sink.revision === '3.0' && this.pe[this.portWithRole('source')].contract !== null;
  }
  setRp(rp: '1.5A' | '3.0A'): void {
    this.rp = rp;
    this.records.push({ t: this.clock.nowUs, event: 'rp', from: 'source', rp });
    if (rp !== SINK_TX_OK) return;
    const waiting = this.awaitingTxOk;
    this.awaitingTxOk = [];
    for (const { port, effect } of waiting) this.send(port, effect);
  }
  sendGuarded(port: Side, effect: SendEffect): void {
    if (!effect.initiate || !this.collisionAvoidance()) return this.send(port, effect);
    if (this.role[port] === 'source') {
      // The source sets SinkTxNG and waits tSinkTx before it starts its own exchange.
      if (this.rp !== SINK_TX_NG) this.setRp(SINK_TX_NG);
      const t = timersPd3.tSinkTx;
      this.schedule(this.clock.nowUs + this.random.between(t.minUs, t.maxUs), { kind: 'deferred-send', port, effect, gen: this.sendGen });
      return;
    }
    // The sink starts an exchange only while Rp says SinkTxOK.
    if (this.rp === SINK_TX_NG) this.awaitingTxOk.push({ port, effect });
    else this.send(port, effect);
  }
  send(port: Side, effect: SendEffect): void {
    if (effect.sop === "SOP'") {
      this.primePort = port;
      return this.runProtocol(port === 'source' ? "source'" : "sink'", { kind: 'send', type: effect.type, objects: effect.objects });
    }
    if (effect.bytes && isExtendedType(effect.type)) return this.runChunks(port, { kind: 'send', type: effect.type as ExtendedType, bytes: effect.bytes });
    this.runProtocol(port, { kind: 'send', type: effect.type, objects: effect.objects });
  }

  // ---- power role swap and ErrorRecovery ----
  become(port: Side, role: Side): void {
    this.role[port] = role;
    if (role === 'source') {
      this.pe[port] = { ...initialSourcePe(this.revisionOf(port)), phase: 'on' };
    } else {
      const policy: SinkPolicy = this.scenario.source.swapPolicy ?? { kind: 'max-power' };
      this.pe[port] = initialSinkPe(this.revisionOf(port), policy);
      this.vbus.contract = null;
      this.vbus.loadMa = null;
    }
    this.runPe(port, { kind: 'start' });
  }
  errorRecovery(): void {
    const nowUs = this.clock.nowUs;
    this.records.push({ t: nowUs, event: 'detach' });
    for (const port of SIDES) {
      this.resetLayers(port);
      this.timers.stopLayer(port, nowUs);
      this.role[port] = port;
      // Both ports still see the VBUS the source drove until it has discharged to vSafe0V.
      this.typec[port] = initialTypec(port, this.vbus.sinkVbusPresent);
      this.lane(port, this.typec[port].state);
    }
    this.prl.cable = initialProtocol;
    this.dfp.source = true;
    this.dfp.sink = false;
    this.pe.source = initialSourcePe(this.scenario.source.specRevision);
    this.pe.sink = initialSinkPe(this.scenario.sink.specRevision, this.scenario.sink.policy);
    for (const port of SIDES) this.portChanges.push({ tUs: nowUs, side: port, state: this.typec[port].state, contract: null, eprMode: false });
    this.rp = this.scenario.source.behaviour.rp;
    this.vbus.contract = null;
    this.vbus.sinkMode = 'off';
    this.vbus.setMv = 0;
    this.vbus.limitMa = null;
    this.vbus.startRamp(0, 'typec');
    const t = timersPd3.tErrorRecovery;
    this.schedule(nowUs + this.random.between(t.minUs, t.maxUs), { kind: 'cc' });
  }

  runTypec(side: Side, event: TypecEvent): void {
    const before = this.typec[side].state;
    const [next, effects] = typecStep(this.typec[side], event);
    this.typec[side] = next;
    if (next.state !== before) this.lane(side, next.state);
    for (const effect of effects) {
      if (effect.kind === 'start-debounce') {
        this.schedule(this.clock.nowUs + this.random.between(CC_DEBOUNCE.minUs, CC_DEBOUNCE.maxUs), { kind: 'debounced', side });
      } else if (effect.kind === 'vbus-on') {
        this.vbus.setMv = 5_000;
        this.vbus.supplier = side;
        this.vbus.startRamp(5_000, 'typec');
      } else if (side === 'sink') this.runPe('sink', { kind: 'start' });
    }
  }

  // ---- the loop ----
  dispatch(entry: Entry): void {
    const nowUs = this.clock.nowUs;
    switch (entry.kind) {
      case 'cc':
        this.records.push({ t: nowUs, event: 'attach', cc: 'CC1', rp: this.scenario.source.behaviour.rp });
        this.runTypec('source', { kind: 'cc' });
        this.runTypec('sink', { kind: 'cc' });
        return;
      case 'debounced':
        return this.runTypec(entry.side, { kind: 'debounced' });
      case 'timer': {
        if (!this.timers.expire(entry.layer, entry.name, entry.gen)) return;
        if (entry.name === 'tReceive') return this.runProtocol(entry.layer as LayerKey, { kind: 'crc-timeout' });
        if (CHUNK_TIMERS.has(entry.name)) return this.runChunks(entry.side, { kind: 'timer', name: entry.name });
        return this.runPe(entry.side, { kind: 'timer', name: entry.name });
      }
      case 'tx':
        return this.line.transmit(entry.frame);
      case 'hard-reset-tx':
        return this.line.hardReset(entry.from, this.role[entry.from]);
      case 'arrive':
        return this.arrive(entry.frame, entry.corrupt);
      case 'hard-reset-arrive':
        this.resetLayers(entry.to);
        if (this.pe[entry.to].state !== 'idle') this.runPe(entry.to, { kind: 'hard-reset-received' });
        return;
      case 'ramp-end': {
        if (entry.gen !== this.vbus.gen) return;
        if (this.vbus.ramp.toMv > 0 || this.vbus.ramp.fromMv > 0) this.vbus.measure();
        if (this.vbus.owner === 'typec') {
          const sourcePort = this.portWithRole('source');
          if (this.pe[sourcePort].state === 'idle' && this.vbus.setMv > 0) this.runPe(sourcePort, { kind: 'start' });
        } else if (this.vbus.owner === 'pe') {
          const supplier = this.vbus.supplier;
          const psRdyDue = this.pe[supplier].state === 'PE_SRC_Transition_Supply';
          const withhold = psRdyDue && faultsFor(this.book, ['no-ps-rdy'], 'source', 'PS_RDY', nowUs).length > 0;
          this.runPe(supplier, { kind: 'supply-ready', withholdPsRdy: withhold });
        }
        return;
      }
      case 'vbus-cross': {
        if (entry.gen !== this.vbus.gen) return;
        this.vbus.sinkVbusPresent = entry.present;
        const sinkPort = this.portWithRole('sink');
        this.runTypec(sinkPort, { kind: 'vbus', present: entry.present });
        // The source waits in AttachWait.SRC for vSafe0V after ErrorRecovery (typec.ts).
        this.runTypec(otherSide(sinkPort), { kind: 'vbus', present: entry.present });
        if (this.pe[sinkPort].state !== 'idle' && this.role[sinkPort] === 'sink') this.runPe(sinkPort, { kind: 'vbus', present: entry.present });
        return;
      }
      case 'policy': {
        const change = this.scenario.sink.changes[entry.index];
        if (change) this.runPe(this.portWithRole('sink'), { kind: 'policy', policy: change.policy });
        return;
      }
      case 'action': {
        const action = this.scenario.actions[entry.index];
        if (action) this.runPe(this.portWithRole(action.by), { kind: 'action', action: action.action });
        return;
      }
      case 'load':
        this.vbus.loadMa = entry.currentMa;
        if (this.vbus.retarget()) this.runPe(this.portWithRole('source'), { kind: 'overload' });
        this.vbus.measure();
        return;
      case 'deferred-send':
        if (entry.gen === this.sendGen) this.send(entry.port, entry.effect);
        return;
      case 'cable-answer':
        return this.runProtocol('cable', { kind: 'send', type: 'Vendor_Defined', objects: entry.objects });
      case 'error-recovery':
        return this.errorRecovery();
      case 'measure':
        if (this.vbus.vbusMv() > power.VSAFE0V_MAX_MV) this.vbus.measure();
        if (nowUs + MEASURE_EVERY_US < this.durationUs) this.schedule(nowUs + MEASURE_EVERY_US, { kind: 'measure' });
        return;
      case 'end':
        this.done = true;
        return;
    }
  }

  arrive(frame: Frame, corrupt: boolean): void {
    if (corrupt) return;
    const event: ProtocolEvent =
      frame.type === 'GoodCRC' ? { kind: 'good-crc', messageId: frame.messageId } : { kind: 'received', type: frame.type, messageId: frame.messageId, objects: frame.objects };
    if (frame.sop === "SOP'") {
      // The cable plug listens only when it has an e-marker; its answer goes to the port that asked.
      if (frame.layer === 'cable') this.runProtocol(this.primePort === 'source' ? "source'" : "sink'", event, '3.0');
      else if (this.marker) this.runProtocol('cable', event, this.revisionOf(this.portOfLayer(frame.layer)));
      return;
    }
    const to = otherSide(this.portOfLayer(frame.layer));
    // A port's protocol layer listens once Type-C is attached and its policy engine runs.
    if (this.pe[to].state === 'idle') return;
    this.runProtocol(to, event, this.revisionOf(this.portOfLayer(frame.layer)));
  }

  execute(): RunOutput {
    const { scenario, options, durationUs, clock } = this;
    this.lane('source', this.typec.source.state);
    this.lane('sink', this.typec.sink.state);
    this.schedule(0, { kind: 'cc' });
    this.schedule(MEASURE_EVERY_US, { kind: 'measure' });
    scenario.sink.changes.forEach((change, index) => this.schedule(change.atMs * 1_000, { kind: 'policy', index }));
    scenario.actions.forEach((action, index) => this.schedule(action.atMs * 1_000, { kind: 'action', index }));
    for (const step of scenario.sink.load.steps) this.schedule(step.atMs * 1_000, { kind: 'load', currentMa: step.currentMa });
    this.schedule(durationUs, { kind: 'end' });

    const everyUs = options.sampleEveryUs ?? 0;
    let handled = 0;
    let stopped = false;
    const progressEveryUs = Math.max(1, Math.floor(durationUs / 100));
    let nextProgressUs = progressEveryUs;
    while (!this.done) {
      const entry = this.queue.pop();
      if (!entry || entry.tUs > durationUs) break;
      if (this.samples) this.vbus.sampleUntil(this.samples, everyUs, entry.tUs, durationUs);
      clock.advanceTo(entry.tUs);
      this.dispatch(entry);
      // The stop check runs every 256 events and at each percent of simulated time.
      const checkpoint = clock.nowUs >= nextProgressUs;
      if (checkpoint) nextProgressUs = clock.nowUs + progressEveryUs;
      if (((++handled & 0xff) === 0 || checkpoint) && options.shouldStop?.()) {
        stopped = true;
        break;
      }
      if (checkpoint) options.onProgress?.(Math.min(1, clock.nowUs / durationUs));
    }
    if (this.samples) this.vbus.sampleUntil(this.samples, everyUs, clock.nowUs + 1, durationUs);
    this.timers.close(clock.nowUs);
    options.onProgress?.(1);
    const output: RunOutput = {
      records: this.records,
      lanes: this.lanes,
      timers: this.timers.spans,
      contracts: this.contracts,
      contract: this.vbus.contract,
      ports: this.portViews(),
      endUs: clock.nowUs,
      stopped,
    };
    if (this.samples) output.samples = this.samples.finish();
    return output;
  }

  finalView(port: Side): PortView {
    const pe = this.pe[port];
    const state = pe.state === 'idle' ? this.typec[port].state : pe.state;
    return { tUs: this.clock.nowUs, side: port, state, contract: pe.contract, eprMode: pe.eprMode };
  }
  portViews(): PortViews {
    return { changes: this.portChanges, final: { source: this.finalView('source'), sink: this.finalView('sink') } };
  }
}

const ECDB_NAMES: Record<number, string> = { 1: 'EPR_Get_Source_Cap', 2: 'EPR_Get_Sink_Cap', 3: 'EPR_KeepAlive', 4: 'EPR_KeepAlive_Ack' };
