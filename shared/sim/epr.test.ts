/**
 * EPR end to end (USB PD R3.2 V1.1 §6.4.9 EPR_Request, §6.4.10 EPR_Mode, §6.5.15 EPR_Source_Capabilities,
 * §8.3.3.26 EPR mode state diagrams, §6.6 Time Values for tEnterEPR, tSinkEPRKeepAlive, tPSTransition
 * in EPR mode), the cable's Discover Identity on SOP' (§6.4.4.3.1) and AVS contracts.
 */
import { describe, expect, it } from 'vitest';
import { timersPd3 } from '../core/timers.ts';
import { eprModeOf } from './pe-types.ts';
import { disagreements, parseScenario, simulate, type SimulationResult } from './index.ts';

const T = timersPd3;
// 140 W: 5, 9, 15 V at 3 A, 20 V 5 A; EPR 28 V 5 A and EPR AVS 15–28 V 140 W (vector.md example).
const SPR_140 = ['0x0001912c', '0x0002d12c', '0x0004b12c', '0x000641f4'];
const EPR_140 = ['0x0008c1f4', '0xd230968c'];
const EPR_CABLE = { currentRatingMa: 5_000, resistanceMohm: 80, eMarker: { currentMa: 5_000, maxVoltageMv: 50_000, eprCapable: true } };

function run(input: Record<string, unknown>): SimulationResult {
  const parsed = parseScenario({
    source: { caps: { pdos: SPR_140 }, eprCaps: { pdos: EPR_140 } },
    sink: { epr: { pdpW: 140 }, policy: { kind: 'fixed', voltageMv: 28_000, currentMa: 5_000 } },
    cable: EPR_CABLE,
    durationMs: 4_000,
    seed: 3,
    ...input,
  });
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario);
}

interface Msg {
  t: number;
  from: string;
  sop: string;
  type: string;
  objects: number[];
  name: string;
}
function messages(result: SimulationResult): Msg[] {
  return result.events.flatMap((r) => {
    if (!('msg' in r) || !r.message || r.message.header.messageType === 'GoodCRC') return [];
    const type = r.message.header.messageType;
    const bytes = Buffer.from(r.msg, 'hex');
    const objects: number[] = [];
    for (let i = 2; i + 3 < bytes.length; i += 4) objects.push(bytes.readUInt32LE(i));
    const name =
      type === 'EPR_Mode'
        ? `EPR_Mode(${['', 'Enter', 'Enter_Acknowledged', 'Enter_Succeeded', 'Enter_Failed', 'Exit'][eprModeOf(objects[0]).action]})`
        : type === 'Extended_Control'
          ? `Extended_Control(${bytes[4]})`
          : type;
    return [{ t: r.t, from: r.from ?? '', sop: r.sop ?? 'SOP', type, objects, name }];
  });
}
const vbusAfter = (result: SimulationResult, tUs: number) => (result.events.find((r) => 'vbus' in r && r.t > tUs) as { vbus: { mv: number } } | undefined)?.vbus.mv;

describe('a 140 W source, an EPR sink asking 28 V 5 A and an EPR cable', () => {
  const result = run({});
  const list = messages(result);
  const names = list.map((m) => `${m.from} ${m.name}`);

  it('reaches 28 V at object position 8 through the full entry sequence', () => {
    const expected = [
      'source Vendor_Defined',
      'cable Vendor_Defined',
      'source Source_Capabilities',
      'sink Request',
      'source Accept',
      'source PS_RDY',
      'sink EPR_Mode(Enter)',
      'source EPR_Mode(Enter_Acknowledged)',
      'source Vendor_Defined',
      'cable Vendor_Defined',
      'source EPR_Mode(Enter_Succeeded)',
      'source EPR_Source_Capabilities',
      'sink EPR_Source_Capabilities',
      'source EPR_Source_Capabilities',
      'sink EPR_Request',
      'source Accept',
      'source PS_RDY',
    ];
    expect(names.slice(0, expected.length)).toEqual(expected);
    expect(result.contract).toEqual({ kind: 'fixed', objectPosition: 8, voltageMv: 28_000, currentMa: 5_000, powerMw: 140_000 });
    // The first contract is SPR (the best 20 V offer) with EPR Mode Capable set in the RDO (b22).
    const request = list.find((m) => m.type === 'Request')!;
    expect((request.objects[0]! >>> 22) & 1).toBe(1);
    // EPR_Request carries the PDO it names (§6.4.9): position 8 is 28 V 5 A.
    const eprRequest = list.find((m) => m.type === 'EPR_Request')!;
    expect(eprRequest.objects[0]! >>> 28).toBe(8);
    expect(eprRequest.objects[1]).toBe(0x0008c1f4);
    // The source sets EPR Mode Capable (b23) in its first PDO.
    const caps = list.find((m) => m.type === 'Source_Capabilities')!;
    expect((caps.objects[0]! >>> 23) & 1).toBe(1);
    expect(result.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it('keeps the timers of the table', () => {
    const enter = list.find((m) => m.name === 'EPR_Mode(Enter)')!;
    const succeeded = list.find((m) => m.name === 'EPR_Mode(Enter_Succeeded)')!;
    expect(succeeded.t - enter.t).toBeLessThan(T.tEnterEPR.minUs);
    const accepts = list.filter((m) => m.type === 'Accept');
    const psRdys = list.filter((m) => m.type === 'PS_RDY');
    // PS_RDY within tPSTransition (EPR value while in EPR mode), no sooner than tSrcTransition.
    expect(psRdys[1]!.t - accepts[1]!.t).toBeLessThan(T.tPSTransitionEpr.minUs);
    expect(psRdys[1]!.t - accepts[1]!.t).toBeGreaterThan(T.tSrcTransition.minUs);
    expect(result.timers.some((s) => s.name === 'tPSTransitionEpr' && s.side === 'sink' && !s.expired)).toBe(true);
    // EPR_KeepAlive (Extended_Control type 3) at least every tSinkEPRKeepAlive, each answered by EPR_KeepAlive_Ack (4).
    const keepAlives = list.filter((m) => m.name === 'Extended_Control(3)');
    expect(keepAlives.length).toBeGreaterThanOrEqual(5);
    let previous = psRdys[1]!.t;
    for (const keepAlive of keepAlives) {
      expect(keepAlive.t - previous).toBeLessThanOrEqual(T.tSinkEPRKeepAlive.maxUs + 10_000);
      previous = keepAlive.t;
    }
    expect(list.filter((m) => m.name === 'Extended_Control(4)')).toHaveLength(keepAlives.length);
    expect(result.events.some((r) => 'event' in r && r.event === 'hard_reset')).toBe(false);
  });

  it('puts 28 V on VBUS and both ports agree, in EPR mode', () => {
    const psRdy = list.filter((m) => m.type === 'PS_RDY')[1]!;
    expect(vbusAfter(result, psRdy.t)).toBe(28_000);
    expect(result.ports.final.source).toMatchObject({ eprMode: true, contract: { voltageMv: 28_000 } });
    expect(result.ports.final.sink).toMatchObject({ eprMode: true, contract: { voltageMv: 28_000 } });
    expect(disagreements(result.ports, result.endUs)).toEqual([]);
  });
});

describe("the cable's answer in the trace", () => {
  it('decodes with the SOP′ layouts: ID Header of a cable plug and a Passive Cable VDO (§6.4.4.3.1)', () => {
    const ack = run({ durationMs: 1_000 }).events.find((r) => 'msg' in r && r.from === 'cable' && r.message?.header.messageType === 'Vendor_Defined');
    expect(ack && 'message' in ack ? ack.message?.objects.map((o) => o.kind) : null).toEqual(['vdm-header', 'cable-id-header', 'cert-stat', 'product', 'passive-cable']);
  });
});

describe('EPR entry on every seed', () => {
  // tEPRSourceCableDiscovery has a maximum only (USB PD R3.1 V1.8 §6.4.10.1, §8.3.3.26.2.2; §6.6 Time
  // Values, from memory): the source's deadline for cable discovery runs its full 2 s. Drawn from 0 ms, it
  // expired before the cable answered on about 0.7 % of seeds (seed 72 among them) and the entry failed.
  it('reaches 28 V on each of 400 seeds, the cable discovery never cut short', () => {
    const parsed = parseScenario({
      source: { caps: { pdos: SPR_140 }, eprCaps: { pdos: EPR_140 } },
      sink: { epr: { pdpW: 140 }, policy: { kind: 'fixed', voltageMv: 28_000, currentMa: 5_000 } },
      cable: EPR_CABLE,
      durationMs: 1_500,
    });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const missed: number[] = [];
    for (let seed = 0; seed < 400; seed++) {
      const result = simulate({ ...parsed.scenario, seed }, { decode: false, analyze: false });
      if (result.contract?.voltageMv !== 28_000 || result.contract.objectPosition !== 8) missed.push(seed);
    }
    expect(missed).toEqual([]);
  });

  it("runs the source's cable-discovery deadline at its maximum", () => {
    const result = run({ seed: 72 });
    const span = result.timers.find((t) => t.name === 'tEPRSourceCableDiscovery');
    expect(span?.expired).toBe(false);
    expect(result.contract?.voltageMv).toBe(28_000);
  });
});

describe('the same over a cable without e-marker', () => {
  const result = run({ cable: { currentRatingMa: 3_000, resistanceMohm: 80 } });
  const list = messages(result);
  it('stays in SPR at 20 V and at most 3 A, after Enter_Failed (cable)', () => {
    expect(result.contract).toMatchObject({ voltageMv: 20_000, currentMa: 3_000 });
    const failed = list.find((m) => m.name === 'EPR_Mode(Enter_Failed)')!;
    expect(eprModeOf(failed.objects[0]).data).toBe(1);
    // Nothing answers on SOP': each Discover Identity goes out 1 + nRetryCount times.
    expect(list.filter((m) => m.sop === "SOP'" && m.from === 'cable')).toEqual([]);
    expect(list.filter((m) => m.sop === "SOP'").length).toBe(6);
    // The 20 V 5 A object is offered at 3 A only.
    const caps = list.find((m) => m.type === 'Source_Capabilities')!;
    expect(caps.objects[3]! & 0x3ff).toBe(300);
    expect(list.some((m) => m.type === 'EPR_Source_Capabilities')).toBe(false);
    expect(result.ports.final.sink.eprMode).toBe(false);
  });
});

describe('a 180 W source and an avs policy', () => {
  // 28 V 5 A, 36 V 5 A, EPR AVS 15–36 V 180 W (USB PD R3.2 V1.1 §6.4.1.3.4 EPR AVS APDO).
  it('reaches an adjustable EPR voltage', () => {
    const result = run({
      source: { caps: { pdos: SPR_140 }, eprCaps: { pdos: ['0x0008c1f4', '0x000b41f4', '0xd2d096b4'] } },
      sink: { epr: { pdpW: 180 }, policy: { kind: 'avs', voltageMv: 32_400, currentMa: 5_000 } },
    });
    expect(result.contract).toMatchObject({ kind: 'avs', objectPosition: 10, voltageMv: 32_400, currentMa: 5_000 });
    const psRdy = messages(result).filter((m) => m.type === 'PS_RDY')[1]!;
    expect(vbusAfter(result, psRdy.t)).toBe(32_400);
    expect(result.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });
});

describe('EPR exit and a lapsed keep-alive', () => {
  // §6.4.10 Exit: the source offers SPR again and the sink requests within it.
  it('leaves EPR mode on epr_exit and settles on SPR offers', () => {
    const result = run({ actions: [{ atMs: 2_000, by: 'sink', action: 'epr_exit' }] });
    const after = messages(result)
      .filter((m) => m.t > 2_000_000)
      .map((m) => `${m.from} ${m.name}`);
    expect(after.slice(0, 5)).toEqual(['sink EPR_Mode(Exit)', 'source Source_Capabilities', 'sink Request', 'source Accept', 'source PS_RDY']);
    expect(result.contract).toMatchObject({ voltageMv: 20_000 });
    expect(result.ports.final.source.eprMode).toBe(false);
  });
  // §8.3.3.26.3: without a message from the sink within tSourceEPRKeepAlive the source Hard Resets.
  it('the source Hard Resets when the sink falls silent in EPR mode', () => {
    const result = run({ faults: [{ kind: 'silent', from: 'sink', atMs: 1_000 }], durationMs: 3_000 });
    const reset = result.events.find((r) => 'event' in r && r.event === 'hard_reset') as { t: number; from?: string };
    expect(reset.from).toBe('source');
    const lastHeard = messages(result)
      .filter((m) => m.from === 'sink' && m.t < reset.t)
      .at(-1)!;
    expect(reset.t - lastHeard.t).toBeGreaterThanOrEqual(T.tSourceEPRKeepAlive.minUs);
    expect(reset.t - lastHeard.t).toBeLessThanOrEqual(T.tSourceEPRKeepAlive.maxUs + 5_000);
  });
  // A lost EPR_KeepAlive leaves the sink without its Ack: SenderResponseTimer → the sink Hard Resets.
  it('the sink Hard Resets when its EPR_KeepAlive gets no Ack', () => {
    const result = run({ faults: [{ kind: 'drop', from: 'sink', messageType: 'EPR_KeepAlive', atMs: 1_000, count: 100 }], durationMs: 2_000 });
    const reset = result.events.find((r) => 'event' in r && r.event === 'hard_reset') as { t: number; from?: string };
    expect(reset.from).toBe('sink');
    expect(result.findings.map((f) => f.rule)).toContain('protocol.hard-reset');
  });
});
