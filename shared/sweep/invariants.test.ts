import { describe, expect, it } from 'vitest';
import type { Contract } from '../core/contract.ts';
import type { Finding } from '../core/finding.ts';
import { fixedPdo } from '../rules/pdo-builders.ts';
import { parseScenario, type Scenario } from '../sim/scenario.ts';
import type { TraceRecord } from '../trace/records.ts';
import { AGREEMENT_GRACE_US, explainedBy, hardResetLimit, judge, resetCounts, type RunUnderJudgement } from './invariants.ts';
import { portViews, type PortViews } from './port-views.ts';

const c9: Contract = { kind: 'fixed', objectPosition: 2, voltageMv: 9_000, currentMa: 2_000, powerMw: 18_000 };
const c20: Contract = { kind: 'fixed', objectPosition: 3, voltageMv: 20_000, currentMa: 2_000, powerMw: 40_000 };
const pdos = [fixedPdo(5_000, 3_000), fixedPdo(9_000, 3_000), fixedPdo(20_000, 3_000)];

function scenario(faults: Scenario['faults'] = []): Scenario {
  const parsed = parseScenario({ source: { caps: { pdos: ['0x0001912c'] } }, faults });
  if (!parsed.ok) throw new Error(parsed.error.message);
  return parsed.scenario;
}

function views(source: [number, Contract | null][], sink: [number, Contract | null][], finals = { source: 'PE_SRC_Ready', sink: 'PE_SNK_Ready' }): PortViews {
  const changes = [
    ...source.map(([tUs, contract]) => ({ tUs, side: 'source' as const, state: finals.source, contract, eprMode: false })),
    ...sink.map(([tUs, contract]) => ({ tUs, side: 'sink' as const, state: finals.sink, contract, eprMode: false })),
  ].sort((a, b) => a.tUs - b.tUs);
  const final = (side: 'source' | 'sink') => ({ tUs: 5_000_000, side, state: finals[side], contract: null, eprMode: false });
  return portViews({ ports: { changes, final: { source: final('source'), sink: final('sink') } } });
}

function run(partial: { views: PortViews; events?: TraceRecord[]; findings?: Finding[]; contracts?: (Contract & { t: number })[]; faults?: Scenario['faults']; endUs?: number }): RunUnderJudgement {
  return {
    scenario: scenario(partial.faults),
    pdos,
    views: partial.views,
    result: { events: partial.events ?? [], findings: partial.findings ?? [], contracts: partial.contracts ?? [], endUs: partial.endUs ?? 5_000_000 },
  };
}

const ids = (r: RunUnderJudgement) => judge(r).map((b) => b.invariant);

describe('the invariant library', () => {
  it('holds for a run where both ports take the same contract a moment apart', () => {
    expect(ids(run({ views: views([[464_300, c9]], [[463_653, c9]]) }))).toEqual([]);
  });

  it('contract.agreement: a difference longer than one exchange breaks it, and so does one at the end', () => {
    const late = run({ views: views([[1_000_000, c20]], [[1_000_000 + AGREEMENT_GRACE_US + 1, c20]]) });
    expect(judge(late)[0]).toMatchObject({ invariant: 'contract.agreement' });
    expect(judge(late)[0]!.message).toContain('the sink holds no contract');
    // 30 ms before the end the sink loses it: longer than the grace (tSenderResponse min, 27 ms) by the end.
    const atEnd = run({
      views: views(
        [[1_000_000, c20]],
        [
          [1_000_000, c20],
          [4_970_000, null],
        ],
      ),
    });
    expect(ids(atEnd)).toEqual(['contract.agreement']);
    expect(judge(atEnd)[0]!.message).toBe('from 4970.0 ms the source holds fixed 20 V 2 A (position 3) while the sink holds no contract (for 30.0 ms, until the end)');
    const justBefore = run({
      views: views(
        [[1_000_000, c20]],
        [
          [1_000_000, c20],
          [4_980_000, null],
        ],
      ),
    });
    expect(ids(justBefore)).toEqual([]);
    const different = run({ views: views([[1_000_000, c20]], [[1_000_000, c9]]) });
    expect(ids(different)).toEqual(['contract.agreement']);
  });

  it('contract.vbus: 9 V ±5 % (vSrcNew, USB PD R3.2 §7.1; from memory) less the cable drop', () => {
    const base = { views: views([[100, c9]], [[100, c9]]) };
    // 100 mΩ at 2 A drops 200 mV: 8.55 V at the source is the lowest in range.
    expect(ids(run({ ...base, events: [{ t: 200, vbus: { mv: 8_550, ma: 2_000 } }] }))).toEqual([]);
    expect(ids(run({ ...base, events: [{ t: 200, vbus: { mv: 8_540, ma: 2_000 } }] }))).toEqual(['contract.vbus']);
    expect(ids(run({ ...base, events: [{ t: 200, vbus: { mv: 9_460, ma: 0 } }] }))).toEqual(['contract.vbus']);
    // Before the contract the reading is not judged.
    expect(ids(run({ ...base, events: [{ t: 50, vbus: { mv: 5_000, ma: 100 } }] }))).toEqual([]);
  });

  it('port.ends-settled: Ready, PE_SRC_Disabled and ErrorRecovery are allowed ends', () => {
    expect(ids(run({ views: views([], [], { source: 'PE_SRC_Disabled', sink: 'ErrorRecovery' }) }))).toEqual([]);
    const stuck = run({ views: views([], [], { source: 'PE_SRC_Ready', sink: 'PE_SNK_Wait_for_Capabilities' }) });
    expect(judge(stuck)).toEqual([{ invariant: 'port.ends-settled', message: 'the sink ends in PE_SNK_Wait_for_Capabilities' }]);
  });

  it('reset.no-loop: nHardResetCount + 1 = 3 Hard Resets from one side (USB PD R3.2 §6.7, nHardResetCount = 2)', () => {
    expect(hardResetLimit('3.0')).toBe(3);
    const resets = (n: number): TraceRecord[] => Array.from({ length: n }, (_, i) => ({ t: (i + 1) * 1_000_000, event: 'hard_reset', from: 'sink' }) as TraceRecord);
    const ok = run({ views: views([], [], { source: 'PE_SRC_Disabled', sink: 'ErrorRecovery' }), events: resets(3) });
    expect(ids(ok)).toEqual([]);
    const loop = run({ views: views([], [], { source: 'PE_SRC_Disabled', sink: 'ErrorRecovery' }), events: resets(4) });
    expect(judge(loop)).toEqual([{ invariant: 'reset.no-loop', message: '4 Hard Resets from one side without a contract in between (at most 3)' }]);
    // A contract between them starts the count again.
    const apart = run({ views: views([], [], { source: 'PE_SRC_Disabled', sink: 'ErrorRecovery' }), events: resets(4), contracts: [{ ...c9, t: 2_500_000 }] });
    expect(resetCounts(apart)).toMatchObject({ hardResets: 4, longestHardResetRun: 2 });
  });

  it('analyser.explained: a wire fault explains timing and protocol errors, never offers or VBUS', () => {
    const finding = (rule: string): Finding => ({ rule, severity: 'error', message: `${rule} fired`, ref: '' });
    const drop = [{ kind: 'drop' as const, from: 'sink' as const, messageType: 'GoodCRC', nth: 1 }];
    expect(explainedBy(drop, 'protocol.missing-goodcrc')).toBe(true);
    expect(explainedBy(drop, 'timing.sender-response')).toBe(true);
    expect(explainedBy(drop, 'vbus.out-of-range')).toBe(false);
    expect(explainedBy(drop, 'decode.crc')).toBe(false);
    expect(explainedBy([{ kind: 'corrupt', nth: 1 }], 'decode.crc')).toBe(true);
    expect(explainedBy([], 'timing.ps-transition')).toBe(false);
    const v = views([[100, c9]], [[100, c9]]);
    expect(ids(run({ views: v, faults: drop, findings: [finding('protocol.missing-goodcrc')] }))).toEqual([]);
    expect(ids(run({ views: v, findings: [finding('timing.ps-transition'), { ...finding('caps.order'), severity: 'warning' }] }))).toEqual(['analyser.explained']);
  });
});
