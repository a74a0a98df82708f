/**
 * Timer and counter values used by the trace analyser and the simulator: one table, one place.
 *
 * Source: USB PD R3.2 V1.1 §6.6 and the Time Values / Counter Values tables of §6.6.x
 * (R3.1 V1.8 Table 6.68 "Time Values", Table 6.69 "Counter Values"); R2.0 values where they differ
 * come from USB PD R2.0 V1.3 §6.6. USB Type-C R2.3 §4.11 for tCCDebounce.
 * Helpers that refine a value must keep its citation beside it.
 */
export interface TimerRangeUs {
  minUs: number;
  maxUs: number;
  ref: string;
}

const PD3 = 'USB PD R3.2 V1.1 §6.6, Time Values table';
const PD2 = 'USB PD R2.0 V1.3 §6.6, Time Values table';

/** PD R3.x timers, in microseconds. */
export const timersPd3 = {
  tSenderResponse: { minUs: 27_000, maxUs: 33_000, ref: `${PD3} (tSenderResponse)` },
  tPSTransition: { minUs: 450_000, maxUs: 550_000, ref: `${PD3} (tPSTransition)` },
  tTypeCSendSourceCap: { minUs: 100_000, maxUs: 200_000, ref: `${PD3} (tTypeCSendSourceCap)` },
  tReceive: { minUs: 900, maxUs: 1_100, ref: `${PD3} (tReceive)` },
  tPPSRequest: { minUs: 0, maxUs: 10_000_000, ref: `${PD3} (tPPSRequest)` },
  tPPSTimeout: { minUs: 12_000_000, maxUs: 15_000_000, ref: `${PD3} (tPPSTimeout)` },
  tSrcTransition: { minUs: 25_000, maxUs: 35_000, ref: `${PD3} (tSrcTransition)` },
  tPSHardReset: { minUs: 25_000, maxUs: 35_000, ref: `${PD3} (tPSHardReset)` },
  tSafe0V: { minUs: 0, maxUs: 650_000, ref: `${PD3} (tSafe0V)` },
  tSrcRecover: { minUs: 660_000, maxUs: 1_000_000, ref: `${PD3} (tSrcRecover)` },
  tSrcTurnOn: { minUs: 0, maxUs: 275_000, ref: `${PD3} (tSrcTurnOn)` },
  tSinkRequest: { minUs: 100_000, maxUs: 100_000, ref: `${PD3} (tSinkRequest, minimum)` },
  tSinkWaitCap: { minUs: 310_000, maxUs: 620_000, ref: `${PD3} (tSinkWaitCap)` },
  tFirstSourceCap: { minUs: 0, maxUs: 250_000, ref: `${PD3} (tFirstSourceCap)` },
  tNoResponse: { minUs: 4_500_000, maxUs: 5_500_000, ref: `${PD3} (tNoResponse)` },
  tHardResetComplete: { minUs: 4_000, maxUs: 5_000, ref: `${PD3} (tHardResetComplete)` },
  tChunkSenderResponse: { minUs: 24_000, maxUs: 30_000, ref: `${PD3} (tChunkSenderResponse)` },
  tTransmit: { minUs: 0, maxUs: 195, ref: `${PD3} (tTransmit)` },
  tCCDebounce: { minUs: 100_000, maxUs: 200_000, ref: 'USB Type-C R2.3 §4.11.2, tCCDebounce' },
  /** Idle time between packets on the line, minimum only (USB PD R3.2 V1.1 §5.8.5, from memory). */
  tInterFrameGap: { minUs: 25, maxUs: 25, ref: 'USB PD R3.2 V1.1 §5.8.5 tInterFrameGap (from memory)' },
} satisfies Record<string, TimerRangeUs>;

export type TimerName = keyof typeof timersPd3;
export type TimerTable = Record<TimerName, TimerRangeUs>;

/** PD R2.0 timers: the same table with the values R2.0 gives where they differ. */
export const timersPd2: TimerTable = {
  ...timersPd3,
  tSenderResponse: { minUs: 24_000, maxUs: 30_000, ref: `${PD2} (tSenderResponse)` },
};

export interface CounterTable {
  nRetryCount: number;
  nCapsCount: number;
  nHardResetCount: number;
  ref: string;
}

export const countersPd3: CounterTable = { nRetryCount: 2, nCapsCount: 50, nHardResetCount: 2, ref: 'USB PD R3.2 V1.1 §6.7, Counter Values table' };
export const countersPd2: CounterTable = { nRetryCount: 3, nCapsCount: 50, nHardResetCount: 2, ref: 'USB PD R2.0 V1.3 §6.7, Counter Values table' };

/** The timer table in force for a message's Specification Revision field ("2.0" or "1.0" use R2.0 values). */
export function timersFor(specRevision: string): TimerTable {
  return specRevision === '1.0' || specRevision === '2.0' ? timersPd2 : timersPd3;
}

export function countersFor(specRevision: string): CounterTable {
  return specRevision === '1.0' || specRevision === '2.0' ? countersPd2 : countersPd3;
}
