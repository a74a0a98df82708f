/**
 * The rest of the message set (scenario `actions`), swaps and collision avoidance: USB PD R3.2 V1.1
 * §6.3 (control messages), §6.5.1/.2/.10 (Source_Capabilities_Extended, Status, PPS_Status),
 * §8.3.3.18–20 (DR_Swap, PR_Swap, VCONN_Swap), §5.7 collision avoidance (SinkTxNG/SinkTxOK, tSinkTx),
 * §6.6 Time Values (tSinkTx, tPSSourceOff, tPSSourceOn, tSwapSourceStart, tSinkRequest).
 */
import { describe, expect, it } from 'vitest';
import { timersPd3 } from '../core/timers.ts';
import { disagreements, parseScenario, simulate, type SimulationResult } from './index.ts';

const T = timersPd3;
const CAPS = ['0x0001912c', '0x0002d12c', '0xc0dc213c'];

function run(input: Record<string, unknown>): SimulationResult {
  const parsed = parseScenario({ source: { caps: { pdos: CAPS } }, durationMs: 4_000, ...input });
  if (!parsed.ok) throw new Error(parsed.error.message);
  return simulate(parsed.scenario);
}
const list = (result: SimulationResult) =>
  result.events.flatMap((r) =>
    'msg' in r && r.message && r.message.header.messageType !== 'GoodCRC' ? [{ t: r.t, from: r.from ?? '', type: r.message.header.messageType, bytes: r.msg.length / 2 }] : [],
  );
const messagesAfter = (result: SimulationResult, tUs: number) =>
  list(result)
    .filter((m) => m.t >= tUs)
    .map((m) => `${m.from} ${m.type}`);
const rpEvents = (result: SimulationResult) => result.events.filter((r) => 'event' in r && r.event === 'rp') as { t: number; rp?: string }[];

describe('asking the partner', () => {
  it('answers Get_Source_Cap_Extended, Get_Status and Get_PPS_Status with chunked extended messages', () => {
    const result = run({
      sink: { policy: { kind: 'pps', voltageMv: 9_000, currentMa: 2_000 } },
      actions: [
        { atMs: 1_000, by: 'sink', action: 'get_source_cap_extended' },
        { atMs: 1_200, by: 'sink', action: 'get_status' },
        { atMs: 1_400, by: 'sink', action: 'get_pps_status' },
      ],
    });
    expect(messagesAfter(result, 1_000_000).slice(0, 6)).toEqual([
      'sink Get_Source_Cap_Extended',
      'source Source_Capabilities_Extended',
      'sink Get_Status',
      'source Status',
      'sink Get_PPS_Status',
      'source PPS_Status',
    ]);
    // Header 2 + 7 objects (extended header 2 + 25-byte SCEDB, padded to 28) = 30 bytes (§6.5.1, §6.2.1.2).
    expect(list(result).find((m) => m.type === 'Source_Capabilities_Extended')!.bytes).toBe(30);
  });

  it('a source-only port answers Get_Sink_Cap with Not_Supported; a sink answers with its Sink_Capabilities', () => {
    const result = run({
      actions: [
        { atMs: 1_000, by: 'sink', action: 'get_sink_cap' },
        { atMs: 1_200, by: 'source', action: 'get_sink_cap' },
      ],
    });
    expect(messagesAfter(result, 1_000_000).slice(0, 4)).toEqual(['sink Get_Sink_Cap', 'source Not_Supported', 'source Get_Sink_Cap', 'sink Sink_Capabilities']);
  });
});

describe('collision avoidance', () => {
  // §5.7: before its own exchange the source sets SinkTxNG (Rp 1.5 A) and waits tSinkTx; back in Ready, SinkTxOK.
  it('the source signals SinkTxNG, waits tSinkTx, then SinkTxOK when done; rp events in the trace', () => {
    const result = run({ actions: [{ atMs: 1_000, by: 'source', action: 'get_sink_cap' }] });
    const [ng, ok] = rpEvents(result);
    expect(ng).toMatchObject({ t: 1_000_000, rp: '1.5A' });
    const ask = list(result).find((m) => m.type === 'Get_Sink_Cap')!;
    expect(ask.t - ng!.t).toBeGreaterThanOrEqual(T.tSinkTx.minUs);
    expect(ask.t - ng!.t).toBeLessThanOrEqual(T.tSinkTx.maxUs + 10_000);
    const answer = list(result).find((m) => m.type === 'Sink_Capabilities')!;
    expect(ok).toMatchObject({ rp: '3.0A' });
    expect(ok!.t).toBeGreaterThan(answer.t);
  });
  it('the sink waits for SinkTxOK before it starts an exchange', () => {
    const result = run({
      actions: [
        { atMs: 1_000, by: 'source', action: 'get_sink_cap' },
        { atMs: 1_005, by: 'sink', action: 'get_status' },
      ],
    });
    const ok = rpEvents(result)[1]!;
    const ask = list(result).find((m) => m.type === 'Get_Status')!;
    expect(ask.t).toBeGreaterThan(ok.t);
  });
  it('a source starting at Rp 1.5 A says SinkTxOK once the first contract is in place', () => {
    const result = run({ source: { caps: { pdos: CAPS }, behaviour: { rp: '1.5A' } } });
    const psRdy = list(result).find((m) => m.type === 'PS_RDY')!;
    expect(rpEvents(result)[0]).toMatchObject({ rp: '3.0A' });
    expect(rpEvents(result)[0]!.t).toBeGreaterThan(psRdy.t);
  });
});

describe('swaps', () => {
  it('DR_Swap and VCONN_Swap accepted; a rejected and a Not_Supported answer keep the roles', () => {
    const accept = run({
      sink: { behaviour: { swapAnswer: 'accept' } },
      actions: [
        { atMs: 1_000, by: 'source', action: 'dr_swap' },
        { atMs: 1_300, by: 'sink', action: 'vconn_swap' },
      ],
      source: { caps: { pdos: CAPS }, behaviour: { swapAnswer: 'accept' } },
    });
    expect(messagesAfter(accept, 1_000_000).slice(0, 5)).toEqual(['source DR_Swap', 'sink Accept', 'sink VCONN_Swap', 'source Accept', 'sink PS_RDY']);
    // After DR_Swap the source is the UFP: its headers carry Port Data Role 0 (§6.2.1.1.6).
    const later = accept.events.filter((r) => 'msg' in r && r.from === 'source' && r.t > 1_300_000 && r.message?.header.messageType !== 'GoodCRC');
    expect(later.every((r) => 'msg' in r && r.message?.header.dataRole === 'ufp')).toBe(true);
    const refused = run({ actions: [{ atMs: 1_000, by: 'sink', action: 'pr_swap' }], sink: { behaviour: { swapAnswer: 'not_supported' } } });
    expect(messagesAfter(refused, 1_000_000).slice(0, 2)).toEqual(['sink PR_Swap', 'source Reject']);
  });

  // §7.3.9 / §8.3.3.19: Accept, the source's supply off then PS_RDY, the new source's supply on then PS_RDY,
  // then after tSwapSourceStart the new source offers its own capabilities.
  it('PR_Swap accepted: the roles change and the new source offers sink.swapCaps', () => {
    const result = run({
      source: { caps: { pdos: CAPS }, behaviour: { swapAnswer: 'accept' } },
      actions: [{ atMs: 1_000, by: 'sink', action: 'pr_swap' }],
    });
    const seq = messagesAfter(result, 1_000_000);
    expect(seq.slice(0, 8)).toEqual(['sink PR_Swap', 'source Accept', 'source PS_RDY', 'sink PS_RDY', 'source Source_Capabilities', 'sink Request', 'source Accept', 'source PS_RDY']);
    const msgs = list(result).filter((m) => m.t >= 1_000_000);
    const newSourcePsRdy = msgs[3]!;
    const caps = msgs[4]!;
    expect(newSourcePsRdy.t - msgs[2]!.t).toBeLessThan(T.tPSSourceOn.maxUs);
    expect(caps.t - newSourcePsRdy.t).toBeGreaterThanOrEqual(T.tSwapSourceStart.minUs);
    // The former sink now writes from: source; it offers 5 V 1.5 A and the former source takes it.
    expect(result.contract).toMatchObject({ voltageMv: 5_000, currentMa: 1_500 });
    expect(result.ports.final.sink.state).toBe('PE_SRC_Ready');
    expect(result.ports.final.source.state).toBe('PE_SNK_Ready');
    expect(disagreements(result.ports, result.endUs)).toEqual([]);
    // VBUS: off (vSafe0V) during the swap, then 5 V from the new source.
    const lowest = Math.min(...result.events.filter((r) => 'vbus' in r && r.t > 1_000_000).map((r) => ('vbus' in r ? r.vbus.mv : 99_999)));
    expect(lowest).toBeLessThanOrEqual(800);
  });
});

describe('Wait, Soft_Reset and Hard_Reset on demand', () => {
  // §8.3.3.3.7: Wait with a contract → the sink asks again after tSinkRequest.
  it('wait fault: the sink asks again no sooner than tSinkRequest', () => {
    const result = run({ sink: { changes: [{ atMs: 1_000, policy: { kind: 'fixed', voltageMv: 5_000, currentMa: 1_000 } }] }, faults: [{ kind: 'wait', nth: 2 }] });
    const msgs = list(result);
    const wait = msgs.find((m) => m.type === 'Wait')!;
    const next = msgs.find((m) => m.t > wait.t && m.type === 'Request')!;
    expect(next.t - wait.t).toBeGreaterThanOrEqual(T.tSinkRequest.minUs);
    expect(result.contract).toMatchObject({ voltageMv: 5_000 });
  });
  it('soft_reset and hard_reset actions renegotiate', () => {
    const soft = run({ actions: [{ atMs: 1_000, by: 'sink', action: 'soft_reset' }] });
    expect(messagesAfter(soft, 1_000_000).slice(0, 3)).toEqual(['sink Soft_Reset', 'source Accept', 'source Source_Capabilities']);
    expect(soft.contract).not.toBeNull();
    const hard = run({ actions: [{ atMs: 1_000, by: 'source', action: 'hard_reset' }] });
    expect(hard.events.some((r) => 'event' in r && r.event === 'hard_reset' && r.from === 'source' && r.t >= 1_000_000)).toBe(true);
    expect(hard.contract).not.toBeNull();
  });
});
