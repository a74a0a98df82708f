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
  /** ErrorRecovery: both ports remove their terminations for at least tErrorRecovery, then attach again. */
  tErrorRecovery: { minUs: 25_000, maxUs: 25_000, ref: 'USB Type-C R2.3 §4.11.2, tErrorRecovery (minimum)' },
  /** Idle time between packets on the line, minimum only (USB PD R3.2 V1.1 §5.8.5, from memory). */
  tInterFrameGap: { minUs: 25, maxUs: 25, ref: 'USB PD R3.2 V1.1 §5.8.5 tInterFrameGap (from memory)' },

  // Responses and chunking (§6.6.2, §6.6.18). A port answers a message that needs an answer within tReceiverResponse.
  tReceiverResponse: { minUs: 0, maxUs: 15_000, ref: `${PD3} (tReceiverResponse, maximum)` },
  tChunkSenderRequest: { minUs: 24_000, maxUs: 30_000, ref: `${PD3} (tChunkSenderRequest, from memory)` },
  tChunkReceiverRequest: { minUs: 0, maxUs: 15_000, ref: `${PD3} (tChunkReceiverRequest, from memory)` },
  tChunkReceiverResponse: { minUs: 0, maxUs: 15_000, ref: `${PD3} (tChunkReceiverResponse, from memory)` },
  /** A port that cannot chunk answers Not_Supported after tChunkingNotSupported (§6.6.18.1). */
  tChunkingNotSupported: { minUs: 40_000, maxUs: 50_000, ref: `${PD3} (tChunkingNotSupported)` },

  // EPR (R3.1 V1.8 §6.6.21 EPR timers; §8.3.3.26 EPR Mode state diagrams).
  /** Sink: from EPR_Mode (Enter) to Enter_Succeeded (SinkEPREnterTimer). */
  tEnterEPR: { minUs: 450_000, maxUs: 550_000, ref: `${PD3} (tEnterEPR)` },
  /** Sink: in EPR mode it sends EPR_KeepAlive at least this often (SinkEPRKeepAliveTimer). */
  tSinkEPRKeepAlive: { minUs: 250_000, maxUs: 500_000, ref: `${PD3} (tSinkEPRKeepAlive)` },
  /** Source: without any message from the sink for this long in EPR mode, Hard Reset (SourceEPRKeepAliveTimer). */
  tSourceEPRKeepAlive: { minUs: 750_000, maxUs: 1_000_000, ref: `${PD3} (tSourceEPRKeepAlive, from memory)` },
  /** Source: between Enter_Acknowledged and Enter_Succeeded/Failed it discovers the cable (SOP'). */
  tEPRSourceCableDiscovery: { minUs: 0, maxUs: 2_000_000, ref: `${PD3} (tEPRSourceCableDiscovery, maximum, from memory)` },
  /** Sink: PSTransitionTimer while the new contract is an EPR one (§6.6.4.1). */
  tPSTransitionEpr: { minUs: 830_000, maxUs: 1_020_000, ref: `${PD3} (tPSTransition, EPR mode)` },

  // Collision avoidance (§5.7, §6.6.16): the sink starts an AMS no sooner than tSinkTx after Rp reads SinkTxOK.
  tSinkTx: { minUs: 16_000, maxUs: 20_000, ref: `${PD3} (tSinkTx)` },

  // Swaps (§6.6.9–6.6.11, §7.3.9–7.3.14).
  /** Power role swap: the initial source's supply off (vSafe0V) after its Accept/PS_RDY exchange. */
  tPSSourceOff: { minUs: 750_000, maxUs: 920_000, ref: `${PD3} (tPSSourceOff)` },
  /** Power role swap: the new source's supply on after the PS_RDY from the initial source. */
  tPSSourceOn: { minUs: 390_000, maxUs: 480_000, ref: `${PD3} (tPSSourceOn)` },
  /** The new source waits at least this long after PS_RDY's GoodCRC before its first Source_Capabilities. */
  tSwapSourceStart: { minUs: 20_000, maxUs: 20_000, ref: `${PD3} (tSwapSourceStart, minimum)` },
  /** The initial source goes to standby (vSafe0V) within tSrcSwapStdby of its Accept. */
  tSrcSwapStdby: { minUs: 0, maxUs: 650_000, ref: `${PD3} (tSrcSwapStdby, maximum)` },
  /** After a Wait answering PR_Swap / DR_Swap / VCONN_Swap, ask again no sooner than this (from memory). */
  tPRSwapWait: { minUs: 100_000, maxUs: 100_000, ref: `${PD3} (tPRSwapWait, from memory)` },
  tDRSwapWait: { minUs: 100_000, maxUs: 100_000, ref: `${PD3} (tDRSwapWait, from memory)` },
  tVCONNSwapWait: { minUs: 100_000, maxUs: 100_000, ref: `${PD3} (tVCONNSwapWait, from memory)` },
  /** VCONN_Swap: the port taking VCONN turns it on and says PS_RDY within tVCONNSourceOn. */
  tVCONNSourceOn: { minUs: 0, maxUs: 50_000, ref: `${PD3} (tVCONNSourceOn, maximum, from memory)` },
  tVCONNSourceTimeout: { minUs: 100_000, maxUs: 200_000, ref: `${PD3} (tVCONNSourceTimeout, from memory)` },

  // Structured VDMs and cable discovery (§6.6.5, §6.6.15; §8.3.3.24 source's SOP' discovery).
  /** Between Discover Identity attempts on SOP' when the cable did not answer (DiscoverIdentityTimer). */
  tDiscoverIdentity: { minUs: 40_000, maxUs: 50_000, ref: `${PD3} (tDiscoverIdentity)` },
  tVDMSenderResponse: { minUs: 24_000, maxUs: 30_000, ref: `${PD3} (tVDMSenderResponse, from memory)` },
  tVDMReceiverResponse: { minUs: 0, maxUs: 15_000, ref: `${PD3} (tVDMReceiverResponse, maximum)` },
  tVDMBusy: { minUs: 50_000, maxUs: 50_000, ref: `${PD3} (tVDMBusy, minimum, from memory)` },
  /** A cable plug starts its GoodCRC/answer no sooner than this after the last message (from memory). */
  tCableMessage: { minUs: 750, maxUs: 750, ref: `${PD3} (tCableMessage, minimum, from memory)` },
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
  /** Discover Identity attempts on SOP' before the source gives up on the cable (§6.7.5). */
  nDiscoverIdentityCount: number;
  /** BUSY answers to a VDM before the initiator gives up (§6.7.6). */
  nBusyCount: number;
  ref: string;
}

export const countersPd3: CounterTable = { nRetryCount: 2, nCapsCount: 50, nHardResetCount: 2, nDiscoverIdentityCount: 20, nBusyCount: 5, ref: 'USB PD R3.2 V1.1 §6.7, Counter Values table' };
export const countersPd2: CounterTable = { nRetryCount: 3, nCapsCount: 50, nHardResetCount: 2, nDiscoverIdentityCount: 20, nBusyCount: 5, ref: 'USB PD R2.0 V1.3 §6.7, Counter Values table' };

/**
 * tPSTransition for a contract: 830–1020 ms when the new contract is an EPR one (USB PD R3.2 V1.1
 * §6.6.4.1, Time Values table), else 450–550 ms.
 */
export function psTransitionFor(table: TimerTable, epr: boolean): TimerRangeUs {
  return epr ? table.tPSTransitionEpr : table.tPSTransition;
}

/** The timer table in force for a message's Specification Revision field ("2.0" or "1.0" use R2.0 values). */
export function timersFor(specRevision: string): TimerTable {
  return specRevision === '1.0' || specRevision === '2.0' ? timersPd2 : timersPd3;
}

export function countersFor(specRevision: string): CounterTable {
  return specRevision === '1.0' || specRevision === '2.0' ? countersPd2 : countersPd3;
}
