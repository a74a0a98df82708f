/**
 * The policy level of both ports: offers, requests, contracts and the timers between them.
 * Times follow the specification's measuring points (from memory, USB PD R3.2 V1.1 §6.6):
 * a response timer (SenderResponseTimer §6.6.2, PSTransitionTimer §6.6.5) starts when the GoodCRC
 * acknowledging the message ends (its EOP) and stops when the awaited message has been received,
 * i.e. at its EOP — so both ends are message ends, never preamble starts. Without a captured GoodCRC
 * the acknowledged message's own end is used. Limits come from shared/core/timers.ts by the
 * revision in operation (the lower of the two ports' Specification Revision fields, §6.2.1.1.5).
 * Split along its seams: the offers in force and their checks (offers.ts), the revision in
 * operation (revision.ts), EPR mode (epr.ts), where the sequence stands (policy-state.ts), the
 * waits and their words (policy-waits.ts) and the checks of answers that came (policy-checks.ts);
 * this module reads each message into that request → answer → PS_RDY → contract sequence.
 */
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import type { TimerTable } from '../core/timers.ts';
import { decodeRdo, decodeSourcePdo } from '../pd/index.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import { checkRequest } from '../rules/check-request.ts';
import { contractOf } from '../rules/contract-of.ts';
import { endedDuring, expire, movedOn, pastDeadline, resetDuring } from './awaited.ts';
import { objectAt } from './decode-cache.ts';
import { contractText, seconds } from './format.ts';
import type { AnalyserMemo } from './memo.ts';
import { createOffersTracker, type OffersTracker } from './offers.ts';
import { checkPsTransition, checkResponse, checkSinkRequestAfterWait, unexpected } from './policy-checks.ts';
import { PolicyState } from './policy-state.ts';
import { type ActiveContract, ackEnd, awaitAnswerTo, awaitPsRdyAfter, awaitRequestAfterCaps, type Pending, psTransitionOf } from './policy-waits.ts';
import type { TraceSide } from './records.ts';
import { createRevisionInOperation, type RevisionInOperation } from './revision.ts';
import type { Report, SeenMessage } from './seen.ts';

const SOURCE_PDO_KINDS: readonly string[] = ['fixed', 'variable', 'battery', 'pps', 'epr-avs', 'spr-avs'];
/** Messages the partner answers with Accept, Reject, Wait or Not_Supported. */
const NEEDS_ACCEPT: readonly string[] = ['Soft_Reset', 'PR_Swap', 'DR_Swap', 'VCONN_Swap', 'FR_Swap', 'Data_Reset', 'Enter_USB', 'EPR_Mode'];
/**
 * Offers and requests are checked once each: a source repeats unanswered offers and a keep-alive repeats
 * the same Request every few seconds. They are keyed by their data objects, not the header, whose
 * MessageID alone would make up to eight copies of one list.
 */
const CHECKED_LIMIT = 1_024;

export interface PolicyEvents {
  /** A contract in force from `t` (its PS_RDY), made with the offer `pdo`; `changed` when it differs from the one before. */
  contract(contract: Contract, t: number, changed: boolean, pdo: SourcePdo): void;
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
  return new PolicyLevel(report, events, memo);
}

class PolicyLevel implements PolicyTracker {
  private readonly state = new PolicyState();
  private readonly offersInForce: OffersTracker;
  private readonly revision: RevisionInOperation = createRevisionInOperation();
  /** Requests already checked, by the offers they answer and their data objects. */
  private readonly rdos = new Map<string, Rdo>();
  /** A Request's timer start: its GoodCRC's end, or its own end in a log that records no GoodCRC at all. */
  private readonly requestStart = (p: Pending): number | undefined => p.m.ackEndUs ?? (this.events.goodCrcSeen?.() === false ? p.m.endUs : undefined);

  constructor(
    private readonly report: Report,
    private readonly events: PolicyEvents,
    memo: AnalyserMemo | undefined,
  ) {
    this.offersInForce = createOffersTracker(report, (f) => events.finding(f), memo);
  }

  private timers(): TimerTable {
    return this.revision.timers();
  }

  onMessage(m: SeenMessage): void {
    if (m.sop !== 'SOP') return;
    this.revision.note(m);
    const type = m.d.messageType;
    const state = this.state;
    // A wait already reported: the waiting side went on to send something else (Soft_Reset says more below).
    if (type !== 'Soft_Reset' && state.anyOpen()) {
      for (const a of state.waits(this.timers(), this.requestStart)) if (a.rule !== 'timing.pps-keepalive') movedOn(a, m.t, m.from, type);
    }
    switch (type) {
      case 'Source_Capabilities':
        if (m.from === 'source' && this.offersInForce.onCaps(m, state.contract !== undefined, this.timers())) state.offered(m);
        return;
      case 'Request':
      case 'EPR_Request':
        this.onRequest(m);
        return;
      case 'Accept':
      case 'Reject':
      case 'Wait':
      case 'Not_Supported':
        this.onAnswer(m);
        return;
      case 'PS_RDY':
        this.onPsRdy(m);
        return;
      case 'Soft_Reset':
        for (const a of state.waits(this.timers(), this.requestStart)) resetDuring(a, m.t, m.from, 'Soft_Reset', this.report);
        this.events.softReset(m);
        state.softReset(m);
        return;
      default:
        if (NEEDS_ACCEPT.includes(type)) state.awaitAnswer(m);
    }
  }

  private onRequest(m: SeenMessage): void {
    const state = this.state;
    const epr = m.d.messageType === 'EPR_Request';
    const raw = objectAt(m.d.bytes, 1);
    if (raw === undefined) return;
    const caps = this.offersInForce.current();
    if (!caps && !epr) unexpected(this.report, m, 'before any Source_Capabilities');
    if (state.waited && m.from === 'sink') checkSinkRequestAfterWait(this.report, this.timers(), state.waited, m);
    if (state.capsWaiting) checkResponse(this.report, this.timers(), state.capsWaiting, m);
    this.offersInForce.answered();
    const position = (raw >>> 28) & 0xf;
    let pdo: SourcePdo | undefined = caps?.pdos[position - 1];
    if (epr) {
      // An EPR_Request carries a copy of the offer it asks for (§6.4.9).
      const copy = objectAt(m.d.bytes, 2);
      const decoded = copy === undefined ? undefined : decodeSourcePdo(copy);
      if (decoded && SOURCE_PDO_KINDS.includes(decoded.kind)) pdo = decoded as SourcePdo;
    }
    const key = `${caps ? caps.key : '-'} ${m.d.messageType} ${objectsKey(m)}`;
    let rdo = this.rdos.get(key);
    if (rdo === undefined) {
      if (this.rdos.size >= CHECKED_LIMIT) this.rdos.clear();
      rdo = decodeRdo(raw, pdo);
      this.rdos.set(key, rdo);
      if (caps && !epr) for (const f of checkRequest(rdo, caps.pdos, { t: m.t })) this.events.finding(located(f, m));
    }
    state.requested(m, rdo, pdo);
  }

  private onAnswer(m: SeenMessage): void {
    const state = this.state;
    const type = m.d.messageType;
    if (state.request && state.request.m.from !== m.from) {
      checkResponse(this.report, this.timers(), state.request, m);
      state.requestAnswered(m, this.events.inEpr?.() === true);
      return;
    }
    if (state.other && state.other.m.from !== m.from) {
      checkResponse(this.report, this.timers(), state.other, m);
      if (state.otherAnswered(m)) this.events.roleSwap?.(m.t);
      return;
    }
    if (type === 'Accept' || type === 'Reject') unexpected(this.report, m, 'without a Request (or other message) to answer');
  }

  private onPsRdy(m: SeenMessage): void {
    const state = this.state;
    // The port that sends the second PS_RDY of a swap is the new source: each side's count belongs to another port now.
    if (state.swapPsRdy()) {
      this.events.roleSwap?.(m.t);
      return;
    }
    const accepted = state.accepted;
    if (!accepted || m.from !== 'source') {
      unexpected(this.report, m, 'without an Accept before it');
      return;
    }
    checkPsTransition(this.report, psTransitionOf(accepted, this.timers()), accepted, m);
    const { rdo, pdo } = accepted.request;
    state.supplied();
    if (!pdo) return;
    const next = contractOf(rdo, pdo);
    const changed = state.contracted(next, m.t, pdo);
    this.events.contract(next, m.t, changed, pdo);
  }

  advance(t: number): void {
    const { capsWaiting, request, accepted } = this.state;
    const timers = this.timers();
    const { tSenderResponse, tPPSRequest } = timers;
    if (capsWaiting && pastDeadline(capsWaiting, capsWaiting.m.ackEndUs, tSenderResponse.maxUs, t)) expire(awaitRequestAfterCaps(capsWaiting, timers), this.report);
    // Cheap test first: a Request's start is never later than its own end.
    if (request && !request.reported && t > request.m.endUs + tSenderResponse.maxUs) {
      const startUs = this.requestStart(request);
      // Never acknowledged in a trace that shows GoodCRCs: the partner did not take it (protocol.ts says so).
      if (startUs === undefined) request.reported = true;
      else if (pastDeadline(request, startUs, tSenderResponse.maxUs, t)) expire(awaitAnswerTo(request, timers, startUs), this.report);
    }
    if (accepted && pastDeadline(accepted, ackEnd(accepted.m), psTransitionOf(accepted, timers).maxUs, t)) expire(awaitPsRdyAfter(accepted, timers), this.report);
    const programmable = this.state.programmable();
    if (programmable && pastDeadline(programmable.keepAlive, programmable.lastRequestUs, tPPSRequest.maxUs, t)) {
      programmable.keepAlive.reported = true;
      programmable.keepAlive.finding = this.report(
        'timing.pps-keepalive',
        `The sink sent no new Request within tPPSRequest (${seconds(tPPSRequest.maxUs)}) of the one at ${seconds(programmable.lastRequestUs)} while its programmable contract (${contractText(programmable.contract)}) held.`,
        { t: programmable.lastRequestUs + tPPSRequest.maxUs, ref: tPPSRequest.ref },
      );
    }
  }

  hardReset(t: number, from: TraceSide | undefined): void {
    for (const a of this.state.waits(this.timers(), this.requestStart)) resetDuring(a, t, from, 'a Hard Reset', this.report);
  }

  finish(t: number): void {
    if (this.state.anyOpen()) for (const a of this.state.waits(this.timers(), this.requestStart)) endedDuring(a, t);
  }

  hardResetCause(t: number): string | undefined {
    const { capsWaiting, request, accepted } = this.state;
    const timers = this.timers();
    const { tSenderResponse, tPPSRequest } = timers;
    if (accepted && t - ackEnd(accepted.m) >= psTransitionOf(accepted, timers).minUs) {
      return `the source accepted the Request at ${seconds(accepted.request.m.t)} but sent no PS_RDY within tPSTransition`;
    }
    const programmable = this.state.programmable();
    if (programmable && t - programmable.lastRequestUs > tPPSRequest.maxUs) return 'the sink stopped re-requesting its programmable contract';
    if (request && t - ackEnd(request.m) >= tSenderResponse.minUs) {
      return `the ${request.m.from === 'sink' ? 'source' : 'sink'} did not answer the ${request.m.from}'s ${request.m.d.messageType} at ${seconds(request.m.t)} within tSenderResponse`;
    }
    if (capsWaiting && capsWaiting.m.ackEndUs !== undefined && t - capsWaiting.m.ackEndUs >= tSenderResponse.minUs) {
      return `the sink did not answer the Source_Capabilities at ${seconds(capsWaiting.m.t)} within tSenderResponse`;
    }
    return undefined;
  }

  reset(t: number): void {
    if (this.state.contract) this.events.contractEnd(t);
    this.offersInForce.reset();
    this.state.reset();
  }

  steadyContract(): ActiveContract | undefined {
    return this.state.steadyContract();
  }
  offers(): SourcePdo[] | undefined {
    return this.offersInForce.current()?.pdos;
  }
  offersKey(): string {
    return this.offersInForce.current()?.key ?? '';
  }
  requestCounts(): { requests: number; requestsAccepted: number } {
    return this.state.requestCounts();
  }
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
