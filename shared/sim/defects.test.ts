/**
 * Four policy-engine paths that went wrong, each reproduced with the specification's section
 * beside it (USB PD R3.2 V1.1 chapter 8 state diagrams; USB Type-C R2.3 §4.5.2.2 ErrorRecovery).
 */
import { describe, expect, it } from 'vitest';
import { countersPd3, timersPd3 } from '../core/timers.ts';
import { disagreements, parseScenario, sampleRows, simulate, type SimulationResult } from './index.ts';
import { initialSourcePe, sourceStep, type SourceContext, type SourcePe } from './source-pe.ts';

const T = timersPd3;

function run(input: Record<string, unknown>): SimulationResult {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario);
}
const sent = (result: SimulationResult, type: string) => result.events.filter((r) => 'msg' in r && r.message?.header.messageType === type) as { t: number; from?: string }[];

describe('after a Reject with a contract in place', () => {
  // §8.3.3.3.5 PE_SNK_Select_Capability: Reject with an Explicit Contract → PE_SNK_Ready, keeping the
  // contract; only Wait starts the SinkRequestTimer (§8.3.3.3.7, §6.6.4.3 tSinkRequest).
  it('the sink stays in Ready on its old contract and does not ask again', () => {
    const result = run({
      source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c'] } },
      sink: { changes: [{ atMs: 1_000, policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 1_000 } }] },
      faults: [{ kind: 'reject', nth: 2, count: 100 }],
      durationMs: 3_000,
    });
    expect(sent(result, 'Reject')).toHaveLength(1);
    expect(sent(result, 'Request')).toHaveLength(2);
    expect(result.timers.filter((s) => s.name === 'tSinkRequest')).toEqual([]);
    expect(result.contract).toMatchObject({ voltageMv: 15_000 });
    expect(result.ports.final.sink.state).toBe('PE_SNK_Ready');
  });
});

describe('a source that keeps missing tPSTransition', () => {
  // §8.3.3.3.8 PE_SNK_Hard_Reset: HardResetCounter > nHardResetCount with a PD connection → ErrorRecovery
  // (USB Type-C R2.3 §4.5.2.2.2): both ports detach and start again, so neither claims a contract alone.
  it('never leaves the two ports disagreeing about the contract', () => {
    const result = run({
      source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x000641f4'] } },
      faults: [{ kind: 'delay', from: 'source', messageType: 'PS_RDY', delayMs: 700 }],
      durationMs: 9_000,
    });
    expect(disagreements(result.ports, result.endUs)).toEqual([]);
    const resets = result.events.filter((r) => 'event' in r && r.event === 'hard_reset');
    expect(resets.length).toBeGreaterThanOrEqual(countersPd3.nHardResetCount + 1);
    expect(result.events.some((r) => 'event' in r && r.event === 'detach')).toBe(true);
  });
});

describe('after nHardResetCount with a PD connection', () => {
  // §8.3.3.2.4 PE_SRC_Discovery / NoResponseTimer: HardResetCounter > nHardResetCount → PE_SRC_Disabled
  // only when the partners were never PD connected; when they were, ErrorRecovery. The PD connection
  // lasts until detach: a Hard Reset (Transition_to_default) does not clear it.
  const context: SourceContext = {
    offers: () => ({ words: [0x0001_912c], pdos: [] }),
    eprCapable: false,
    discoverCable: false,
    swapAnswer: 'reject',
    pdpW: () => ({ spr: 15, epr: 0 }),
    vbusMv: () => 5_000,
  };
  it('the source keeps its PD connection through Hard Resets and takes ErrorRecovery, not Disabled', () => {
    let pe: SourcePe = { ...initialSourcePe('3.0'), state: 'PE_SRC_Send_Capabilities' };
    [pe] = sourceStep(pe, { kind: 'sent', type: 'Source_Capabilities' }, context);
    expect(pe.pdConnected).toBe(true);
    for (let i = 0; i <= countersPd3.nHardResetCount; i++) {
      [pe] = sourceStep(pe, { kind: 'timer', name: 'tNoResponse' }, context);
      expect(pe.state).toBe('PE_SRC_Hard_Reset');
      [pe] = sourceStep(pe, { kind: 'timer', name: 'tPSHardReset' }, context);
      [pe] = sourceStep(pe, { kind: 'supply-ready' }, context);
      [pe] = sourceStep(pe, { kind: 'timer', name: 'tSrcRecover' }, context);
      [pe] = sourceStep(pe, { kind: 'supply-ready' }, context);
      expect(pe.state).toBe('PE_SRC_Startup');
      expect(pe.pdConnected).toBe(true);
    }
    const [last, effects] = sourceStep(pe, { kind: 'timer', name: 'tNoResponse' }, context);
    expect(last.state).toBe('ErrorRecovery');
    expect(effects).toContainEqual({ kind: 'error-recovery' });
    // Never PD connected: Disabled.
    const [never] = sourceStep({ ...pe, pdConnected: false }, { kind: 'timer', name: 'tNoResponse' }, context);
    expect(never.state).toBe('PE_SRC_Disabled');
  });

  it('a run whose sink falls silent ends in ErrorRecovery (detach, attach) before any PE_SRC_Disabled', () => {
    const result = run({
      source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0xc0dc213c'] } },
      sink: { policy: { kind: 'pps', voltageMv: 9_000, currentMa: 2_000 } },
      faults: [{ kind: 'silent', from: 'sink', atMs: 1_000 }],
      durationMs: 30_000,
    });
    const detach = result.events.find((r) => 'event' in r && r.event === 'detach');
    expect(detach).toBeDefined();
    expect(result.lanes.filter((l) => l.t < detach!.t).some((l) => l.state === 'PE_SRC_Disabled')).toBe(false);
    expect(result.lanes.some((l) => l.state === 'ErrorRecovery')).toBe(true);
  });
});

describe('overload on a programmable contract', () => {
  // §7.1.4.4 (PPS current limit, from memory): the source holds the operating current while VBUS falls,
  // but not below the APDO's minimum voltage; below it the source protects itself with a Hard Reset.
  it('current-limits down to the APDO minimum, then Hard Resets; VBUS never sits low at 0 mA', () => {
    const parsed = parseScenario({
      source: { caps: { pdos: ['0x0001912c', '0xc0dc213c'] } },
      sink: { policy: { kind: 'pps', voltageMv: 5_000, currentMa: 1_000 }, load: { steps: [{ atMs: 1_000, currentMa: 3_000 }] } },
      durationMs: 3_000,
    });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const result = simulate(parsed.scenario, { samples: true });
    const samples = sampleRows(result.samples!);
    const reset = result.events.find((r) => 'event' in r && r.event === 'hard_reset' && r.t >= 1_000_000) as { t: number; from?: string } | undefined;
    expect(reset?.from).toBe('source');
    expect(reset!.t - 1_000_000).toBeLessThan(50_000);
    for (const [t, mv, ma] of samples) {
      // 3.3 V is the APDO's minimum (0xc0dc213c: 3.3–11 V 3 A); at or above it the limit holds 1 A.
      if (t > 1_000_000 && t < reset!.t) expect(mv).toBeGreaterThanOrEqual(3_300);
      if (t > 1_000_000 && t < reset!.t) expect(ma).toBe(1_000);
    }
    expect(T.tPSHardReset.maxUs).toBe(35_000);
  });
});

describe('a PD 2.0 source with programmable offers', () => {
  // USB PD R2.0 has no APDOs (R3.2 V1.1 §6.4.1: Augmented PDOs are R3.x only).
  it('is refused with a clear error', () => {
    const parsed = parseScenario({ source: { caps: { pdos: ['0x0001912c', '0xc0dc213c'] }, specRevision: '2.0' } });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.error.message).toMatch(/source\.caps.*2\.0.*programmable/i);
  });
});
