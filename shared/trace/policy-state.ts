/**
 * Where the policy level of a trace stands: the offers, Request, Accept or other message whose
 * answer is awaited, the Wait the sink must respect, a power role swap's two PS_RDYs, and the
 * contract in force. Every change is a named transition, so policy.ts reads as the sequence
 * Source_Capabilities → Request → Accept → PS_RDY → contract; the checks stay there.
 */
import type { Contract } from '../core/contract.ts';
import type { TimerTable } from '../core/timers.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import { type Awaited, isOpen } from './awaited.ts';
import { type Accepted, type ActiveContract, awaitAnswerTo, awaitKeepAlive, awaitPsRdyAfter, awaitRequestAfterCaps, type Pending, type PendingRequest } from './policy-waits.ts';
import type { SeenMessage } from './seen.ts';

export class PolicyState {
  /** Source_Capabilities waiting for a Request. */
  capsWaiting: Pending | undefined;
  /** A Request (or a source's message that wants an answer) waiting for Accept, Reject or Wait. */
  request: PendingRequest | undefined;
  /** An accepted Request waiting for PS_RDY. */
  accepted: Accepted | undefined;
  /** A Soft_Reset, a swap or another message that the partner answers with Accept, Reject, Wait or Not_Supported. */
  other: Pending | undefined;
  /** The source's Wait to the sink's Request: the sink may ask again only tSinkRequest later (§6.6.4.2). */
  waited: SeenMessage | undefined;
  contract: ActiveContract | undefined;
  /** PS_RDYs still to come in an accepted PR_Swap or FR_Swap. */
  private swapPsRdys = 0;
  /** Between an Accept and its PS_RDY (or a swap's last PS_RDY): VBUS may move. */
  private transition = false;
  private requestsSeen = 0;
  private requestsAccepted = 0;

  /** New offers: any earlier Request or Wait is void. */
  offered(m: SeenMessage): void {
    this.waited = undefined;
    this.capsWaiting = { m, reported: false };
    this.request = undefined;
  }

  /** A Request answers the offers; in a contract it also restarts the keep-alive. */
  requested(m: SeenMessage, rdo: Rdo, pdo: SourcePdo | undefined): void {
    this.waited = undefined;
    this.capsWaiting = undefined;
    this.request = { m, rdo, pdo, reported: false };
    this.requestsSeen++;
    if (this.contract) {
      this.contract.lastRequestUs = m.t;
      this.contract.keepAlive = { reported: false };
    }
  }

  /** The partner answered the pending Request with `m` (`inEpr`: EPR mode holds as it accepts). */
  requestAnswered(m: SeenMessage, inEpr: boolean): void {
    const request = this.request;
    if (!request) return;
    const type = m.d.messageType;
    if (type === 'Wait' && request.m.from === 'sink') this.waited = m;
    if (type === 'Accept') {
      this.requestsAccepted++;
      this.accepted = { m, request, reported: false, epr: request.m.d.messageType === 'EPR_Request' || inEpr };
      this.transition = true;
    }
    this.request = undefined;
  }

  /** The partner answered the other pending message; returns true when that accepted a power role swap. */
  otherAnswered(m: SeenMessage): boolean {
    const asked = this.other?.m.d.messageType;
    this.other = undefined;
    if (m.d.messageType !== 'Accept' || (asked !== 'PR_Swap' && asked !== 'FR_Swap')) return false;
    this.swapPsRdys = 2;
    this.transition = true;
    return true;
  }

  /** A message the partner must answer with Accept, Reject, Wait or Not_Supported. */
  awaitAnswer(m: SeenMessage): void {
    this.other = { m, reported: false };
  }

  /** Inside an accepted swap, a PS_RDY takes its place in the swap; returns false outside one. */
  swapPsRdy(): boolean {
    if (this.swapPsRdys === 0) return false;
    this.swapPsRdys--;
    if (this.swapPsRdys === 0) this.transition = false;
    return true;
  }

  /** PS_RDY after the accepted Request: the transition ends. */
  supplied(): void {
    this.accepted = undefined;
    this.transition = false;
  }

  /** The contract of a completed Request from `t`; returns true when it differs from the one before. */
  contracted(next: Contract, t: number, pdo: SourcePdo): boolean {
    const before = this.contract;
    const changed = !before || !sameContract(before.contract, next);
    this.contract = { contract: next, t, pdo, lastRequestUs: before && !changed ? before.lastRequestUs : t, keepAlive: { reported: false } };
    return changed;
  }

  /** A Soft_Reset: the exchanges in progress end, and the Soft_Reset itself awaits its Accept. */
  softReset(m: SeenMessage): void {
    this.request = undefined;
    this.accepted = undefined;
    this.capsWaiting = undefined;
    this.other = { m, reported: false };
  }

  /** Hard Reset, detach, attach: the negotiation starts over and the contract ends. */
  reset(): void {
    this.capsWaiting = undefined;
    this.request = undefined;
    this.accepted = undefined;
    this.other = undefined;
    this.waited = undefined;
    this.swapPsRdys = 0;
    this.contract = undefined;
    this.transition = false;
  }

  /** The contract VBUS must meet now: none during a transition or before the first PS_RDY. */
  steadyContract(): ActiveContract | undefined {
    return this.transition ? undefined : this.contract;
  }

  /** A programmable contract, kept alive by a Request every tPPSRequest. */
  programmable(): ActiveContract | undefined {
    return this.contract?.contract.kind === 'pps' ? this.contract : undefined;
  }

  /** Some wait is still open (nothing reported, or reported and not yet finished). */
  anyOpen(): boolean {
    return isOpen(this.capsWaiting) || isOpen(this.request) || isOpen(this.accepted) || isOpen(this.contract?.keepAlive);
  }

  /** The waits in force, answers first; `requestStartUs` gives a pending Request's timer start. */
  waits(timers: TimerTable, requestStartUs: (p: Pending) => number | undefined): Awaited[] {
    const list: Awaited[] = [];
    if (this.capsWaiting) list.push(awaitRequestAfterCaps(this.capsWaiting, timers));
    if (this.request) list.push(awaitAnswerTo(this.request, timers, requestStartUs(this.request)));
    if (this.accepted) list.push(awaitPsRdyAfter(this.accepted, timers));
    const programmable = this.programmable();
    if (programmable) list.push(awaitKeepAlive(programmable, timers));
    return list;
  }

  requestCounts(): { requests: number; requestsAccepted: number } {
    return { requests: this.requestsSeen, requestsAccepted: this.requestsAccepted };
  }
}

function sameContract(a: Contract, b: Contract): boolean {
  return a.kind === b.kind && a.objectPosition === b.objectPosition && a.voltageMv === b.voltageMv && a.currentMa === b.currentMa;
}
