/**
 * The thin runner: one discrete-event loop that owns the clock, the timer queue, the wire and the
 * power path, feeds events to the pure actors (typec.ts, protocol.ts, source-pe.ts, sink-pe.ts)
 * and performs their effects. Everything it records is a plain record; simulate.ts dresses it up.
 */
import type { Contract } from '../core/contract.ts';
import { countersFor, timersFor, type TimerName } from '../core/timers.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { MessageRecord, TraceRecord } from '../trace/records.ts';
import { createClock } from './clock.ts';
import { createFaultBook, faultsFor, isSilent } from './faults.ts';
import { createHeap } from './heap.ts';
import type { PeEffect, PeEvent, SinkMode } from './pe-types.ts';
import * as power from './power.ts';
import { initialProtocol, protocolStep, type ProtocolEffect, type ProtocolEvent, type ProtocolState } from './protocol.ts';
import { createRandom } from './random.ts';
import type { Scenario } from './scenario.ts';
import { initialSinkPe, sinkStep, type SinkPe } from './sink-pe.ts';
import { initialSourcePe, sourceStep, type SourcePe } from './source-pe.ts';
import { responseDelayUs, timerDurationUs } from './timing.ts';
import { initialTypec, typecStep, type TypecEffect, type TypecState } from './typec.ts';
import { otherSide, type LaneEntry, type Side, type TimedContract, type TimerSpan } from './types.ts';
import { frameHex, HARD_RESET_DURATION_US, packetDurationUs, packHeader, type MessageType } from './wire.ts';

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

/** tInterFrameGap: at least 25 µs between packets (USB PD R3.2 V1.1 §5.8.5, from memory). */
const INTER_FRAME_GAP_US = 25;
const MEASURE_EVERY_US = 1_000_000;

export function runScenario(scenario: Scenario, caps: { words: number[]; pdos: SourcePdo[] }, options: RunOptions = {}): RunOutput {
  const durationUs = scenario.durationMs * 1_000;
  const clock = createClock();
  const random = createRandom(scenario.seed);
  const queue = createHeap<Entry>();
  const book = createFaultBook(scenario.faults);
  const rpMa = power.rpCurrentMa(scenario.source.behaviour.rp);
  const slewMvPerUs = scenario.source.behaviour.slewMvPerMs / 1_000;
  const sourceContext = { words: caps.words, pdos: caps.pdos };
  const sinkContext = { cableMa: scenario.cable.currentRatingMa, ownRevision: scenario.sink.specRevision, decodeOffers: (words: readonly number[]) => (words === caps.words ? caps.pdos : undefined) };

  const records: TraceRecord[] = [];
  const lanes: LaneEntry[] = [];
  const timers: TimerSpan[] = [];
  const contracts: TimedContract[] = [];
  const samples: [number, number, number, number][] | undefined = options.sampleEveryUs ? [] : undefined;

  let seq = 0;
  // The body literal becomes the entry (no copy: this is the hot path).
  const schedule = (tUs: number, body: EntryBody) => {
    body.tUs = tUs;
    body.seq = seq++;
    queue.push(body as Entry);
  };

  // ---- actors' states ----
  const typec: Record<Side, TypecState> = { source: initialTypec('source'), sink: initialTypec('sink') };
  const prl: Record<Side, ProtocolState> = { source: initialProtocol, sink: initialProtocol };
  let src: SourcePe = initialSourcePe(scenario.source.specRevision);
  let snk: SinkPe = initialSinkPe(scenario.sink.specRevision, scenario.sink.policy);
  const running: Record<Side, Partial<Record<TimerName, { gen: number; span: TimerSpan }>>> = { source: {}, sink: {} };
  let timerGen = 0;

  // ---- the wire and the power path ----
  let lineFreeUs = 0;
  let ramp: power.VbusRamp = { startUs: 0, fromMv: 0, toMv: 0, mvPerUs: slewMvPerUs };
  let rampGen = 0;
  let rampOwner: 'typec' | 'pe' | 'load' = 'typec';
  let setMv = 0;
  let limitMa: number | null = null;
  let sinkMode: SinkMode = 'off';
  let sinkVbusPresent = false;
  let loadMa: number | null = scenario.sink.load.currentMa ?? null;
  let sinkContract: Contract | null = null;
  let done = false;

  const lane = (side: Side, state: string) => lanes.push({ t: clock.nowUs, side, state });
  const note = (text: string) => records.push({ t: clock.nowUs, note: text });
  const operatingMa = () => loadMa ?? sinkContract?.currentMa ?? power.SINK_DEFAULT_MA;
  const ibusAt = (mv: number) => {
    const draw = power.sinkDrawMa(sinkMode, operatingMa(), mv, rpMa);
    return limitMa === null ? draw : Math.min(draw, limitMa);
  };
  const measure = () => {
    const mv = power.vbusAtUs(ramp, clock.nowUs);
    records.push({ t: clock.nowUs, vbus: { mv, ma: ibusAt(mv) } });
  };

  // ---- timers ----
  function startTimer(side: Side, name: TimerName, startUs = clock.nowUs): void {
    stopTimer(side, name);
    const revision = side === 'source' ? src.revision : snk.revision;
    const span: TimerSpan = { name, side, startUs, endUs: startUs + timerDurationUs(name, side, revision, scenario, random), expired: false };
    const gen = ++timerGen;
    running[side][name] = { gen, span };
    timers.push(span);
    schedule(span.endUs, { kind: 'timer', side, name, gen });
  }
  function stopTimer(side: Side, name: TimerName): void {
    const timer = running[side][name];
    if (!timer) return;
    timer.span.endUs = Math.max(timer.span.startUs, clock.nowUs);
    running[side][name] = undefined;
  }

  // ---- power ----
  function startRamp(toMv: number, owner: typeof rampOwner): void {
    const fromMv = power.vbusAtUs(ramp, clock.nowUs);
    ramp = { startUs: clock.nowUs, fromMv, toMv, mvPerUs: toMv < fromMv && setMv === 0 ? power.DISCHARGE_MV_PER_US : slewMvPerUs };
    rampOwner = owner;
    const gen = ++rampGen;
    schedule(power.rampEndUs(ramp), { kind: 'ramp-end', gen });
    const crossing = power.crossingUs(ramp, sinkVbusPresent ? power.VSAFE0V_MAX_MV : power.VSAFE5V_MIN_MV);
    if (crossing !== null) schedule(crossing, { kind: 'vbus-cross', present: !sinkVbusPresent, gen });
  }
  /** The source's output after any current limit: a new ramp when the load moved it. */
  function retarget(): void {
    const draw = power.sinkDrawMa(sinkMode, operatingMa(), setMv, rpMa);
    const target = power.foldBack(setMv, limitMa, draw).voltageMv;
    if (target === ramp.toMv) return;
    const stillPe = rampOwner === 'pe' && clock.nowUs < power.rampEndUs(ramp);
    startRamp(target, stillPe ? 'pe' : 'load');
  }

  // ---- the wire ----
  function requestTx(frame: Frame, earliestUs: number): void {
    if (frame.type !== 'GoodCRC') {
      for (const fault of faultsFor(book, ['delay'], frame.from, frame.type, clock.nowUs)) earliestUs += (fault.delayMs ?? 0) * 1_000;
    }
    schedule(earliestUs, { kind: 'tx', frame });
  }
  function onTx(frame: Frame): void {
    const pending = prl[frame.from].pending;
    if (frame.attempt > 0 && (pending === null || pending.messageId !== frame.messageId || pending.attempts !== frame.attempt)) return;
    if (frame.attempt > 0 && clock.nowUs < lineFreeUs) {
      schedule(lineFreeUs, { kind: 'tx', frame });
      return;
    }
    const durationUs = packetDurationUs(frame.objects.length);
    const endUs = clock.nowUs + durationUs;
    if (frame.attempt > 0) startTimer(frame.from, 'tReceive', endUs);
    if (isSilent(book, frame.from, frame.type, clock.nowUs)) return;
    lineFreeUs = endUs + INTER_FRAME_GAP_US;
    const revision = frame.from === 'source' ? src.revision : snk.revision;
    const header = packHeader(frame.type, frame.objects.length, frame.messageId, frame.from, revision);
    const dropped = faultsFor(book, ['drop'], frame.from, frame.type, clock.nowUs).length > 0;
    const corrupt = !dropped && faultsFor(book, ['corrupt'], frame.from, frame.type, clock.nowUs).length > 0;
    // A dropped message never reaches the partner's port, so the port's trace holds a note, not the message.
    if (dropped) {
      note(`fault: ${frame.type} #${frame.messageId} from ${frame.from} dropped`);
      return;
    }
    const record: MessageRecord = { t: clock.nowUs, msg: frameHex(header, frame.objects), from: frame.from };
    if (corrupt) record.crcOk = false;
    records.push(record);
    schedule(endUs, { kind: 'arrive', frame, corrupt });
  }
  function onHardResetTx(from: Side): void {
    if (clock.nowUs < lineFreeUs) {
      schedule(lineFreeUs, { kind: 'hard-reset-tx', from });
      return;
    }
    if (isSilent(book, from, 'Hard_Reset', clock.nowUs)) return;
    lineFreeUs = clock.nowUs + HARD_RESET_DURATION_US + INTER_FRAME_GAP_US;
    records.push({ t: clock.nowUs, event: 'hard_reset', from });
    if (faultsFor(book, ['drop'], from, 'Hard_Reset', clock.nowUs).length > 0) note(`fault: Hard_Reset from ${from} dropped`);
    else schedule(clock.nowUs + HARD_RESET_DURATION_US, { kind: 'hard-reset-arrive', to: otherSide(from) });
  }
  function onArrive(frame: Frame, corrupt: boolean): void {
    const to = otherSide(frame.from);
    // A port's protocol layer listens once Type-C is attached and its policy engine runs.
    if (corrupt || (to === 'source' ? src.state === 'idle' : snk.state === 'idle')) return;
    const event: ProtocolEvent =
      frame.type === 'GoodCRC'
        ? { kind: 'good-crc', messageId: frame.messageId }
        : { kind: 'received', type: frame.type, messageId: frame.messageId, objects: frame.objects };
    runProtocol(to, event, frame.from === 'source' ? src.revision : snk.revision);
  }

  // ---- actors ----
  function runProtocol(side: Side, event: ProtocolEvent, partnerRevision: '2.0' | '3.0' = '3.0'): void {
    const revision = side === 'source' ? src.revision : snk.revision;
    const [next, effects] = protocolStep(prl[side], event, countersFor(revision).nRetryCount);
    prl[side] = next;
    for (const effect of effects) performProtocol(side, effect, partnerRevision);
  }
  function performProtocol(side: Side, effect: ProtocolEffect, partnerRevision: '2.0' | '3.0'): void {
    switch (effect.kind) {
      case 'transmit': {
        const delayUs = effect.attempt === 1 ? responseDelayUs(random) : random.between(timersFor('3.0').tTransmit.minUs, timersFor('3.0').tTransmit.maxUs);
        requestTx({ from: side, type: effect.type, objects: effect.objects, messageId: effect.messageId, attempt: effect.attempt }, clock.nowUs + delayUs);
        return;
      }
      case 'good-crc': {
        // tTransmit: the GoodCRC starts within 195 µs of the message's end (§6.6 Time Values); the
        // line is held for it, so no other message of this port can slip in first.
        const range = timersFor('3.0').tTransmit;
        const startUs = Math.max(clock.nowUs + random.between(range.minUs, range.maxUs), lineFreeUs);
        lineFreeUs = startUs + packetDurationUs(0) + INTER_FRAME_GAP_US;
        schedule(startUs, { kind: 'tx', frame: { from: side, type: 'GoodCRC', objects: [], messageId: effect.messageId, attempt: 0 } });
        return;
      }
      case 'stop-crc-timer':
        stopTimer(side, 'tReceive');
        return;
      case 'deliver': {
        const event: PeEvent = { kind: 'message', type: effect.type, objects: effect.objects, revision: partnerRevision };
        if (side === 'source' && effect.type === 'Request' && faultsFor(book, ['reject'], 'sink', 'Request', clock.nowUs).length > 0) {
          note('fault: the source answers Reject instead of Accept');
          runPe(side, { ...event, reject: true });
        } else runPe(side, event);
        return;
      }
      case 'sent':
        runPe(side, { kind: 'sent', type: effect.type });
        return;
      case 'failed':
        runPe(side, { kind: 'failed', type: effect.type });
        return;
      case 'discarded':
        runPe(side, { kind: 'discarded', type: effect.type });
        return;
    }
  }
  function runPe(side: Side, event: PeEvent): void {
    if (side === 'source') {
      const [next, effects] = sourceStep(src, event, sourceContext);
      const before = src.state;
      src = next;
      if (next.state !== before && next.state !== 'idle') lane('source', next.state);
      for (const effect of effects) performPe('source', effect);
    } else {
      const [next, effects] = sinkStep(snk, event, sinkContext);
      const before = snk.state;
      snk = next;
      if (next.state !== before && next.state !== 'idle') lane('sink', next.state);
      for (const effect of effects) performPe('sink', effect);
    }
  }
  function performPe(side: Side, effect: PeEffect): void {
    switch (effect.kind) {
      case 'send':
        runProtocol(side, { kind: 'send', type: effect.type, objects: effect.objects });
        return;
      case 'start-timer':
        startTimer(side, effect.name);
        return;
      case 'stop-timer':
        stopTimer(side, effect.name);
        return;
      case 'hard-reset':
        prl[side] = initialProtocol;
        stopTimer(side, 'tReceive');
        schedule(clock.nowUs, { kind: 'hard-reset-tx', from: side });
        return;
      case 'protocol-reset':
        runProtocol(side, { kind: 'reset' });
        return;
      case 'supply':
        setMv = effect.voltageMv;
        limitMa = effect.limitMa;
        startRamp(power.foldBack(setMv, limitMa, power.sinkDrawMa(sinkMode, operatingMa(), setMv, rpMa)).voltageMv, 'pe');
        return;
      case 'contract':
        if (side === 'sink') {
          sinkContract = effect.contract;
          if (effect.contract) contracts.push({ ...effect.contract, t: clock.nowUs });
          if (effect.contract && options.untilContract) done = true;
        } else if (effect.contract === null) limitMa = null;
        return;
      case 'sink-mode':
        sinkMode = effect.mode;
        if (effect.mode === 'operating') {
          retarget();
          measure();
        }
        return;
      case 'note':
        note(effect.text);
        return;
    }
  }
  function performTypec(side: Side, effects: TypecEffect[]): void {
    for (const effect of effects) {
      if (effect.kind === 'start-debounce') {
        const range = timersFor('3.0').tCCDebounce;
        schedule(clock.nowUs + random.between(range.minUs, range.maxUs), { kind: 'debounced', side });
      } else if (effect.kind === 'vbus-on') {
        setMv = 5_000;
        startRamp(5_000, 'typec');
      } else if (side === 'sink') runPe('sink', { kind: 'start' });
    }
  }
  function runTypec(side: Side, event: Parameters<typeof typecStep>[1]): void {
    const before = typec[side].state;
    const [next, effects] = typecStep(typec[side], event);
    typec[side] = next;
    if (next.state !== before) lane(side, next.state);
    performTypec(side, effects);
  }

  // ---- the loop ----
  function dispatch(entry: Entry): void {
    switch (entry.kind) {
      case 'cc':
        records.push({ t: clock.nowUs, event: 'attach', cc: 'CC1', rp: scenario.source.behaviour.rp });
        runTypec('source', { kind: 'cc' });
        runTypec('sink', { kind: 'cc' });
        return;
      case 'debounced':
        runTypec(entry.side, { kind: 'debounced' });
        return;
      case 'timer': {
        const timer = running[entry.side][entry.name];
        if (!timer || timer.gen !== entry.gen) return;
        timer.span.expired = true;
        running[entry.side][entry.name] = undefined;
        if (entry.name === 'tReceive') runProtocol(entry.side, { kind: 'crc-timeout' });
        else runPe(entry.side, { kind: 'timer', name: entry.name });
        return;
      }
      case 'tx':
        onTx(entry.frame);
        return;
      case 'hard-reset-tx':
        onHardResetTx(entry.from);
        return;
      case 'arrive':
        onArrive(entry.frame, entry.corrupt);
        return;
      case 'hard-reset-arrive':
        prl[entry.to] = initialProtocol;
        stopTimer(entry.to, 'tReceive');
        if ((entry.to === 'source' ? src.state : snk.state) !== 'idle') runPe(entry.to, { kind: 'hard-reset-received' });
        return;
      case 'ramp-end':
        if (entry.gen !== rampGen) return;
        if (ramp.toMv > 0 || ramp.fromMv > 0) measure();
        if (rampOwner === 'typec') {
          if (src.state === 'idle') runPe('source', { kind: 'start' });
        } else if (rampOwner === 'pe') {
          const psRdyDue = src.state === 'PE_SRC_Transition_Supply';
          const withhold = psRdyDue && faultsFor(book, ['no-ps-rdy'], 'source', 'PS_RDY', clock.nowUs).length > 0;
          runPe('source', { kind: 'supply-ready', withholdPsRdy: withhold });
        }
        return;
      case 'vbus-cross':
        if (entry.gen !== rampGen) return;
        sinkVbusPresent = entry.present;
        runTypec('sink', { kind: 'vbus', present: entry.present });
        if (snk.state !== 'idle') runPe('sink', { kind: 'vbus', present: entry.present });
        return;
      case 'policy': {
        const change = scenario.sink.changes[entry.index];
        if (change) runPe('sink', { kind: 'policy', policy: change.policy });
        return;
      }
      case 'load':
        loadMa = entry.currentMa;
        retarget();
        measure();
        return;
      case 'measure':
        if (power.vbusAtUs(ramp, clock.nowUs) > power.VSAFE0V_MAX_MV) measure();
        if (clock.nowUs + MEASURE_EVERY_US < durationUs) schedule(clock.nowUs + MEASURE_EVERY_US, { kind: 'measure' });
        return;
      case 'end':
        done = true;
        return;
    }
  }

  lane('source', typec.source.state);
  lane('sink', typec.sink.state);
  schedule(0, { kind: 'cc' });
  schedule(MEASURE_EVERY_US, { kind: 'measure' });
  scenario.sink.changes.forEach((change, index) => schedule(change.atMs * 1_000, { kind: 'policy', index }));
  for (const step of scenario.sink.load.steps) schedule(step.atMs * 1_000, { kind: 'load', currentMa: step.currentMa });
  schedule(durationUs, { kind: 'end' });

  const everyUs = options.sampleEveryUs ?? 0;
  let nextSampleUs = 0;
  const sampleUntil = (tUs: number) => {
    if (!samples) return;
    while (nextSampleUs < tUs && nextSampleUs <= durationUs) {
      const mv = power.vbusAtUs(ramp, nextSampleUs);
      const ma = ibusAt(mv);
      samples.push([nextSampleUs, mv, ma, power.sinkSideMv(mv, ma, scenario.cable.resistanceMohm)]);
      nextSampleUs += everyUs;
    }
  };

  let handled = 0;
  let stopped = false;
  const progressEveryUs = Math.max(1, Math.floor(durationUs / 100));
  let nextProgressUs = progressEveryUs;
  while (!done) {
    const entry = queue.pop();
    if (!entry || entry.tUs > durationUs) break;
    sampleUntil(entry.tUs);
    clock.advanceTo(entry.tUs);
    dispatch(entry);
    // The stop check runs every 256 events and at each percent of simulated time.
    const checkpoint = clock.nowUs >= nextProgressUs;
    if (checkpoint) nextProgressUs = clock.nowUs + progressEveryUs;
    if (((++handled & 0xff) === 0 || checkpoint) && options.shouldStop?.()) {
      stopped = true;
      break;
    }
    if (checkpoint) options.onProgress?.(Math.min(1, clock.nowUs / durationUs));
  }
  sampleUntil(clock.nowUs + 1);
  for (const side of ['source', 'sink'] as const) {
    for (const timer of Object.values(running[side])) if (timer) timer.span.endUs = Math.min(timer.span.endUs, clock.nowUs);
  }
  options.onProgress?.(1);
  return { records, lanes, timers, contracts, contract: sinkContract, samples, endUs: clock.nowUs, stopped };
}
