/**
 * The policy level of both ports: offers, requests, contracts and the timers between them.
 * Times follow the specification's measuring points (from memory, USB PD R3.2 V1.1 §6.6):
 * a response timer (SenderResponseTimer §6.6.2, PSTransitionTimer §6.6.5) starts when the GoodCRC
 * acknowledging the message ends (its EOP) and stops when the awaited message has been received,
 * i.e. at its EOP — so both ends are message ends, never preamble starts. Without a captured GoodCRC
 * the acknowledged message's own end is used. Limits come from shared/core/timers.ts by the
 * revision in operation (the lower of the two ports' Specification Revision fields, §6.2.1.1.5).
 * Split along its seams: the offers in force and their checks (offers.ts), the revision in
 * operation (revision.ts), EPR mode (epr.ts); this module keeps the request → answer → PS_RDY →
 * contract sequence and its timers.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import type { TimerRangeUs, TimerTable } from '../core/timers.ts';
import { decodeRdo, decodeSourcePdo } from '../pd/index.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import { checkRequest } from '../rules/check-request.ts';
import { contractOf } from '../rules/contract-of.ts';
import { endedDuring, expire, isOpen, movedOn, pastDeadline, resetDuring, type Awaited, type Watch } from './awaited.ts';
import { objectAt } from './decode-cache.ts';
import type { AnalyserMemo } from './memo.ts';
import { createOffersTracker } from './offers.ts';
import { createRevisionInOperation } from './revision.ts';
import { contractText, millis, seconds } from './format.ts';
import type { TraceSide } from './records.ts';
import type { Report, SeenMessage } from './seen.ts';
import type { VbusLimits } from './vbus.ts';

const SOURCE_PDO_KINDS: readonly string[] = ['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'];
/** Messages the partner answers with Accept, Reject, Wait or Not_Supported. */
const NEEDS_ACCEPT: readonly string[] = ['Soft_Reset', 'PR_Swap', 'DR_Swap', 'VCONN_Swap', 'FR_Swap', 'Data_Reset', 'Enter_USB', 'EPR_Mode'];
/**
 * Offers and requests are checked once each: a source repeats unanswered offers and a keep-alive repeats
 * the same Request every few seconds. They are keyed by their data objects, not the header, whose
 * MessageID alone would make up to eight copies of one list.
 */
const CHECKED_LIMIT = 1_024;

interface Pending extends Watch {
  m: SeenMessage;
}
interface PendingRequest extends Pending {
  rdo: Rdo;
  pdo: SourcePdo | undefined;
}
interface Accepted extends Pending {
  request: PendingRequest;
  /** Accepted in EPR mode (or an EPR_Request): tPSTransition is the EPR value. */
  epr: boolean;
}

export interface ActiveContract {
  contract: Contract;
  t: number;
  pdo: SourcePdo;
  /** For a programmable contract: the start of the last Request (tPPSRequest counts from it). */
  lastRequestUs: number;
  keepAlive: Watch;
  /** VBUS limits, worked out on the first reading. */
  limits?: VbusLimits;
}

export interface PolicyEvents {
  contract(contract: Contract, t: number, changed: boolean): void;
  contractEnd(t: number): void;
  softReset(m: SeenMessage): void;
  /** A finding of the rules engine (caps, request), passed on as it is with the message's time and line. */
  finding(f: Finding): void;
  /** A PR_Swap or FR_Swap was accepted or completed: the protocol layers count MessageIDs afresh. */
  roleSwap?(t: number): void;
  /** Whether EPR mode holds now (epr.ts). */
  inEpr?(): boolean;
  /** Whether the trace has shown any GoodCRC so far (logs without them time a Request from its own end). */
  goodCrcSeen?(): boolean;
}

export interface PolicyTracker {
  onMessage(m: SeenMessage): void;
  /** Timers that ran out before `t`. */
  advance(t: number): void;
  /** A Hard Reset at `t` (from `from`, when known) ends every wait: a missing answer is reported first. */
  hardReset(t: number, from: TraceSide | undefined): void;
  /** The trace ended at `t`: findings of waits still open say so. */
  finish(t: number): void;
  /** The likely cause of a Hard Reset at `t`, as a clause ("the sink stopped …"), if one is found. */
  hardResetCause(t: number): string | undefined;
  /** Hard Reset, detach, attach: the negotiation starts over and the contract ends. */
  reset(t: number): void;
  /** The contract VBUS must meet now: none during a transition or before the first PS_RDY. */
  steadyContract(): ActiveContract | undefined;
  /** The offers in force (for decoding Requests) and a key that names them. */
  offers(): SourcePdo[] | undefined;
  offersKey(): string;
  /** Requests the source received and those it accepted, over the whole trace (for the summary). */
  requestCounts(): { requests: number; requestsAccepted: number };
}

export function createPolicyTracker(report: Report, events: PolicyEvents, memo?: AnalyserMemo): PolicyTracker {
  const offers = createOffersTracker(report, (f) => events.finding(f), memo);
  const revision = createRevisionInOperation();
  let capsWaiting: Pending | undefined;
  let request: PendingRequest | undefined;
  let accepted: Accepted | undefined;
  let other: Pending | undefined;
  let swapPsRdy = 0;
  let requestsSeen = 0;
  let requestsAccepted = 0;
  /** The source's Wait to the sink's Request: the sink may ask again only tSinkRequest later (§6.6.4.2). */
  let waited: SeenMessage | undefined;
  let contract: ActiveContract | undefined;
  let transition = false;
  const rdos = new Map<string, Rdo>();

  const timers = (): TimerTable => revision.timers();
  const ackEnd = (m: SeenMessage): number => m.ackEndUs ?? m.endUs;
  const at = (m: SeenMessage): { t: number; line: number | undefined } => ({ t: m.t, line: m.line });
  const unexpected = (m: SeenMessage, why: string): void => {
    report('protocol.unexpected', `The ${m.from}'s ${m.d.messageType} at ${seconds(m.t)} came ${why}.`, at(m));
  };

  /** A Request's timer start: its GoodCRC's end, or its own end in a log that records no GoodCRC at all. */
  const requestStart = (p: Pending): number | undefined => p.m.ackEndUs ?? (events.goodCrcSeen?.() === false ? p.m.endUs : undefined);
  const sinceText = (p: Pending): string => `after the ${p.m.d.messageType} ${p.m.ackEndUs !== undefined ? 'was acknowledged' : 'ended'}`;

  // What each wait says when its answer never comes (awaited.ts); built only when a timer needs words.
  const awaitRequestAfterCaps = (p: Pending): Awaited => {
    const { tSenderResponse } = timers();
    return {
      watch: p,
      rule: 'timing.sender-response',
      timerName: 'tSenderResponse',
      timer: tSenderResponse,
      startUs: p.m.ackEndUs,
      waiter: 'source',
      line: p.m.line,
      missing: `The sink did not answer the source's Source_Capabilities at ${seconds(p.m.t)} with a Request`,
      since: sinceText(p),
      none: 'no Request',
      giveUpAfterUs: tSenderResponse.minUs,
    };
  };
  const awaitAnswerTo = (p: Pending): Awaited => {
    const { tSenderResponse } = timers();
    const waiter = p.m.from;
    const answerer = waiter === 'sink' ? 'source' : 'sink';
    return {
      watch: p,
      rule: 'timing.sender-response',
      timerName: 'tSenderResponse',
      timer: tSenderResponse,
      startUs: requestStart(p),
      waiter,
      line: p.m.line,
      missing: `The ${answerer} did not answer the ${waiter}'s ${p.m.d.messageType} at ${seconds(p.m.t)}`,
      since: sinceText(p),
      none: 'no answer',
      giveUpAfterUs: tSenderResponse.minUs,
    };
  };
  /** tPSTransition of the mode the Accept came in (§6.6.4.1, Time Values: SPR and EPR values differ). */
  const psTransitionOf = (a: Accepted): TimerRangeUs => (a.epr ? timers().tPSTransitionEpr : timers().tPSTransition);
  const awaitPsRdyAfter = (p: Accepted): Awaited => {
    const tPSTransition = psTransitionOf(p);
    return {
      watch: p,
      rule: 'timing.ps-transition',
      timerName: 'tPSTransition',
      timer: tPSTransition,
      startUs: ackEnd(p.m),
      waiter: 'sink',
      line: p.m.line,
      missing: `The source accepted the Request at ${seconds(p.request.m.t)} but sent no PS_RDY`,
      since: sinceText(p),
      none: 'no PS_RDY',
      giveUpAfterUs: tPSTransition.minUs,
    };
  };
  /** The keep-alive's finding is worded in advance(); this only finishes it (a reset never reports it early). */
  const awaitKeepAlive = (c: ActiveContract): Awaited => ({
    watch: c.keepAlive,
    rule: 'timing.pps-keepalive',
    timerName: 'tPPSRequest',
    timer: timers().tPPSRequest,
    startUs: c.lastRequestUs,
    waiter: 'source',
    line: undefined,
    missing: 'The sink sent no new Request',
    since: 'later',
    none: 'no new Request',
    giveUpAfterUs: Number.POSITIVE_INFINITY,
  });
  /** The waits in force, answers first. */
  const waits = (): Awaited[] => {
    const list: Awaited[] = [];
    if (capsWaiting) list.push(awaitRequestAfterCaps(capsWaiting));
    if (request) list.push(awaitAnswerTo(request));
    if (accepted) list.push(awaitPsRdyAfter(accepted));
    if (contract && contract.contract.kind === 'pps') list.push(awaitKeepAlive(contract));
    return list;
  };
  const anyOpen = (): boolean => isOpen(capsWaiting) || isOpen(request) || isOpen(accepted) || isOpen(contract?.keepAlive);

  /** A response within tSenderResponse of the (acknowledged) message it answers. */
  /**
   * A response within tSenderResponse of the (acknowledged) message it answers (the asker's timer,
   * ended by the response's EOP), and started within tReceiverResponse (the responder's own limit,
   * from memory 15 ms; §6.6.2 and Time Values table) — later than that is a warning while the asker still waits.
   */
  const checkResponse = (first: Pending, response: SeenMessage): void => {
    const { tSenderResponse, tReceiverResponse } = timers();
    const tookUs = response.endUs - ackEnd(first.m);
    if (tookUs <= tSenderResponse.maxUs) {
      const startedUs = response.t - ackEnd(first.m);
      if (startedUs > tReceiverResponse.maxUs) {
        report(
          'timing.receiver-response',
          `The ${response.from} began its ${response.d.messageType} ${millis(startedUs)} after the ${first.m.from}'s ${first.m.d.messageType} at ${seconds(first.m.t)} ${first.m.ackEndUs !== undefined ? 'was acknowledged' : 'ended'}; tReceiverResponse asks for at most ${millis(tReceiverResponse.maxUs)}.`,
          { ...at(response), ref: tReceiverResponse.ref },
        );
      }
      return;
    }
    const message = `The ${response.from} answered the ${first.m.d.messageType} at ${seconds(first.m.t)} with ${response.d.messageType} after ${millis(tookUs)}; tSenderResponse allows at most ${millis(tSenderResponse.maxUs)}.`;
    if (first.finding) first.finding.message = message;
    else report('timing.sender-response', message, { ...at(response), ref: tSenderResponse.ref });
  };

  const onCaps = (m: SeenMessage): void => {
    if (!offers.onCaps(m, contract !== undefined, timers())) return;
    waited = undefined;
    capsWaiting = { m, reported: false };
    request = undefined;
  };

  const onRequest = (m: SeenMessage): void => {
    const epr = m.d.messageType === 'EPR_Request';
    const raw = objectAt(m.d.bytes, 1);
    if (raw === undefined) return;
    const caps = offers.current();
    if (!caps && !epr) unexpected(m, 'before any Source_Capabilities');
    if (waited && m.from === 'sink') {
      const { tSinkRequest } = timers();
      const afterUs = m.t - ackEnd(waited);
      if (afterUs < tSinkRequest.minUs) {
        report(
          'timing.sink-request',
          `The sink asked again at ${seconds(m.t)}, ${millis(afterUs)} after the source's Wait at ${seconds(waited.t)}; tSinkRequest asks it to wait at least ${millis(tSinkRequest.minUs)}.`,
          { ...at(m), ref: tSinkRequest.ref },
        );
      }
    }
    waited = undefined;
    if (capsWaiting) checkResponse(capsWaiting, m);
    capsWaiting = undefined;
    offers.answered();
    const position = (raw >>> 28) & 0xf;
    let pdo: SourcePdo | undefined = caps?.pdos[position - 1];
    if (epr) {
      const copy = objectAt(m.d.bytes, 2);
      const decoded = copy === undefined ? undefined : decodeSourcePdo(copy);
      if (decoded && SOURCE_PDO_KINDS.includes(decoded.kind)) pdo = decoded as SourcePdo;
    }
    const key = `${caps ? caps.key : '-'} ${m.d.messageType} ${objectsKey(m)}`;
    let rdo = rdos.get(key);
    if (rdo === undefined) {
      if (rdos.size >= CHECKED_LIMIT) rdos.clear();
      rdo = decodeRdo(raw, pdo);
      rdos.set(key, rdo);
      if (caps && !epr) for (const f of checkRequest(rdo, caps.pdos, { t: m.t })) events.finding(located(f, m));
    }
    request = { m, rdo, pdo, reported: false };
    requestsSeen++;
    if (contract) {
      contract.lastRequestUs = m.t;
      contract.keepAlive = { reported: false };
    }
  };

  const onAnswer = (m: SeenMessage): void => {
    const type = m.d.messageType;
    if (request && request.m.from !== m.from) {
      checkResponse(request, m);
      if (type === 'Wait' && request.m.from === 'sink') waited = m;
      if (type === 'Accept') {
        requestsAccepted++;
        accepted = { m, request, reported: false, epr: request.m.d.messageType === 'EPR_Request' || events.inEpr?.() === true };
        transition = true;
      }
      request = undefined;
      return;
    }
    if (other && other.m.from !== m.from) {
      checkResponse(other, m);
      if (type === 'Accept' && (other.m.d.messageType === 'PR_Swap' || other.m.d.messageType === 'FR_Swap')) {
        swapPsRdy = 2;
        transition = true;
        events.roleSwap?.(m.t);
      }
      other = undefined;
      return;
    }
    if (type === 'Accept' || type === 'Reject') unexpected(m, 'without a Request (or other message) to answer');
  };

  const onPsRdy = (m: SeenMessage): void => {
    if (swapPsRdy > 0) {
      // The port that sends the second PS_RDY is the new source: each side's count belongs to another port now.
      swapPsRdy--;
      if (swapPsRdy === 0) transition = false;
      events.roleSwap?.(m.t);
      return;
    }
    if (!accepted || m.from !== 'source') {
      unexpected(m, 'without an Accept before it');
      return;
    }
    const tPSTransition = psTransitionOf(accepted);
    const tookUs = m.endUs - ackEnd(accepted.m);
    if (tookUs > tPSTransition.maxUs) {
      const message = `The source sent PS_RDY ${millis(tookUs)} after its Accept at ${seconds(accepted.m.t)}; tPSTransition allows at most ${millis(tPSTransition.maxUs)}.`;
      if (accepted.finding) accepted.finding.message = message;
      else report('timing.ps-transition', message, { ...at(m), ref: tPSTransition.ref });
    }
    const { rdo, pdo } = accepted.request;
    accepted = undefined;
    transition = false;
    if (!pdo) return;
    const next = contractOf(rdo, pdo);
    const changed = !contract || !sameContract(contract.contract, next);
    contract = { contract: next, t: m.t, pdo, lastRequestUs: contract && !changed ? contract.lastRequestUs : m.t, keepAlive: { reported: false } };
    events.contract(next, m.t, changed);
  };

  return {
    onMessage(m) {
      if (m.sop !== 'SOP') return;
      revision.note(m);
      const type = m.d.messageType;
      // A wait already reported: the waiting side went on to send something else (Soft_Reset says more below).
      if (type !== 'Soft_Reset' && anyOpen()) for (const a of waits()) if (a.rule !== 'timing.pps-keepalive') movedOn(a, m.t, m.from, type);
      switch (type) {
        case 'Source_Capabilities':
          if (m.from === 'source') onCaps(m);
          return;
        case 'Request':
        case 'EPR_Request':
          onRequest(m);
          return;
        case 'Accept':
        case 'Reject':
        case 'Wait':
        case 'Not_Supported':
          onAnswer(m);
          return;
        case 'PS_RDY':
          onPsRdy(m);
          return;
        case 'Soft_Reset':
          for (const a of waits()) resetDuring(a, m.t, m.from, 'Soft_Reset', report);
          events.softReset(m);
          request = undefined;
          accepted = undefined;
          capsWaiting = undefined;
          other = { m, reported: false };
          return;
        default:
          if (NEEDS_ACCEPT.includes(type)) other = { m, reported: false };
      }
    },
    advance(t) {
      const { tSenderResponse, tPPSRequest } = timers();
      if (capsWaiting && pastDeadline(capsWaiting, capsWaiting.m.ackEndUs, tSenderResponse.maxUs, t)) expire(awaitRequestAfterCaps(capsWaiting), report);
      // Cheap test first: a Request's start is never later than its own end.
      if (request && !request.reported && t > request.m.endUs + tSenderResponse.maxUs) {
        const startUs = requestStart(request);
        // Never acknowledged in a trace that shows GoodCRCs: the partner did not take it (protocol.ts says so).
        if (startUs === undefined) request.reported = true;
        else if (pastDeadline(request, startUs, tSenderResponse.maxUs, t)) expire(awaitAnswerTo(request), report);
      }
      if (accepted && pastDeadline(accepted, ackEnd(accepted.m), psTransitionOf(accepted).maxUs, t)) expire(awaitPsRdyAfter(accepted), report);
      if (contract && contract.contract.kind === 'pps' && pastDeadline(contract.keepAlive, contract.lastRequestUs, tPPSRequest.maxUs, t)) {
        contract.keepAlive.reported = true;
        contract.keepAlive.finding = report(
          'timing.pps-keepalive',
          `The sink sent no new Request within tPPSRequest (${seconds(tPPSRequest.maxUs)}) of the one at ${seconds(contract.lastRequestUs)} while its programmable contract (${contractText(contract.contract)}) held.`,
          { t: contract.lastRequestUs + tPPSRequest.maxUs, ref: tPPSRequest.ref },
        );
      }
    },
    hardReset(t, from) {
      for (const a of waits()) resetDuring(a, t, from, 'a Hard Reset', report);
    },
    finish(t) {
      if (anyOpen()) for (const a of waits()) endedDuring(a, t);
    },
    hardResetCause(t) {
      const { tSenderResponse, tPPSRequest } = timers();
      if (accepted && t - ackEnd(accepted.m) >= psTransitionOf(accepted).minUs) return `the source accepted the Request at ${seconds(accepted.request.m.t)} but sent no PS_RDY within tPSTransition`;
      if (contract && contract.contract.kind === 'pps' && t - contract.lastRequestUs > tPPSRequest.maxUs) {
        return 'the sink stopped re-requesting its programmable contract';
      }
      if (request && t - ackEnd(request.m) >= tSenderResponse.minUs) {
        return `the ${request.m.from === 'sink' ? 'source' : 'sink'} did not answer the ${request.m.from}'s ${request.m.d.messageType} at ${seconds(request.m.t)} within tSenderResponse`;
      }
      if (capsWaiting && capsWaiting.m.ackEndUs !== undefined && t - capsWaiting.m.ackEndUs >= tSenderResponse.minUs) {
        return `the sink did not answer the Source_Capabilities at ${seconds(capsWaiting.m.t)} within tSenderResponse`;
      }
      return undefined;
    },
    reset(t) {
      if (contract) events.contractEnd(t);
      offers.reset();
      capsWaiting = undefined;
      request = undefined;
      accepted = undefined;
      other = undefined;
      waited = undefined;
      swapPsRdy = 0;
      contract = undefined;
      transition = false;
    },
    steadyContract: () => (transition ? undefined : contract),
    offers: () => offers.current()?.pdos,
    offersKey: () => offers.current()?.key ?? '',
    requestCounts: () => ({ requests: requestsSeen, requestsAccepted }),
  };
}

/** The data objects' hex without the 2-byte header (MessageID, roles, revision), which the checks never read. */
function objectsKey(m: SeenMessage): string {
  return m.d.hex.slice(4);
}

function located(f: Finding, m: SeenMessage): Finding {
  const out: Finding = { ...f, t: m.t };
  if (m.line !== undefined) out.line = m.line;
  return out;
}

function sameContract(a: Contract, b: Contract): boolean {
  return a.kind === b.kind && a.objectPosition === b.objectPosition && a.voltageMv === b.voltageMv && a.currentMa === b.currentMa;
}
