/**
 * End-to-end runs of the simulator, checked against the specification's timing and against what
 * each fault must do. Times are µs. Ranges come from shared/core/timers.ts (USB PD R3.2 V1.1 §6.6
 * Time Values, §6.7 Counter Values; USB Type-C R2.3 §4.11.2).
 */
import { describe, expect, it } from 'vitest';
import { countersPd3, timersPd3 } from '../core/timers.ts';
import { parseScenario, sampleRows, simulate, type ScenarioInput, type SimulateOptions, type SimulationResult } from './index.ts';

// 5 V 3 A, 9 V 3 A, 15 V 3 A, PPS 3.3–11 V 3 A (USB PD R3.2 V1.1 §6.4.1 Tables 6.9 and 6.13).
const CAPS = ['0x0001912c', '0x0002d12c', '0x0004b12c', '0xc0dc213c'];
const T = timersPd3;

function run(input: Partial<ScenarioInput> & Record<string, unknown>, options: SimulateOptions = {}): SimulationResult {
  const parsed = parseScenario({ source: { caps: { pdos: CAPS } }, durationMs: 2_000, ...input });
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario, options);
}

interface Msg {
  t: number;
  from: string;
  type: string;
  id: number;
  crcOk: boolean;
}

function messages(result: SimulationResult): Msg[] {
  return result.events.flatMap((r) => ('msg' in r && r.message ? [{ t: r.t, from: r.from ?? '', type: r.message.header.messageType, id: r.message.header.messageId, crcOk: r.crcOk !== false }] : []));
}
const hardResets = (result: SimulationResult) => result.events.filter((r) => 'event' in r && r.event === 'hard_reset') as { t: number; from?: string }[];
const errors = (result: SimulationResult) => result.findings.filter((f) => f.severity === 'error');
const GOODCRC_US = 497;
const endOf = (m: Msg, objects = 0) => m.t + GOODCRC_US + 133 * objects;

describe('a negotiation without faults', () => {
  it('reaches the max-power contract with the message sequence of §8.3.2.2 and no error', () => {
    const result = run({});
    expect(result.contract).toEqual({ kind: 'fixed', objectPosition: 3, voltageMv: 15_000, currentMa: 3_000, powerMw: 45_000 });
    const sequence = messages(result).map((m) => `${m.from} ${m.type}`);
    expect(sequence).toEqual(['source Source_Capabilities', 'sink GoodCRC', 'sink Request', 'source GoodCRC', 'source Accept', 'sink GoodCRC', 'source PS_RDY', 'sink GoodCRC']);
    expect(errors(result)).toEqual([]);
    expect(result.lanes.filter((l) => l.side === 'sink').map((l) => l.state)).toContain('PE_SNK_Ready');
    const response = result.timers.find((s) => s.name === 'tSenderResponse' && s.side === 'sink');
    expect(response?.expired).toBe(false);
  });

  // §6.6.2 SenderResponseTimer: the Request comes within tSenderResponse of the caps' GoodCRC;
  // §7.1.4 the source starts its transition no sooner than tSrcTransition after Accept, and
  // PS_RDY comes within tPSTransition (§6.6.5). Over 20 seeds.
  it('keeps every response inside the specification ranges', () => {
    for (let seed = 1; seed <= 20; seed++) {
      const list = messages(run({ seed }));
      // The first offers may come before the sink is attached (then they are sent again).
      const at = list.findIndex((m) => m.type === 'Request');
      const caps = list.slice(0, at).findLast((m) => m.type === 'Source_Capabilities')!;
      const capsCrc = list.slice(0, at).findLast((m) => m.type === 'GoodCRC' && m.from === 'sink');
      const request = list[at];
      const accept = list.find((m) => m.type === 'Accept')!;
      const acceptCrc = list.find((m) => m.t > accept.t && m.type === 'GoodCRC');
      const psRdy = list.find((m) => m.type === 'PS_RDY');
      expect(capsCrc!.t).toBeGreaterThan(caps.t);
      expect(request!.t - endOf(capsCrc!)).toBeLessThan(T.tSenderResponse.minUs);
      expect(accept!.t - (request!.t + GOODCRC_US + 133)).toBeLessThan(T.tSenderResponse.minUs);
      expect(psRdy!.t - endOf(acceptCrc!)).toBeGreaterThanOrEqual(T.tSrcTransition.minUs);
      expect(psRdy!.t - endOf(acceptCrc!)).toBeLessThan(T.tPSTransition.minUs);
    }
  });

  it('caps the requested current at the cable rating', () => {
    // 20 V 5 A offer (§6.4.1.2.2) over a 3 A cable: the sink asks for 3 A (USB Type-C R2.3 §4.6.2.1).
    const result = run({ source: { caps: { pdos: ['0x0001912c', '0x000641f4'] } }, cable: { currentRatingMa: 3_000, resistanceMohm: 100 } });
    expect(result.contract).toMatchObject({ voltageMv: 20_000, currentMa: 3_000 });
  });

  it('asks for the offers again when the policy changes, and takes the new contract', () => {
    const result = run({ sink: { policy: { kind: 'max-power' }, changes: [{ atMs: 1_000, policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }] } });
    const after = messages(result)
      .filter((m) => m.t >= 1_000_000 && m.type !== 'GoodCRC')
      .map((m) => `${m.from} ${m.type}`);
    expect(after).toEqual(['sink Get_Source_Cap', 'source Source_Capabilities', 'sink Request', 'source Accept', 'source PS_RDY']);
    expect(result.contracts.map((c) => c.voltageMv)).toEqual([15_000, 9_000]);
    expect(result.contract).toMatchObject({ kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 });
  });
});

describe('determinism', () => {
  it('gives the same JSON for the same seed and lawful, different jitter for another', () => {
    const a = JSON.stringify(run({ seed: 42 }, { samples: true }));
    expect(JSON.stringify(run({ seed: 42 }, { samples: true }))).toBe(a);
    const other = run({ seed: 43 });
    expect(JSON.stringify(other)).not.toBe(a);
    expect(messages(other)[0]!.t).not.toBe(messages(run({ seed: 42 }))[0]!.t);
    expect(errors(other)).toEqual([]);
  });
});

describe('faults', () => {
  it('a lost GoodCRC makes the sender retry with the same MessageID (§6.7.2)', () => {
    const result = run({ faults: [{ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 1 }] });
    const caps = messages(result).filter((m) => m.type === 'Source_Capabilities');
    expect(caps.map((m) => m.id)).toEqual([0, 0]);
    // The retry follows the CRCReceiveTimer: tReceive after the first copy's end (plus tTransmit at most).
    const gap = caps[1]!.t - endOf(caps[0]!, 4);
    expect(gap).toBeGreaterThanOrEqual(T.tReceive.minUs);
    expect(gap).toBeLessThanOrEqual(T.tReceive.maxUs + 2 * T.tTransmit.maxUs);
    expect(result.contract).not.toBeNull();
  });

  // §6.7.2: after nRetryCount retries the transmission fails; §6.8.1 the sender then sends Soft_Reset.
  it('nRetryCount retries without GoodCRC end in a Soft_Reset, for R3 (2) and R2.0 (3)', () => {
    for (const [revision, retries] of [
      ['3.0', countersPd3.nRetryCount],
      ['2.0', 3],
    ] as const) {
      const result = run({
        source: { caps: { pdos: CAPS.slice(0, 3) }, specRevision: revision },
        sink: { specRevision: revision },
        faults: [{ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 2, count: retries + 1 }],
      });
      const list = messages(result);
      const accepts = list.filter((m) => m.from === 'source' && m.type === 'Accept');
      expect(accepts.slice(0, retries + 1).map((m) => m.id)).toEqual(Array(retries + 1).fill(accepts[0]!.id));
      const softReset = list.find((m) => m.type === 'Soft_Reset');
      expect(softReset).toMatchObject({ from: 'source', id: 0 });
      expect(list.filter((m) => m.t > softReset!.t && m.type === 'Source_Capabilities').length).toBeGreaterThan(0);
      expect(result.contract).not.toBeNull();
    }
  });

  it('a corrupt message gets no GoodCRC and is sent again', () => {
    const result = run({ faults: [{ kind: 'corrupt', from: 'source', messageType: 'Source_Capabilities', nth: 1 }] });
    const list = messages(result);
    expect(list[0]).toMatchObject({ type: 'Source_Capabilities', crcOk: false });
    expect(list[1]).toMatchObject({ type: 'Source_Capabilities', crcOk: true, id: 0 });
    expect(result.contract).not.toBeNull();
  });

  // §8.3.3.2.3: SenderResponseTimer expiry in PE_SRC_Send_Capabilities → PE_SRC_Hard_Reset; the
  // Hard Reset also clears the sink's late Request before it goes out.
  it('a Request delayed past tSenderResponse makes the source Hard Reset', () => {
    const result = run({ faults: [{ kind: 'delay', from: 'sink', messageType: 'Request', nth: 1, delayMs: 40 }], durationMs: 3_000 });
    const list = messages(result);
    const capsCrc = list.find((m) => m.type === 'GoodCRC' && m.from === 'sink')!;
    const reset = hardResets(result)[0]!;
    expect(reset.from).toBe('source');
    expect(reset.t - endOf(capsCrc)).toBeGreaterThanOrEqual(T.tSenderResponse.minUs);
    expect(reset.t - endOf(capsCrc)).toBeLessThanOrEqual(T.tSenderResponse.maxUs + 5_000);
    expect(list.filter((m) => m.type === 'Request' && m.t < reset.t)).toEqual([]);
    expect(result.findings.map((f) => f.rule)).toContain('protocol.hard-reset');
    expect(result.contract).not.toBeNull();
  });

  // §8.3.3.3.5: Reject without an explicit contract → PE_SNK_Wait_for_Capabilities; the source waits
  // for new offers, so SinkWaitCapTimer (tTypeCSinkWaitCap 310–620 ms) ends in a Hard Reset.
  it('reject without a contract: Reject, then the sink Hard Resets after tSinkWaitCap', () => {
    const result = run({ faults: [{ kind: 'reject', nth: 1 }], durationMs: 4_000 });
    const reject = messages(result).find((m) => m.type === 'Reject')!;
    expect(reject.from).toBe('source');
    const reset = hardResets(result)[0]!;
    expect(reset.from).toBe('sink');
    expect(reset.t - endOf(reject)).toBeGreaterThanOrEqual(T.tSinkWaitCap.minUs);
    expect(reset.t - endOf(reject)).toBeLessThanOrEqual(T.tSinkWaitCap.maxUs + 5_000);
    expect(result.contract).not.toBeNull();
  });

  // §8.3.3.3.7 SinkRequestTimer: after Wait with a contract in place the sink keeps it and asks again after tSinkRequest.
  it('wait with a contract: the old contract holds and the sink asks again after tSinkRequest', () => {
    const result = run({ sink: { changes: [{ atMs: 1_000, policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 1_000 } }] }, faults: [{ kind: 'wait', nth: 2 }] });
    const list = messages(result);
    const wait = list.find((m) => m.type === 'Wait')!;
    const next = list.find((m) => m.t > wait.t && m.type === 'Request')!;
    expect(next.t - endOf(wait)).toBeGreaterThanOrEqual(T.tSinkRequest.minUs);
    expect(hardResets(result)).toEqual([]);
    expect(result.contracts.map((c) => c.voltageMv)).toEqual([15_000, 9_000]);
  });

  // §8.3.3.3.6 PE_SNK_Transition_Sink: PSTransitionTimer (tPSTransition 450–550 ms) → Hard Reset.
  it('no PS_RDY: the sink Hard Resets when PSTransitionTimer runs out', () => {
    const result = run({ faults: [{ kind: 'no-ps-rdy', nth: 1 }], durationMs: 3_000 });
    const accept = messages(result).find((m) => m.type === 'Accept')!;
    const reset = hardResets(result)[0]!;
    expect(reset.from).toBe('sink');
    expect(reset.t - endOf(accept)).toBeGreaterThanOrEqual(T.tPSTransition.minUs);
    expect(reset.t - endOf(accept)).toBeLessThanOrEqual(T.tPSTransition.maxUs + 1_000);
    expect(result.timers.some((s) => s.name === 'tPSTransition' && s.side === 'sink' && s.expired)).toBe(true);
    // §7.1.5: after the Hard Reset VBUS goes to vSafe0V and back; the next negotiation succeeds.
    expect(result.contract).not.toBeNull();
  });

  // §8.3.3.2.3–4: Source_Capabilities every tTypeCSendSourceCap (100–200 ms) until CapsCounter > nCapsCount.
  it('a silent sink: offers repeat every 100–200 ms, then the source gives up', () => {
    const result = run({ faults: [{ kind: 'silent', from: 'sink' }], durationMs: 12_000 });
    const firsts = messages(result).filter((m, i, all) => m.type === 'Source_Capabilities' && (i === 0 || all[i - 1]!.id !== m.id || all[i - 1]!.type !== m.type));
    const starts = firsts.filter((m, i) => i === 0 || m.t - firsts[i - 1]!.t > 10_000);
    expect(starts.length).toBe(countersPd3.nCapsCount + 1);
    for (let i = 1; i < starts.length; i++) {
      const gap = starts[i]!.t - starts[i - 1]!.t;
      expect(gap).toBeGreaterThanOrEqual(T.tTypeCSendSourceCap.minUs);
      expect(gap).toBeLessThanOrEqual(T.tTypeCSendSourceCap.maxUs);
    }
    expect(result.lanes.at(-1)).toMatchObject({ side: 'source', state: 'PE_SRC_Disabled' });
    expect(result.contract).toBeNull();
  });

  // §8.3.3.3.3: no Source_Capabilities within tSinkWaitCap → Hard Reset, at most nHardResetCount + 1 times.
  it('a silent source: the sink Hard Resets after tSinkWaitCap, then stops', () => {
    const result = run({ faults: [{ kind: 'silent', from: 'source' }], durationMs: 10_000 });
    const resets = hardResets(result);
    expect(resets.every((r) => r.from === 'sink')).toBe(true);
    expect(resets.length).toBe(countersPd3.nHardResetCount + 1);
    const waiting = result.lanes.find((l) => l.side === 'sink' && l.state === 'PE_SNK_Wait_for_Capabilities')!;
    expect(resets[0]!.t - waiting.t).toBeGreaterThanOrEqual(T.tSinkWaitCap.minUs);
    expect(resets[0]!.t - waiting.t).toBeLessThanOrEqual(T.tSinkWaitCap.maxUs + 5_000);
    expect(result.contract).toBeNull();
  });
});

describe('programmable contracts', () => {
  const pps = { kind: 'pps' as const, voltageMv: 9_000, currentMa: 2_000 };

  // §6.6.x SinkPPSPeriodicTimer: a new Request at least every tPPSRequest (10 s).
  it('keeps the contract alive with a Request inside every tPPSRequest', () => {
    const result = run({ sink: { policy: pps }, durationMs: 30_000 });
    const requests = messages(result).filter((m) => m.type === 'Request');
    expect(requests.length).toBeGreaterThanOrEqual(4);
    for (let i = 1; i < requests.length; i++) expect(requests[i]!.t - requests[i - 1]!.t).toBeLessThanOrEqual(T.tPPSRequest.maxUs);
    expect(result.contract).toMatchObject({ kind: 'pps', voltageMv: 9_000, currentMa: 2_000 });
    expect(errors(result)).toEqual([]);
  });

  // §6.6.x SourcePPSCommTimer: no Request within tPPSTimeout (12–15 s) → the source Hard Resets.
  it('a sink that stops re-requesting gets a Hard Reset after tPPSTimeout', () => {
    const result = run({ sink: { policy: pps }, faults: [{ kind: 'silent', from: 'sink', atMs: 2_000 }], durationMs: 20_000 });
    const last = messages(result)
      .filter((m) => m.type === 'Request')
      .at(-1)!;
    const reset = hardResets(result)[0]!;
    expect(reset.from).toBe('source');
    expect(reset.t - last.t).toBeGreaterThanOrEqual(T.tPPSTimeout.minUs);
    expect(reset.t - last.t).toBeLessThanOrEqual(T.tPPSTimeout.maxUs + 5_000);
    expect(result.findings.map((f) => f.rule)).toContain('timing.pps-keepalive');
  });

  // §7.1.4.4: in current limit a programmable supply holds the operating current and lets VBUS fall.
  it('folds back when the load exceeds the operating current', () => {
    const result = run({ sink: { policy: pps, load: { steps: [{ atMs: 1_000, currentMa: 3_000 }] } }, cable: { currentRatingMa: 3_000, resistanceMohm: 150 } }, { samples: true });
    const rows = sampleRows(result.samples!);
    const before = rows.find(([t]) => t === 900_000)!;
    const after = rows.find(([t]) => t === 1_500_000)!;
    expect(before).toEqual([900_000, 9_000, 2_000, 9_000 - 300]);
    // 9 V × 2 A / 3 A = 6 V at 2 A; at the sink 6 V − 2 A × 150 mΩ = 5.7 V.
    expect(after).toEqual([1_500_000, 6_000, 2_000, 5_700]);
  });
});

describe('run control', () => {
  it('samples every 1 ms with IR drop, reports progress and stops on request', () => {
    const fractions: number[] = [];
    const result = run({ durationMs: 1_000 }, { samples: true, onProgress: (f) => fractions.push(f) });
    expect(result.samples!.count).toBe(1_001);
    expect(sampleRows(result.samples!)[500]![0]).toBe(500_000);
    // Held values are one step each: far fewer steps than samples.
    expect(result.samples!.steps).toBeLessThan(200);
    expect(fractions.at(-1)).toBe(1);
    expect(fractions.every((f, i) => i === 0 || f >= fractions[i - 1]!)).toBe(true);
    let calls = 0;
    const stopped = run({ durationMs: 60_000 }, { shouldStop: () => ++calls > 1 });
    expect(stopped.stopped).toBe(true);
    expect(stopped.endUs).toBeLessThan(60_000_000);
  });
});
