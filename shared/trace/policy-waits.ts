/**
 * The policy level's waits (awaited.ts): what is pending between an offer, a Request, its answer,
 * PS_RDY and the next keep-alive Request of the contract in force, when each wait's timer starts,
 * and the words its finding uses when the awaited message never comes. Pure functions of the pending message and the timer
 * table of the revision in operation.
 */
import type { Contract } from '../core/contract.ts';
import type { TimerRangeUs, TimerTable } from '../core/timers.ts';
import type { Rdo, SourcePdo } from '../pd/types.ts';
import type { Awaited, Watch } from './awaited.ts';
import { seconds } from './format.ts';
import type { SeenMessage } from './seen.ts';
import type { VbusLimits } from './vbus.ts';

/** A message whose answer is awaited. */
export interface Pending extends Watch {
  m: SeenMessage;
}
export interface PendingRequest extends Pending {
  rdo: Rdo;
  pdo: SourcePdo | undefined;
}
/** An Accept of a Request: PS_RDY is awaited. */
export interface Accepted extends Pending {
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

/** Where a response timer starts: the acknowledging GoodCRC's end, else the message's own end. */
export function ackEnd(m: SeenMessage): number {
  return m.ackEndUs ?? m.endUs;
}

/** tPSTransition of the mode the Accept came in (§6.6.4.1, Time Values: SPR and EPR values differ). */
export function psTransitionOf(a: Accepted, timers: TimerTable): TimerRangeUs {
  return a.epr ? timers.tPSTransitionEpr : timers.tPSTransition;
}

function sinceText(p: Pending): string {
  return `after the ${p.m.d.messageType} ${p.m.ackEndUs !== undefined ? 'was acknowledged' : 'ended'}`;
}

export function awaitRequestAfterCaps(p: Pending, timers: TimerTable): Awaited {
  const { tSenderResponse } = timers;
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
}

/** `startUs`: when the waiter's timer started (the tracker knows whether the log records GoodCRCs at all). */
export function awaitAnswerTo(p: Pending, timers: TimerTable, startUs: number | undefined): Awaited {
  const { tSenderResponse } = timers;
  const waiter = p.m.from;
  const answerer = waiter === 'sink' ? 'source' : 'sink';
  return {
    watch: p,
    rule: 'timing.sender-response',
    timerName: 'tSenderResponse',
    timer: tSenderResponse,
    startUs,
    waiter,
    line: p.m.line,
    missing: `The ${answerer} did not answer the ${waiter}'s ${p.m.d.messageType} at ${seconds(p.m.t)}`,
    since: sinceText(p),
    none: 'no answer',
    giveUpAfterUs: tSenderResponse.minUs,
  };
}

export function awaitPsRdyAfter(p: Accepted, timers: TimerTable): Awaited {
  const tPSTransition = psTransitionOf(p, timers);
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
}

/** The keep-alive's finding is worded when its timer runs out (policy.ts); this only finishes it (a reset never reports it early). */
export function awaitKeepAlive(c: ActiveContract, timers: TimerTable): Awaited {
  return {
    watch: c.keepAlive,
    rule: 'timing.pps-keepalive',
    timerName: 'tPPSRequest',
    timer: timers.tPPSRequest,
    startUs: c.lastRequestUs,
    waiter: 'source',
    line: undefined,
    missing: 'The sink sent no new Request',
    since: 'later',
    none: 'no new Request',
    giveUpAfterUs: Number.POSITIVE_INFINITY,
  };
}
