/**
 * The policy level's timing checks on an answer that did come: within tSenderResponse of the
 * acknowledged message and started within tReceiverResponse (§6.6.2), a sink's new Request no
 * sooner than tSinkRequest after a Wait (§6.6.4.2), PS_RDY within tPSTransition of the Accept
 * (§6.6.4.1). A finding already made when the timer ran out is reworded with what came after all.
 */
import type { TimerRangeUs, TimerTable } from '../core/timers.ts';
import { millis, seconds } from './format.ts';
import { type Accepted, ackEnd, type Pending } from './policy-waits.ts';
import type { Report, SeenMessage } from './seen.ts';

const at = (m: SeenMessage): { t: number; line: number | undefined } => ({ t: m.t, line: m.line });

/**
 * A response within tSenderResponse of the (acknowledged) message it answers (the asker's timer,
 * ended by the response's EOP), and started within tReceiverResponse (the responder's own limit,
 * from memory 15 ms; §6.6.2 and Time Values table) — later than that is a warning while the asker still waits.
 */
export function checkResponse(report: Report, timers: TimerTable, first: Pending, response: SeenMessage): void {
  const { tSenderResponse, tReceiverResponse } = timers;
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
}

/** The sink's Request `m` after the source's Wait `waited`. */
export function checkSinkRequestAfterWait(report: Report, timers: TimerTable, waited: SeenMessage, m: SeenMessage): void {
  const { tSinkRequest } = timers;
  const afterUs = m.t - ackEnd(waited);
  if (afterUs >= tSinkRequest.minUs) return;
  report(
    'timing.sink-request',
    `The sink asked again at ${seconds(m.t)}, ${millis(afterUs)} after the source's Wait at ${seconds(waited.t)}; tSinkRequest asks it to wait at least ${millis(tSinkRequest.minUs)}.`,
    { ...at(m), ref: tSinkRequest.ref },
  );
}

/** PS_RDY `m` after the Accept (`tPSTransition` of the mode it came in). */
export function checkPsTransition(report: Report, tPSTransition: TimerRangeUs, accepted: Accepted, m: SeenMessage): void {
  const tookUs = m.endUs - ackEnd(accepted.m);
  if (tookUs <= tPSTransition.maxUs) return;
  const message = `The source sent PS_RDY ${millis(tookUs)} after its Accept at ${seconds(accepted.m.t)}; tPSTransition allows at most ${millis(tPSTransition.maxUs)}.`;
  if (accepted.finding) accepted.finding.message = message;
  else report('timing.ps-transition', message, { ...at(m), ref: tPSTransition.ref });
}

/** "came before any Source_Capabilities": a message the state did not allow. */
export function unexpected(report: Report, m: SeenMessage, why: string): void {
  report('protocol.unexpected', `The ${m.from}'s ${m.d.messageType} at ${seconds(m.t)} came ${why}.`, at(m));
}
