/**
 * The trace analyser: records in (one at a time, from a reader or the simulator), an Analysis out.
 * It follows both ports' protocol layer (protocol.ts: GoodCRC, retries, MessageIDs) and policy
 * (policy.ts: offers, requests, contracts and timers), checks VBUS and IBUS against the contract
 * in force (vbus.ts) and keeps a bounded timeline for charts. Memory stays bounded whatever the
 * trace's length: the decode cache, the findings and the timeline all have limits.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding, Severity } from '../core/finding.ts';
import type { Sop } from '../pd/types.ts';
import { isRuleId, makeFinding, ruleCatalog, type RuleId } from '../rules/catalog.ts';
import { crc32 } from '../wire/index.ts';
import { cableIdentityOf, cableText, type CableIdentity } from './cable.ts';
import { createCollisionWatch } from './collision.ts';
import { createCrcErrors } from './crc-errors.ts';
import { createEprTracker } from './epr.ts';
import { createHardResetRecovery } from './hard-reset-recovery.ts';
import { createDecodeCache } from './decode-cache.ts';
import type { TraceFormat } from './detect-format.ts';
import { createFindingStore } from './findings-store.ts';
import type { AnalyserMemo } from './memo.ts';
import { amps, contractText, seconds, volts } from './format.ts';
import { createPolicyTracker } from './policy.ts';
import type { ActiveContract } from './policy-waits.ts';
import { createProtocolTracker } from './protocol.ts';
import type { EventRecord, MeasurementRecord, MessageRecord, TraceHeader, TraceRecord, TraceSide } from './records.ts';
import type { FindingExtra, SeenMessage } from './seen.ts';
import type { TraceSink } from './sink.ts';
import { sideOfClause, sideOfFinding } from './blame.ts';
import { summarize, type SummaryInput } from './summary.ts';
import { createTimeline, type Timeline, type TimelineMessage } from './timeline.ts';
import { contractVbusLimits, vbusLimits, voltageOutside } from './vbus.ts';

export interface AnalyserOptions {
  format?: TraceFormat;
  /** Most messages, events and measurements kept in the timeline (default 20 000 each). */
  timelineLimit?: number;
  /**
   * Called with every decoded message and its index in the whole trace, as it is read (the
   * timeline keeps only the first `timelineLimit`; a store of every message listens here).
   */
  onMessage?(message: TimelineMessage, index: number): void;
  /** Most findings listed (default 5 000); the rest are counted. */
  findingsLimit?: number;
  /** Decodings and offer checks shared with other analysers of the same messages (memo.ts; a fault sweep). */
  memo?: AnalyserMemo;
  /** False: leave `summary` empty (a caller that reads only the findings skips the sentence). */
  summary?: boolean;
}

export interface Analysis {
  format?: TraceFormat;
  header?: TraceHeader;
  /** Records read (messages, events, measurements, notes). */
  records: number;
  messages: number;
  /** Each change of contract, at its PS_RDY. */
  contracts: (Contract & { t: number })[];
  findings: Finding[];
  counts: Record<Severity, number>;
  /** Findings counted in `counts` but not listed. */
  findingsOmitted: number;
  hardResets: { t: number; cause?: string }[];
  summary: string;
  timeline: Timeline;
}

export interface Analyser extends TraceSink {
  push(record: TraceRecord, line?: number): void;
  malformed(line: number, reason: string): void;
  header(header: TraceHeader, line: number): void;
  finish(): Analysis;
}

const LIST_LIMIT = 10_000;
/** A protocol error this close before a reset is named as its likely cause (common practice). */
const CAUSE_WINDOW_US = 1_000_000;

interface VbusProblem {
  finding: Finding;
  active: ActiveContract;
  count: number;
  firstUs: number;
  lastUs: number;
  extremeMv: number;
  range: string;
}

export function createAnalyser(options: AnalyserOptions = {}): Analyser {
  const store = createFindingStore(options.findingsLimit ?? 5_000);
  const timeline = createTimeline(options.timelineLimit ?? 20_000);
  const cache = createDecodeCache(undefined, options.memo);
  const contracts: (Contract & { t: number })[] = [];
  const hardResets: { t: number; cause?: string }[] = [];
  let contractCount = 0;
  let hardResetCount = 0;
  let records = 0;
  let messages = 0;
  let measurements = 0;
  let sourceCapabilities = 0;
  let lastT = 0;
  let header: TraceHeader | undefined;
  let lastProblem: { t: number; rule: RuleId } | undefined;
  let voltageProblem: VbusProblem | undefined;
  let currentProblem: VbusProblem | undefined;

  const report = (rule: RuleId, message: string, extra: FindingExtra = {}): Finding => {
    const finding = makeFinding(rule, message, extra);
    store.add(finding, extra.t ?? lastT);
    if (finding.severity === 'error' && (rule.startsWith('protocol.') || rule.startsWith('timing.'))) lastProblem = { t: extra.t ?? lastT, rule };
    return finding;
  };

  const protocol = createProtocolTracker(report);
  const crcErrors = createCrcErrors(report);
  const collision = createCollisionWatch(report);
  const recovery = createHardResetRecovery(report);
  let cable: CableIdentity | undefined;
  let cableReported = false;
  const epr = createEprTracker(report, {
    cable: () => cable,
    hasContract: () => policy.steadyContract() !== undefined,
    finding: (f) => store.add(f, f.t ?? lastT),
  });
  const policy = createPolicyTracker(
    report,
    {
      contract(contract, t, changed, pdo) {
        closeVbusProblems();
        checkCableCurrent(contract, t);
        if (!changed) return;
        contractCount++;
        if (contracts.length < LIST_LIMIT) contracts.push({ ...contract, t });
        timeline.contractStart(t, contract, contractVbusLimits(contract, pdo));
      },
      contractEnd(t) {
        closeVbusProblems();
        timeline.contractEnd(t);
      },
      finding(f) {
        store.add(f, f.t ?? lastT);
      },
      goodCrcSeen: () => protocol.goodCrcSeen(),
      roleSwap: () => protocol.forgetIds('SOP'),
      inEpr: () => epr.inEpr(),
      softReset(m) {
        const cause = recentProblem(m.t);
        report('protocol.soft-reset', `The ${m.from} sent Soft_Reset at ${seconds(m.t)}${cause ? `, likely after ${cause}` : ''}; both ports start their message counters again and renegotiate.`, {
          t: m.t,
          line: m.line,
        });
      },
    },
    options.memo,
  );

  function recentProblem(t: number): string | undefined {
    if (!lastProblem || t - lastProblem.t > CAUSE_WINDOW_US) return undefined;
    const clause: Record<string, string> = {
      'protocol.message-id': 'a MessageID error',
      'protocol.unexpected': 'a message the state did not allow',
      'protocol.missing-goodcrc': 'a message that got no GoodCRC',
    };
    return `${clause[lastProblem.rule] ?? 'a late response'} at ${seconds(lastProblem.t)}`;
  }

  /** A contract above what the cable's e-marker says it carries (§6.4.4.3.1 cable VDO; Type-C R2.3 §4.9). */
  function checkCableCurrent(contract: Contract, t: number): void {
    if (!cable || cable.currentMa === undefined || cableReported || contract.currentMa <= cable.currentMa) return;
    cableReported = true;
    report(
      'request.cable-current',
      `The ${contractText(contract)} contract at ${seconds(t)} draws ${amps(contract.currentMa)} over ${cableText(cable)} (its Discover Identity at ${seconds(cable.t)}), which carries at most ${amps(cable.currentMa)}.`,
      { t },
    );
  }

  function closeVbusProblems(): void {
    for (const p of [voltageProblem, currentProblem]) {
      if (!p || p.count < 2) continue;
      const what = p === voltageProblem ? `VBUS was outside ${p.range}` : `IBUS was above ${p.range}`;
      const extreme = p === voltageProblem ? `worst reading ${volts(p.extremeMv)}` : `highest ${amps(p.extremeMv)}`;
      p.finding.message = `${what} for the ${contractText(p.active.contract)} contract in ${p.count} readings from ${seconds(p.firstUs)} to ${seconds(p.lastUs)} (${extreme}).`;
    }
    voltageProblem = undefined;
    currentProblem = undefined;
  }

  function onMessage(r: MessageRecord, t: number, line: number | undefined): void {
    messages++;
    const sop: Sop = r.sop ?? 'SOP';
    const entry = cache.get(r.msg, sop);
    const d = entry.decoded;
    if (!d) {
      // Reported once per distinct message: the same bad bytes repeated add nothing.
      if (entry.uses === 1 && entry.error) {
        const rule: RuleId = isRuleId(entry.error.code) ? entry.error.code : 'trace.malformed-line';
        report(rule, `The message at ${seconds(t)} could not be decoded (${entry.error.message.replace(/\.$/, '')}).`, { t, line });
      }
      return;
    }
    let message = d.message;
    let warnings = entry.uses === 1 ? d.warnings : undefined;
    const eprOffers = d.messageType === 'EPR_Request' ? epr.offers() : undefined;
    const offers = eprOffers ?? policy.offers();
    if ((d.messageType === 'Request' || d.messageType === 'EPR_Request') && offers) {
      const typed = cache.typed(d, sop, eprOffers ? epr.offersKey() : policy.offersKey(), offers);
      message = typed.message;
      warnings = typed.uses === 1 ? typed.warnings : undefined;
    }
    // Codec warnings, once per distinct message (they are the same for every copy).
    if (warnings) for (const w of warnings) store.add({ ...w, t, ...(line !== undefined ? { line } : {}) }, t);
    const from: TraceSide = r.from ?? (d.cablePlug ? 'cable' : (d.powerRole ?? 'source'));
    let crcOk = r.crcOk !== false;
    if (crcOk && r.crc !== undefined && Number.parseInt(r.crc.replace(/^0x/i, ''), 16) !== crc32(d.bytes) >>> 0) crcOk = false;
    if (d.messageType === 'Source_Capabilities' && crcOk) sourceCapabilities++;
    const seen: SeenMessage = { t, endUs: t + d.durationUs, from, sop, d, crcOk, line, index: -1, ackEndUs: undefined, acks: undefined };
    const delivery = protocol.onMessage(seen);
    const item: TimelineMessage = {
      t,
      durationUs: d.durationUs,
      from,
      sop,
      messageType: d.messageType,
      messageId: d.messageId,
      hex: d.hex,
      decoded: message,
      crcOk,
      ...(delivery === 'retry' ? { retry: true } : {}),
      ...(seen.acks && seen.acks.index >= 0 ? { goodCrcFor: seen.acks.index } : {}),
      ...(line !== undefined ? { line } : {}),
    };
    seen.index = timeline.message(item);
    options.onMessage?.(item, seen.index);
    crcErrors.onMessage(seen);
    if (delivery === 'goodcrc' && crcOk) recovery.onGoodCrc();
    if (delivery !== 'new') return;
    policy.onMessage(seen);
    epr.onMessage(seen, policy.steadyContract() !== undefined);
    collision.onMessage(seen);
    if (d.messageType === 'Source_Capabilities' && from === 'source' && sop === 'SOP') recovery.onSourceCaps(t);
    const identity = cableIdentityOf(seen);
    if (identity) {
      cable = identity;
      const active = policy.steadyContract();
      if (active) checkCableCurrent(active.contract, t);
    }
  }

  function onEvent(r: EventRecord, t: number): void {
    timeline.event(r.from ? { t, event: r.event, from: r.from } : { t, event: r.event });
    if (r.event === 'rp') {
      collision.onRp(t, r.rp);
      return;
    }
    crcErrors.flush();
    if (r.event === 'cable_reset') {
      protocol.reset(t, 'cable');
      return;
    }
    if (r.event === 'hard_reset') {
      // A wait the reset ended is reported before the reset itself, which then names it as the cause.
      policy.hardReset(t, r.from);
      const unacked = protocol.unacknowledged(t);
      const cause =
        (unacked ? `the ${unacked.from}'s ${unacked.d.messageType} at ${seconds(unacked.firstUs ?? unacked.t)} got no GoodCRC` : undefined) ??
        policy.hardResetCause(t) ??
        epr.hardResetCause(t) ??
        recovery.hardResetCause(t, r.from) ??
        (voltageProblem ? `VBUS left the contract's range at ${seconds(voltageProblem.firstUs)}` : undefined) ??
        recentProblem(t);
      hardResetCount++;
      if (hardResets.length < LIST_LIMIT) hardResets.push(cause ? { t, cause } : { t });
      const who = r.from ? `The ${r.from} sent a Hard Reset` : 'A Hard Reset came';
      report('protocol.hard-reset', `${who} at ${seconds(t)}${cause ? `, after ${cause}` : '; no cause was found in the trace before it'}.`, { t });
      recovery.onHardReset(t, r.from);
    }
    if (r.event === 'attach') recovery.onAttach(t);
    if (r.event === 'detach' || r.event === 'attach') {
      cable = undefined;
      cableReported = false;
    }
    protocol.reset(t, 'all');
    policy.reset(t);
    epr.reset(t);
    collision.reset();
  }

  function onMeasurement(r: MeasurementRecord, t: number): void {
    measurements++;
    const { mv, ma } = r.vbus;
    timeline.measurement(t, mv, ma);
    recovery.onVbus(t, mv);
    const active = policy.steadyContract();
    if (!active) return;
    const limits = vbusLimits(active);
    if (voltageOutside(limits, mv, ma)) {
      const p = voltageProblem;
      if (p && p.active === active) {
        p.count++;
        p.lastUs = t;
        if (Math.abs(mv - active.contract.voltageMv) > Math.abs(p.extremeMv - active.contract.voltageMv)) p.extremeMv = mv;
      } else {
        const range = `${volts(limits.minMv)} to ${volts(limits.maxMv)}`;
        const finding = report('vbus.out-of-range', `VBUS read ${volts(mv)} at ${seconds(t)}, outside ${range} for the ${contractText(active.contract)} contract.`, { t, ref: limits.ref });
        voltageProblem = { finding, active, count: 1, firstUs: t, lastUs: t, extremeMv: mv, range };
      }
    }
    if (ma !== undefined && ma > limits.maxMa) {
      const p = currentProblem;
      if (p && p.active === active) {
        p.count++;
        p.lastUs = t;
        p.extremeMv = Math.max(p.extremeMv, ma);
      } else {
        const range = amps(limits.maxMa);
        const finding = report('vbus.over-current', `IBUS read ${amps(ma)} at ${seconds(t)}, above the ${amps(active.contract.currentMa)} the ${contractText(active.contract)} contract allows.`, {
          t,
          ref: limits.ref,
        });
        currentProblem = { finding, active, count: 1, firstUs: t, lastUs: t, extremeMv: ma, range };
      }
    }
  }

  return {
    header(h) {
      header ??= h;
    },
    malformed(line, reason) {
      report('trace.malformed-line', `Line ${line} could not be read (${reason}); the rest of the trace was analysed.`, { line });
    },
    push(record, line) {
      records++;
      let t = record.t;
      if (t < lastT) {
        report(
          'trace.time-order',
          `The time ${seconds(t)}${line !== undefined ? ` on line ${line}` : ''} is earlier than ${seconds(lastT)} before it; it was read as ${seconds(lastT)}.`,
          line !== undefined ? { t: lastT, line } : { t: lastT },
        );
        t = lastT;
      }
      lastT = t;
      policy.advance(t);
      epr.advance(t, policy.steadyContract() !== undefined);
      if ('msg' in record) onMessage(record, t, line);
      else if ('event' in record) onEvent(record, t);
      else if ('vbus' in record) onMeasurement(record, t);
      else timeline.event({ t, event: 'note', text: record.note });
    },
    finish() {
      policy.advance(lastT);
      epr.advance(lastT, policy.steadyContract() !== undefined);
      policy.finish(lastT);
      protocol.finish(lastT);
      crcErrors.flush();
      closeVbusProblems();
      const counts = { ...store.counts };
      const analysis: Analysis = {
        records,
        messages,
        contracts,
        findings: store.list(),
        counts,
        findingsOmitted: store.omitted(),
        hardResets,
        summary:
          options.summary === false
            ? ''
            : summarize({
                records,
                messages,
                measurements,
                contracts,
                contractCount,
                sourceCapabilities,
                hardResets,
                hardResetCount,
                counts,
                goodCrcSeen: protocol.goodCrcSeen(),
                ...policy.requestCounts(),
                ...(hardResets[0]?.cause !== undefined ? { hardResetSide: sideOfClause(hardResets[0].cause) } : {}),
                ...firstProblemOf(store.list()),
              }),
        timeline: timeline.timeline,
      };
      if (options.format) analysis.format = options.format;
      if (header) analysis.header = header;
      return analysis;
    },
  };
}

/** The earliest error (else warning), by the catalog's title and the side it points at, for the summary sentence. */
function firstProblemOf(findings: readonly Finding[]): { firstProblem?: SummaryInput['firstProblem'] } {
  let first: Finding | undefined;
  for (const severity of ['error', 'warning'] as const) {
    for (const f of findings) if (f.severity === severity && (first === undefined || (f.t ?? Infinity) < (first.t ?? Infinity))) first = f;
    if (first) break;
  }
  if (!first) return {};
  const title = isRuleId(first.rule) ? ruleCatalog[first.rule].title : first.rule;
  const side = sideOfFinding(first);
  return { firstProblem: { title, ...(first.t !== undefined ? { t: first.t } : {}), ...(side ? { side } : {}) } };
}

/** Analyses records already in memory (vectors, the simulator's output, tests). */
export function analyseRecords(records: Iterable<TraceRecord>, options: AnalyserOptions = {}): Analysis {
  const analyser = createAnalyser(options);
  for (const record of records) analyser.push(record);
  return analyser.finish();
}
