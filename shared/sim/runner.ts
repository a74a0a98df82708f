/**
 * The thin runner: one discrete-event loop that owns the clock, the timer queue, the wire and the
 * power path, feeds events to the pure actors (typec.ts, protocol.ts, source-pe.ts, sink-pe.ts)
 * and performs their effects. Everything it records is a plain record; simulate.ts dresses it up.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor, timersPd3, type TimerName } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { MessageRecord, TraceRecord } from '../trace/records.ts';
import { createClock } from './clock.ts';
import { createFaultBook, faultsFor, isSilent, type FaultBook } from './faults.ts';
import { createHeap } from './heap.ts';
import type { PeEffect, PeEvent, SinkMode } from './pe-types.ts';
import * as power from './power.ts';
import { initialProtocol, protocolStep, type ProtocolEffect, type ProtocolEvent, type ProtocolState } from './protocol.ts';
import { createRandom, type Random } from './random.ts';
import type { Scenario } from './scenario.ts';
import { initialSinkPe, sinkStep, type SinkContext, type SinkPe } from './sink-pe.ts';
import { initialSourcePe, sourceStep, type SourceContext, type SourcePe } from './source-pe.ts';
import { responseDelayUs, timerDurationUs } from './timing.ts';
import { initialTypec, typecStep, type TypecEvent, type TypecState } from './typec.ts';
import type { PortView, PortViews } from './port-views.ts';
import { otherSide, type LaneEntry, type Side, type TimedContract, type TimerSpan } from './types.ts';
import { frameHex, HARD_RESET_DURATION_US, packetDurationUs, packHeader, type MessageType, type Revision } from './wire.ts';

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
  samples?: [number, number, number, number][];
  endUs: number;
  stopped: boolean;
}

interface Frame {
  from: Side;
  type: MessageType;
  objects: readonly number[];
  messageId: number;
  /** 0 for a GoodCRC, else the protocol layer's attempt number. */
  attempt: number;
}

type Entry = { tUs: number; seq: number } & (
  | { kind: 'cc' }
  | { kind: 'debounced'; side: Side }
  | { kind: 'timer'; side: Side; name: TimerName; gen: number }
  | { kind: 'tx'; frame: Frame }
  | { kind: 'hard-reset-tx'; from: Side }
  | { kind: 'arrive'; frame: Frame; corrupt: boolean }
  | { kind: 'hard-reset-arrive'; to: Side }
  | { kind: 'ramp-end'; gen: number }
  | { kind: 'vbus-cross'; present: boolean; gen: number }
  | { kind: 'policy'; index: number }
  | { kind: 'load'; currentMa: number }
  | { kind: 'measure' }
  | { kind: 'end' }
);

type EntryBody = Entry extends infer E ? (E extends Entry ? Omit<E, 'tUs' | 'seq'> & { tUs?: number; seq?: number } : never) : never;

const INTER_FRAME_GAP_US = timersPd3.tInterFrameGap.minUs;
const MEASURE_EVERY_US = 1_000_000;
const TRANSMIT = timersPd3.tTransmit;
const CC_DEBOUNCE = timersPd3.tCCDebounce;

/** Runs one scenario to its end (or the first contract, or a stop request). */
export function runScenario(scenario: Scenario, caps: { words: number[]; pdos: SourcePdo[] }, options: RunOptions = {}): RunOutput {
  return new Run(scenario, caps, options).execute();
}

/** One run's world. A class so that a run allocates its state, not a set of closures (hot path). */
class Run {
  readonly durationUs: number;
  readonly clock = createClock();
  readonly random: Random;
  readonly queue = createHeap<Entry>();
  readonly book: FaultBook;
  readonly rpMa: number;
  readonly slewMvPerUs: number;
  readonly sourceContext: SourceContext;
  readonly sinkContext: SinkContext;

  readonly records: TraceRecord[] = [];
  readonly lanes: LaneEntry[] = [];
  readonly timers: TimerSpan[] = [];
  readonly contracts: TimedContract[] = [];
  readonly portChanges: PortView[] = [];
  readonly samples: [number, number, number, number][] | undefined;
  seq = 0;

  // Actors' states.
  readonly typec: Record<Side, TypecState> = { source: initialTypec('source'), sink: initialTypec('sink') };
  readonly prl: Record<Side, ProtocolState> = { source: initialProtocol, sink: initialProtocol };
  src: SourcePe;
  snk: SinkPe;
  readonly running: Record<Side, Partial<Record<TimerName, { gen: number; span: TimerSpan }>>> = { source: {}, sink: {} };
  timerGen = 0;
  /** When each port's last GoodCRC ends on the wire (µs). */
  readonly goodCrcEndUs: Record<Side, number> = { source: 0, sink: 0 };

  // The wire and the power path.
  lineFreeUs = 0;
  ramp: power.VbusRamp;
  rampGen = 0;
  rampOwner: 'typec' | 'pe' | 'load' = 'typec';
  setMv = 0;
  limitMa: number | null = null;
  sinkMode: SinkMode = 'off';
  sinkVbusPresent = false;
  loadMa: number | null;
  sinkContract: Contract | null = null;
  done = false;
  nextSampleUs = 0;

  constructor(
    readonly scenario: Scenario,
    caps: { words: number[]; pdos: SourcePdo[] },
    readonly options: RunOptions,
  ) {
    this.durationUs = scenario.durationMs * 1_000;
    this.random = createRandom(scenario.seed);
    this.book = createFaultBook(scenario.faults);
    this.rpMa = power.rpCurrentMa(scenario.source.behaviour.rp);
    this.slewMvPerUs = scenario.source.behaviour.slewMvPerMs / 1_000;
    this.sourceContext = { words: caps.words, pdos: caps.pdos };
    this.sinkContext = { cableMa: scenario.cable.currentRatingMa, ownRevision: scenario.sink.specRevision, decodeOffers: (words) => (words === caps.words ? caps.pdos : undefined) };
    this.samples = options.sampleEveryUs ? [] : undefined;
    this.src = initialSourcePe(scenario.source.specRevision);
    this.snk = initialSinkPe(scenario.sink.specRevision, scenario.sink.policy);
    this.ramp = { startUs: 0, fromMv: 0, toMv: 0, mvPerUs: this.slewMvPerUs };
    this.loadMa = scenario.sink.load.currentMa ?? null;
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
  operatingMa(): number {
    return this.loadMa ?? this.sinkContract?.currentMa ?? power.SINK_DEFAULT_MA;
  }
  ibusAt(mv: number): number {
    const draw = power.sinkDrawMa(this.sinkMode, this.operatingMa(), mv, this.rpMa);
    return this.limitMa === null ? draw : Math.min(draw, this.limitMa);
  }
  measure(): void {
    const mv = power.vbusAtUs(this.ramp, this.clock.nowUs);
    this.records.push({ t: this.clock.nowUs, vbus: { mv, ma: this.ibusAt(mv) } });
  }
  revisionOf(side: Side): Revision {
    return side === 'source' ? this.src.revision : this.snk.revision;
  }

  // ---- timers ----
  startTimer(side: Side, name: TimerName, startUs = this.clock.nowUs): void {
    this.stopTimer(side, name);
    const span: TimerSpan = { name, side, startUs, endUs: startUs + timerDurationUs(name, side, this.revisionOf(side), this.scenario, this.random), expired: false };
    const gen = ++this.timerGen;
    this.running[side][name] = { gen, span };
    this.timers.push(span);
    this.schedule(span.endUs, { kind: 'timer', side, name, gen });
  }
  stopTimer(side: Side, name: TimerName): void {
    const timer = this.running[side][name];
    if (!timer) return;
    timer.span.endUs = Math.max(timer.span.startUs, this.clock.nowUs);
    this.running[side][name] = undefined;
  }

  // ---- power ----
  startRamp(toMv: number, owner: Run['rampOwner']): void {
    const nowUs = this.clock.nowUs;
    const fromMv = power.vbusAtUs(this.ramp, nowUs);
    this.ramp = { startUs: nowUs, fromMv, toMv, mvPerUs: toMv < fromMv && this.setMv === 0 ? power.DISCHARGE_MV_PER_US : this.slewMvPerUs };
    this.rampOwner = owner;
    const gen = ++this.rampGen;
    this.schedule(power.rampEndUs(this.ramp), { kind: 'ramp-end', gen });
    const crossing = power.crossingUs(this.ramp, this.sinkVbusPresent ? power.VSAFE0V_MAX_MV : power.VSAFE5V_MIN_MV);
    if (crossing !== null) this.schedule(crossing, { kind: 'vbus-cross', present: !this.sinkVbusPresent, gen });
  }
  /** The source's output after any current limit: a new ramp when the load moved it. */
  retarget(): void {
    const draw = power.sinkDrawMa(this.sinkMode, this.operatingMa(), this.setMv, this.rpMa);
    const target = power.foldBack(this.setMv, this.limitMa, draw).voltageMv;
    if (target === this.ramp.toMv) return;
    const stillPe = this.rampOwner === 'pe' && this.clock.nowUs < power.rampEndUs(this.ramp);
    this.startRamp(target, stillPe ? 'pe' : 'load');
  }

  // ---- the wire ----
  requestTx(frame: Frame, earliestUs: number): void {
    if (frame.type !== 'GoodCRC') {
      for (const fault of faultsFor(this.book, ['delay'], frame.from, frame.type, this.clock.nowUs)) earliestUs += (fault.delayMs ?? 0) * 1_000;
    }
    this.schedule(earliestUs, { kind: 'tx', frame });
  }
  onTx(frame: Frame): void {
    const nowUs = this.clock.nowUs;
    const pending = this.prl[frame.from].pending;
    if (frame.attempt > 0 && (pending === null || pending.messageId !== frame.messageId || pending.attempts !== frame.attempt)) return;
    if (frame.attempt > 0 && nowUs < this.lineFreeUs) {
      this.schedule(this.lineFreeUs, { kind: 'tx', frame });
      return;
    }
    const endUs = nowUs + packetDurationUs(frame.objects.length);
    if (frame.attempt > 0) this.startTimer(frame.from, 'tReceive', endUs);
    if (isSilent(this.book, frame.from, frame.type, nowUs)) return;
    this.lineFreeUs = endUs + INTER_FRAME_GAP_US;
    const dropped = faultsFor(this.book, ['drop'], frame.from, frame.type, nowUs).length > 0;
    // A dropped message never reaches the partner's port, so the port's trace holds a note, not the message.
    if (dropped) {
      this.note(`fault: ${frame.type} #${frame.messageId} from ${frame.from} dropped`);
      return;
    }
    const corrupt = faultsFor(this.book, ['corrupt'], frame.from, frame.type, nowUs).length > 0;
    const header = packHeader(frame.type, frame.objects.length, frame.messageId, frame.from, this.revisionOf(frame.from));
    const record: MessageRecord = { t: nowUs, msg: frameHex(header, frame.objects), from: frame.from };
    if (corrupt) record.crcOk = false;
    this.records.push(record);
    this.schedule(endUs, { kind: 'arrive', frame, corrupt });
  }
  onHardResetTx(from: Side): void {
    const nowUs = this.clock.nowUs;
    if (nowUs < this.lineFreeUs) {
      this.schedule(this.lineFreeUs, { kind: 'hard-reset-tx', from });
      return;
    }
    if (isSilent(this.book, from, 'Hard_Reset', nowUs)) return;
    this.lineFreeUs = nowUs + HARD_RESET_DURATION_US + INTER_FRAME_GAP_US;
    this.records.push({ t: nowUs, event: 'hard_reset', from });
    if (faultsFor(this.book, ['drop'], from, 'Hard_Reset', nowUs).length > 0) this.note(`fault: Hard_Reset from ${from} dropped`);
    else this.schedule(nowUs + HARD_RESET_DURATION_US, { kind: 'hard-reset-arrive', to: otherSide(from) });
  }
  onArrive(frame: Frame, corrupt: boolean): void {
    const to = otherSide(frame.from);
    // A port's protocol layer listens once Type-C is attached and its policy engine runs.
    if (corrupt || (to === 'source' ? this.src.state === 'idle' : this.snk.state === 'idle')) return;
    const event: ProtocolEvent =
      frame.type === 'GoodCRC'
        ? { kind: 'good-crc', messageId: frame.messageId }
        : { kind: 'received', type: frame.type, messageId: frame.messageId, objects: frame.objects };
    this.runProtocol(to, event, this.revisionOf(frame.from));
  }

  // ---- actors ----
  runProtocol(side: Side, event: ProtocolEvent, partnerRevision: Revision = '3.0'): void {
    const [next, effects] = protocolStep(this.prl[side], event, countersFor(this.revisionOf(side)).nRetryCount);
    this.prl[side] = next;
    for (const effect of effects) this.performProtocol(side, effect, partnerRevision);
  }
  performProtocol(side: Side, effect: ProtocolEffect, partnerRevision: Revision): void {
    const nowUs = this.clock.nowUs;
    switch (effect.kind) {
      case 'transmit': {
        // The first copy after the port's processing time; a retry within tTransmit of the timeout.
        const delayUs = effect.attempt === 1 ? responseDelayUs(this.random) : this.random.between(TRANSMIT.minUs, TRANSMIT.maxUs);
        this.requestTx({ from: side, type: effect.type, objects: effect.objects, messageId: effect.messageId, attempt: effect.attempt }, nowUs + delayUs);
        return;
      }
      case 'good-crc': {
        // tTransmit: the GoodCRC starts within 195 µs of the message's end (§6.6 Time Values); the
        // line is held for it, so no other message of this port can slip in first.
        const startUs = Math.max(nowUs + this.random.between(TRANSMIT.minUs, TRANSMIT.maxUs), this.lineFreeUs);
        this.goodCrcEndUs[side] = startUs + packetDurationUs(0);
        this.lineFreeUs = this.goodCrcEndUs[side] + INTER_FRAME_GAP_US;
        this.schedule(startUs, { kind: 'tx', frame: { from: side, type: 'GoodCRC', objects: [], messageId: effect.messageId, attempt: 0 } });
        return;
      }
      case 'stop-crc-timer':
        this.stopTimer(side, 'tReceive');
        return;
      case 'deliver': {
        const event: PeEvent = { kind: 'message', type: effect.type, objects: effect.objects, revision: partnerRevision };
        if (side === 'source' && effect.type === 'Request' && faultsFor(this.book, ['reject'], 'sink', 'Request', nowUs).length > 0) {
          this.note('fault: the source answers Reject instead of Accept');
          this.runPe(side, { ...event, reject: true });
        } else this.runPe(side, event);
        return;
      }
      case 'sent':
        this.runPe(side, { kind: 'sent', type: effect.type });
        return;
      case 'failed':
        this.runPe(side, { kind: 'failed', type: effect.type });
        return;
      case 'discarded':
        this.runPe(side, { kind: 'discarded', type: effect.type });
        return;
    }
  }
  runPe(side: Side, event: PeEvent): void {
    if (side === 'source') {
      const before = this.src;
      const [next, effects] = sourceStep(this.src, event, this.sourceContext);
      this.src = next;
      if (next.state !== before.state && next.state !== 'idle') this.lane('source', next.state);
      if (next.state !== before.state || next.contract !== before.contract) this.portChanged('source', next.state, next.contract);
      for (const effect of effects) this.performPe('source', effect);
    } else {
      const before = this.snk;
      const [next, effects] = sinkStep(this.snk, event, this.sinkContext);
      this.snk = next;
      if (next.state !== before.state && next.state !== 'idle') this.lane('sink', next.state);
      if (next.state !== before.state || next.contract !== before.contract) this.portChanged('sink', next.state, next.contract);
      for (const effect of effects) this.performPe('sink', effect);
    }
  }
  portChanged(side: Side, state: string, contract: Contract | null): void {
    this.portChanges.push({ tUs: this.clock.nowUs, side, state, contract, eprMode: false });
  }
  portViews(): PortViews {
    const finalOf = (side: Side): PortView => {
      const pe = side === 'source' ? this.src : this.snk;
      const state = pe.state === 'idle' ? this.typec[side].state : pe.state;
      return { tUs: this.clock.nowUs, side, state, contract: pe.contract, eprMode: false };
    };
    return { changes: this.portChanges, final: { source: finalOf('source'), sink: finalOf('sink') } };
  }
  performPe(side: Side, effect: PeEffect): void {
    switch (effect.kind) {
      case 'send':
        this.runProtocol(side, { kind: 'send', type: effect.type, objects: effect.objects });
        return;
      case 'start-timer':
        this.startTimer(side, effect.name, effect.afterGoodCrc ? Math.max(this.clock.nowUs, this.goodCrcEndUs[side]) : this.clock.nowUs);
        return;
      case 'stop-timer':
        this.stopTimer(side, effect.name);
        return;
      case 'hard-reset':
        this.prl[side] = initialProtocol;
        this.stopTimer(side, 'tReceive');
        this.schedule(this.clock.nowUs, { kind: 'hard-reset-tx', from: side });
        return;
      case 'protocol-reset':
        this.runProtocol(side, { kind: 'reset' });
        return;
      case 'supply':
        this.setMv = effect.voltageMv;
        this.limitMa = effect.limitMa;
        this.startRamp(power.foldBack(this.setMv, this.limitMa, power.sinkDrawMa(this.sinkMode, this.operatingMa(), this.setMv, this.rpMa)).voltageMv, 'pe');
        return;
      case 'contract':
        if (side === 'sink') {
          this.sinkContract = effect.contract;
          if (effect.contract) this.contracts.push({ ...effect.contract, t: this.clock.nowUs });
          if (effect.contract && this.options.untilContract) this.done = true;
        } else if (effect.contract === null) this.limitMa = null;
        return;
      case 'sink-mode':
        this.sinkMode = effect.mode;
        if (effect.mode === 'operating') {
          this.retarget();
          this.measure();
        }
        return;
      case 'note':
        this.note(effect.text);
        return;
    }
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
        this.setMv = 5_000;
        this.startRamp(5_000, 'typec');
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
        this.runTypec(entry.side, { kind: 'debounced' });
        return;
      case 'timer': {
        const timer = this.running[entry.side][entry.name];
        if (!timer || timer.gen !== entry.gen) return;
        timer.span.expired = true;
        this.running[entry.side][entry.name] = undefined;
        if (entry.name === 'tReceive') this.runProtocol(entry.side, { kind: 'crc-timeout' });
        else this.runPe(entry.side, { kind: 'timer', name: entry.name });
        return;
      }
      case 'tx':
        this.onTx(entry.frame);
        return;
      case 'hard-reset-tx':
        this.onHardResetTx(entry.from);
        return;
      case 'arrive':
        this.onArrive(entry.frame, entry.corrupt);
        return;
      case 'hard-reset-arrive':
        this.prl[entry.to] = initialProtocol;
        this.stopTimer(entry.to, 'tReceive');
        if ((entry.to === 'source' ? this.src.state : this.snk.state) !== 'idle') this.runPe(entry.to, { kind: 'hard-reset-received' });
        return;
      case 'ramp-end':
        if (entry.gen !== this.rampGen) return;
        if (this.ramp.toMv > 0 || this.ramp.fromMv > 0) this.measure();
        if (this.rampOwner === 'typec') {
          if (this.src.state === 'idle') this.runPe('source', { kind: 'start' });
        } else if (this.rampOwner === 'pe') {
          const psRdyDue = this.src.state === 'PE_SRC_Transition_Supply';
          const withhold = psRdyDue && faultsFor(this.book, ['no-ps-rdy'], 'source', 'PS_RDY', nowUs).length > 0;
          this.runPe('source', { kind: 'supply-ready', withholdPsRdy: withhold });
        }
        return;
      case 'vbus-cross':
        if (entry.gen !== this.rampGen) return;
        this.sinkVbusPresent = entry.present;
        this.runTypec('sink', { kind: 'vbus', present: entry.present });
        if (this.snk.state !== 'idle') this.runPe('sink', { kind: 'vbus', present: entry.present });
        return;
      case 'policy': {
        const change = this.scenario.sink.changes[entry.index];
        if (change) this.runPe('sink', { kind: 'policy', policy: change.policy });
        return;
      }
      case 'load':
        this.loadMa = entry.currentMa;
        this.retarget();
        this.measure();
        return;
      case 'measure':
        if (power.vbusAtUs(this.ramp, nowUs) > power.VSAFE0V_MAX_MV) this.measure();
        if (nowUs + MEASURE_EVERY_US < this.durationUs) this.schedule(nowUs + MEASURE_EVERY_US, { kind: 'measure' });
        return;
      case 'end':
        this.done = true;
        return;
    }
  }

  /** Samples `[t, mv, ma, sinkMv]` for every sample time before `tUs` (the power path is piecewise linear). */
  sampleUntil(tUs: number): void {
    const samples = this.samples;
    const everyUs = this.options.sampleEveryUs ?? 0;
    if (!samples || everyUs <= 0) return;
    while (this.nextSampleUs < tUs && this.nextSampleUs <= this.durationUs) {
      const mv = power.vbusAtUs(this.ramp, this.nextSampleUs);
      const ma = this.ibusAt(mv);
      samples.push([this.nextSampleUs, mv, ma, power.sinkSideMv(mv, ma, this.scenario.cable.resistanceMohm)]);
      this.nextSampleUs += everyUs;
    }
  }

  execute(): RunOutput {
    const { scenario, options, durationUs, clock } = this;
    this.lane('source', this.typec.source.state);
    this.lane('sink', this.typec.sink.state);
    this.schedule(0, { kind: 'cc' });
    this.schedule(MEASURE_EVERY_US, { kind: 'measure' });
    scenario.sink.changes.forEach((change, index) => this.schedule(change.atMs * 1_000, { kind: 'policy', index }));
    for (const step of scenario.sink.load.steps) this.schedule(step.atMs * 1_000, { kind: 'load', currentMa: step.currentMa });
    this.schedule(durationUs, { kind: 'end' });

    let handled = 0;
    let stopped = false;
    const progressEveryUs = Math.max(1, Math.floor(durationUs / 100));
    let nextProgressUs = progressEveryUs;
    while (!this.done) {
      const entry = this.queue.pop();
      if (!entry || entry.tUs > durationUs) break;
      this.sampleUntil(entry.tUs);
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
    this.sampleUntil(clock.nowUs + 1);
    for (const side of ['source', 'sink'] as const) {
      for (const timer of Object.values(this.running[side])) if (timer) timer.span.endUs = Math.min(timer.span.endUs, clock.nowUs);
    }
    options.onProgress?.(1);
    const { records, lanes, timers, contracts, samples } = this;
    return { records, lanes, timers, contracts, contract: this.sinkContract, ports: this.portViews(), samples, endUs: clock.nowUs, stopped };
  }
}
