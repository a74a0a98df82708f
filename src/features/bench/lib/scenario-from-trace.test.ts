import { describe, expect, it } from 'vitest';
import { parseScenario, simulate } from '../../../../shared/sim/index.ts';
import type { Message } from '../../../../shared/pd/types.ts';
import { capturedMessagesOf, scenarioFromMessages, type CapturedMessage } from './scenario-from-trace.ts';
import { defaultScenario } from './form-model.ts';

function captured(input: unknown): CapturedMessage[] {
  const parsed = parseScenario(input);
  if (!parsed.ok) throw new Error(parsed.error.message);
  const run = simulate(parsed.scenario);
  return run.events.flatMap((record) => ('msg' in record && record.message ? [{ t: record.t, from: record.from, decoded: record.message as Message, crcOk: record.crcOk }] : []));
}

describe('scenarioFromMessages', () => {
  it('derives offers, a fixed policy and the timing from a simulated capture', () => {
    // A 5 A cable: the source offers its 3.25 A object as it is (over a 3 A cable it would cap it at 3 A).
    const messages = captured({
      ...defaultScenario,
      cable: { currentRatingMa: 5_000 },
      sink: { policy: { kind: 'fixed', voltageMv: 15_000, currentMa: 2_000 } },
      source: { ...defaultScenario.source, behaviour: { capsIntervalMs: 150 } },
      faults: [{ kind: 'drop', from: 'sink', messageType: 'Request', nth: 1 }],
    });
    const derived = scenarioFromMessages(messages);
    if (!derived.ok) throw new Error(derived.error.message);
    expect(derived.scenario.source.caps).toEqual(defaultScenario.source.caps);
    expect(derived.scenario.sink?.policy).toEqual({ kind: 'fixed', voltageMv: 15_000, currentMa: 2_000 });
    expect(derived.scenario.sink?.changes).toEqual([]);
    expect(parseScenario(derived.scenario).ok).toBe(true);
  });

  it('turns programmable Requests into a pps policy and a later change into sink.changes', () => {
    const messages = captured({
      ...defaultScenario,
      sink: { policy: { kind: 'pps', voltageMv: 8_400, currentMa: 2_500 }, changes: [{ atMs: 1_500, policy: { kind: 'fixed', voltageMv: 5_000, currentMa: 1_500 } }] },
      durationMs: 3_000,
    });
    const derived = scenarioFromMessages(messages);
    if (!derived.ok) throw new Error(derived.error.message);
    expect(derived.scenario.sink?.policy).toEqual({ kind: 'pps', voltageMv: 8_400, currentMa: 2_500 });
    expect(derived.scenario.sink?.changes).toHaveLength(1);
    expect(derived.scenario.sink?.changes?.[0]?.policy).toEqual({ kind: 'fixed', voltageMv: 5_000, currentMa: 1_500 });
    expect(derived.scenario.sink?.changes?.[0]?.atMs).toBeGreaterThanOrEqual(1_500);
  });

  it('takes a 5 A cable when the sink asked for more than 3 A', () => {
    const messages = captured({ ...defaultScenario, sink: { policy: { kind: 'fixed', voltageMv: 20_000, currentMa: 3_250 } }, cable: { currentRatingMa: 5_000 } });
    const derived = scenarioFromMessages(messages);
    if (!derived.ok) throw new Error(derived.error.message);
    expect(derived.scenario.sink?.policy).toEqual({ kind: 'fixed', voltageMv: 20_000, currentMa: 3_250 });
    expect(derived.scenario.cable).toEqual({ currentRatingMa: 5_000 });
  });

  it('explains a trace without offers', () => {
    expect(scenarioFromMessages([])).toEqual({ ok: false, error: { code: 'trace.no-offers', message: expect.stringContaining('Source_Capabilities') } });
  });

  it('finds the messages in an analysis body, wrapped or not', () => {
    const messages = captured(defaultScenario).slice(0, 3);
    expect(capturedMessagesOf({ timeline: { messages } })?.messages).toHaveLength(3);
    expect(capturedMessagesOf({ analysis: { timeline: { messages, measurements: [{ t: 5, mv: 1 }] } } })?.endUs).toBe(5);
    expect(capturedMessagesOf({ nothing: true })).toBeNull();
  });

  it('decodes stored messages (hex without a decoded form) on demand, typing Requests by the offers before them', () => {
    const parsed = parseScenario({ ...defaultScenario, sink: { policy: { kind: 'fixed', voltageMv: 15_000, currentMa: 2_000 } } });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const stored = simulate(parsed.scenario).events.flatMap((record) =>
      'msg' in record && record.message ? [{ t: record.t, from: record.from, hex: record.msg, messageType: record.message.header.messageType, crcOk: record.crcOk !== false }] : [],
    );
    const found = capturedMessagesOf({ trace: {}, analysis: { timeline: { messages: stored } } });
    expect(found?.messages.map((m) => m.decoded.header.messageType)).toEqual(stored.filter((m) => m.messageType === 'Source_Capabilities' || m.messageType === 'Request').map((m) => m.messageType));
    const derived = scenarioFromMessages(found?.messages ?? []);
    if (!derived.ok) throw new Error(derived.error.message);
    expect(derived.scenario.sink?.policy).toEqual({ kind: 'fixed', voltageMv: 15_000, currentMa: 2_000 });
  });
});
