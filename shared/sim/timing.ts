/**
 * How long each timer runs in one simulated run: a draw from the timer table's range
 * (shared/core/timers.ts) with the run's seeded generator, unless the scenario fixes it.
 */
import { timersFor, type TimerName } from '../core/timers.ts';
import type { Random } from './random.ts';
import type { Scenario } from './scenario.ts';
import type { Side } from './types.ts';
import type { Revision } from './wire.ts';

export type SimTimerName = TimerName;

export function timerDurationUs(name: SimTimerName, side: Side, revision: Revision, scenario: Scenario, random: Random): number {
  const range = timersFor(revision)[name];
  const source = scenario.source.behaviour;
  switch (name) {
    case 'tTypeCSendSourceCap':
      // 10 ms under the maximum: the timer starts after the failed transmission and its retries
      // (about 5 ms), and Source_Capabilities start to start must stay within 100–200 ms.
      return source.capsIntervalMs !== undefined ? source.capsIntervalMs * 1_000 : random.between(range.minUs, range.maxUs - 10_000);
    case 'tFirstSourceCap':
      return source.firstCapsDelayMs !== undefined ? source.firstCapsDelayMs * 1_000 : random.between(range.minUs, range.maxUs);
    case 'tSrcTransition':
      return source.transitionDelayMs !== undefined ? source.transitionDelayMs * 1_000 : random.between(range.minUs, range.maxUs);
    case 'tPPSRequest': {
      const fixedMs = scenario.sink.behaviour.ppsRequestIntervalMs;
      // Keep-alive well inside tPPSRequest: 5–9 s (common practice).
      return fixedMs !== undefined ? fixedMs * 1_000 : random.between(range.maxUs - 5_000_000, range.maxUs - 1_000_000);
    }
    case 'tSinkRequest':
      return range.minUs;
    default:
      return random.between(range.minUs, range.maxUs);
  }
}

/**
 * A port's processing time before it answers a message (common practice: 1.5–5 ms). Longer than
 * tReceive, so a lost GoodCRC is retried before the partner's answer comes, and far inside
 * tSenderResponse.
 */
export function responseDelayUs(random: Random): number {
  return random.between(1_500, 5_000);
}
