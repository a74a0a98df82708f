/**
 * Messages a port waits for — a Request after Source_Capabilities, an answer to a Request, PS_RDY
 * after Accept, the next keep-alive Request of a programmable contract — and what the analyser says
 * when one never comes.
 *
 * The waiting side's timer may run out anywhere inside its range (USB PD R3.2 V1.1 §6.6.2
 * SenderResponseTimer, §6.6.5 PSTransitionTimer; in the state diagrams of §8.3.3.2 (source,
 * PE_SRC_Send_Capabilities) and §8.3.3.3 (sink, PE_SNK_Select_Capability, PE_SNK_Transition_Sink)
 * that timeout leads to a Hard Reset; from memory). So the
 * awaited message is missing when
 * - the trace goes on past the range's maximum with no answer (any record, or its end), or
 * - the waiting side gives up (Hard Reset, Soft_Reset) once the range's minimum has passed.
 * A reset before the minimum is the waiting side's own haste, not a missing answer.
 * Once reported, the finding is finished with what happened next ("the sink sent a Hard Reset
 * 31.5 ms after the Request was acknowledged").
 */
import type { Finding } from '../core/finding.ts';
import type { TimerRangeUs } from '../core/timers.ts';
import { millis, seconds } from './format.ts';
import type { TraceSide } from './records.ts';
import type { Report } from './seen.ts';

/** The reporting state of one wait. */
export interface Watch {
  reported: boolean;
  /** The finding a timer that ran out made, refined when the answer comes after all. */
  finding?: Finding;
  /** The finding's sentence already says what happened next. */
  closed?: boolean;
}

export interface Awaited {
  watch: Watch;
  rule: 'timing.sender-response' | 'timing.ps-transition' | 'timing.pps-keepalive';
  timerName: 'tSenderResponse' | 'tPSTransition' | 'tPPSRequest';
  timer: TimerRangeUs;
  /** When the waiting side's timer started (µs); undefined when the trace cannot tell. */
  startUs: number | undefined;
  /** The side whose timer runs and who gives up with a reset. */
  waiter: TraceSide;
  line: number | undefined;
  /** "The source did not answer the sink's Request at 0.357 s" (no final stop). */
  missing: string;
  /** "after the Request was acknowledged". */
  since: string;
  /** "no answer", "no PS_RDY". */
  none: string;
  /** A reset by the waiter this long after the start means the answer was missing (the timer's minimum). */
  giveUpAfterUs: number;
}

/** Durations in the unit a reader expects: "31.5 ms", "12.5 s". */
const span = (us: number): string => (us >= 2_000_000 ? seconds(us) : millis(us));
const limit = (a: Awaited): string => span(a.timer.maxUs);
const range = (a: Awaited): string => `${Number((a.timer.minUs / 1_000).toFixed(1))}–${millis(a.timer.maxUs)}`;

function close(a: Awaited, clause: string): void {
  const f = a.watch.finding;
  if (!f || a.watch.closed) return;
  f.message = f.message.replace(/\.$/, `; ${clause}.`);
  a.watch.closed = true;
}

/** Whether the trace at `t` is past the deadline of a wait not yet reported (cheap; call before building). */
export function pastDeadline(watch: Watch, startUs: number | undefined, maxUs: number, t: number): boolean {
  return !watch.reported && startUs !== undefined && t > startUs + maxUs;
}

/** The trace reached `t` past the deadline with no answer: report it. */
export function expire(a: Awaited, report: Report): void {
  if (a.watch.reported || a.startUs === undefined) return;
  a.watch.reported = true;
  a.watch.finding = report(a.rule, `${a.missing} within ${a.timerName} (${limit(a)}).`, {
    t: a.startUs + a.timer.maxUs,
    ...(a.line !== undefined ? { line: a.line } : {}),
    ref: a.timer.ref,
  });
}

/** A reset (`what` = "a Hard Reset", "Soft_Reset") from `who` at `t` ended the wait. */
export function resetDuring(a: Awaited, t: number, who: TraceSide | undefined, what: string, report: Report): void {
  if (a.startUs === undefined) return;
  const elapsedUs = t - a.startUs;
  const clause = `${who ? `the ${who} sent ${what}` : `${what} came`} ${span(elapsedUs)} ${a.since}`;
  if (a.watch.finding) {
    close(a, clause);
    return;
  }
  if (a.watch.reported || (who !== undefined && who !== a.waiter) || elapsedUs < a.giveUpAfterUs) return;
  a.watch.reported = true;
  a.watch.closed = true;
  a.watch.finding = report(a.rule, `${a.missing} before the ${a.waiter}'s ${a.timerName} timer ran out (${range(a)}); ${clause}.`, {
    t,
    ...(a.line !== undefined ? { line: a.line } : {}),
    ref: a.timer.ref,
  });
}

/** The waiting side sent `messageType` at `t` after its wait was reported. */
export function movedOn(a: Awaited, t: number, from: TraceSide, messageType: string): void {
  if (a.startUs === undefined || from !== a.waiter) return;
  close(a, `the ${from} sent ${messageType} ${span(t - a.startUs)} ${a.since}`);
}

/** The trace ended at `t` with the wait reported and still open. */
export function endedDuring(a: Awaited, t: number): void {
  if (a.startUs === undefined) return;
  close(a, `the trace ends ${span(t - a.startUs)} ${a.since} with ${a.none}`);
}

/** Whether a reported finding may still be finished (so the per-message path stays cheap). */
export const isOpen = (watch: Watch | undefined): boolean => watch?.finding !== undefined && watch.closed !== true;
