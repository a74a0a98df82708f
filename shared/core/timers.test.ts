import { describe, expect, it } from 'vitest';
import { countersFor, psTransitionFor, timersFor } from './timers.ts';

describe('timer table', () => {
  // USB PD R3.2 V1.1 §6.6 Time Values: tSenderResponse 27–33 ms; USB PD R2.0 V1.3 §6.6: 24–30 ms.
  it('picks tSenderResponse by revision', () => {
    expect(timersFor('3.0').tSenderResponse).toMatchObject({ minUs: 27_000, maxUs: 33_000 });
    expect(timersFor('2.0').tSenderResponse).toMatchObject({ minUs: 24_000, maxUs: 30_000 });
  });
  // USB PD R3.2 V1.1 §6.7 Counter Values: nRetryCount 2 (R3.x), 3 (R2.0).
  it('picks nRetryCount by revision', () => {
    expect(countersFor('3.0').nRetryCount).toBe(2);
    expect(countersFor('2.0').nRetryCount).toBe(3);
  });
});

describe('timers of EPR, swaps, cable discovery and collision avoidance', () => {
  const t = timersFor('3.0');
  // USB PD R3.2 V1.1 §6.6 Time Values table (values cross-checked against two open PD stacks' constants where marked in timers.ts).
  it.each([
    ['tReceiverResponse', 0, 15_000],
    ['tEnterEPR', 450_000, 550_000],
    ['tSinkEPRKeepAlive', 250_000, 500_000],
    ['tSourceEPRKeepAlive', 750_000, 1_000_000],
    ['tPSTransitionEpr', 830_000, 1_020_000],
    ['tSinkTx', 16_000, 20_000],
    ['tPSSourceOff', 750_000, 920_000],
    ['tPSSourceOn', 390_000, 480_000],
    ['tSwapSourceStart', 20_000, 20_000],
    ['tDiscoverIdentity', 40_000, 50_000],
    ['tChunkingNotSupported', 40_000, 50_000],
  ] as const)('%s is %i–%i µs', (name, minUs, maxUs) => {
    expect(t[name]).toMatchObject({ minUs, maxUs });
    expect(t[name].ref).toContain(name.replace('Epr', ''));
  });
  // USB PD R3.2 V1.1 §6.7 Counter Values: nDiscoverIdentityCount 20, nBusyCount 5.
  it('has the discovery and busy counters', () => {
    expect(countersFor('3.0')).toMatchObject({ nDiscoverIdentityCount: 20, nBusyCount: 5 });
  });
  it('picks the EPR tPSTransition for an EPR contract', () => {
    expect(psTransitionFor(t, true).maxUs).toBe(1_020_000);
    expect(psTransitionFor(t, false).maxUs).toBe(550_000);
  });
});
