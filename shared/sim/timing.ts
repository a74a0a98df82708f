/**
 * How long each timer runs in one simulated run: a draw from the timer table's range
 * (shared/core/timers.ts) with the run's seeded generator, unless the scenario fixes it or holds
 * it at one end of that range (`scenario.timers`, a fault sweep's timer edges).
 */
import { timersFor, type TimerName } from '../core/timers.ts';
import type { Random } from './random.ts';
import type { Scenario } from './scenario.ts';
import type { Side } from './types.ts';
import type { Revision } from './wire.ts';

export type SimTimerName = TimerName;

/** The range a timer is drawn from, µs (the table's, narrowed where the simulator needs it). */
function drawRangeUs(name: SimTimerName, revision: Revision): [number, number] {
  const range = timersFor(revision)[name];
  switch (name) {
    case 'tTypeCSendSourceCap':
      // 10 ms under the maximum: the timer starts after the failed transmission and its retries
      // (about 5 ms), and Source_Capabilities start to start must stay within 100–200 ms.
      return [range.minUs, range.maxUs - 10_000];
    case 'tPPSRequest':
      // Keep-alive well inside tPPSRequest: 5–9 s (common practice).
      return [range.maxUs - 5_000_000, range.maxUs - 1_000_000];
    case 'tSinkRequest':
      return [range.minUs, range.minUs];
    case 'tEPRSourceCableDiscovery':
      // A maximum only: the source shall finish cable discovery within it (USB PD R3.1 V1.8 §6.4.10.1,
      // §8.3.3.26.2.2, from memory). As the source's own give-up deadline it runs in full; a draw from
      // 0 ms gave Enter_Failed on a good EPR cable whenever it fell before the cable's answer.
      return [range.maxUs, range.maxUs];
    default:
      return [range.minUs, range.maxUs];
  }
}

export function timerDurationUs(name: SimTimerName, _side: Side, revision: Revision, scenario: Scenario, random: Random): number {
  const source = scenario.source.behaviour;
  const fixedMs =
    name === 'tTypeCSendSourceCap'
      ? source.capsIntervalMs
      : name === 'tFirstSourceCap'
        ? source.firstCapsDelayMs
        : name === 'tSrcTransition'
          ? source.transitionDelayMs
          : name === 'tPPSRequest'
            ? scenario.sink.behaviour.ppsRequestIntervalMs
            : undefined;
  if (fixedMs !== undefined) return fixedMs * 1_000;
  const [minUs, maxUs] = drawRangeUs(name, revision);
  const edge = scenario.timers?.[name];
  if (edge !== undefined) return edge === 'min' ? minUs : maxUs;
  // tSinkRequest has one value and draws nothing, so the seed's sequence stays as it was.
  return name === 'tSinkRequest' ? minUs : random.between(minUs, maxUs);
}

/**
 * A port's processing time before it answers a message (common practice: 1.5–5 ms). Longer than
 * tReceive, so a lost GoodCRC is retried before the partner's answer comes, and far inside
 * tSenderResponse.
 */
export function responseDelayUs(random: Random): number {
  return random.between(1_500, 5_000);
}
