import { describe, expect, it } from 'vitest';
import { scenarioSchema } from '../../../../shared/sim/scenario.ts';
import { defaultPolicy } from '../../../lib/offers-form/policy-fields.ts';
import { benchFormResolverSchema, defaultScenario, formOfScenario, parseScenarioText, scenarioOfForm } from './form-model.ts';

function formOf(input: unknown) {
  const scenario = scenarioSchema.parse(input);
  const form = formOfScenario(scenario);
  if (!form.ok) throw new Error(form.error.message);
  return form.values;
}

describe('bench form model', () => {
  it('shows the K65 offers as editable numbers', () => {
    const values = formOf(defaultScenario);
    // 0x0001912c: fixed, 100 × 50 mV = 5 V, 300 × 10 mA = 3 A (USB PD R3.2 V1.1 Table 6.9); 0xc1a4213c:
    // SPR PPS, max 210 × 100 mV, min 33 × 100 mV, 60 × 50 mA (Table 6.14).
    expect(values.offers[0]).toEqual({ kind: 'fixed', voltageMv: 5_000, maxCurrentMa: 3_000 });
    expect(values.offers[3]).toEqual({ kind: 'fixed', voltageMv: 20_000, maxCurrentMa: 3_250 });
    expect(values.offers[4]).toEqual({ kind: 'pps', minVoltageMv: 3_300, maxVoltageMv: 21_000, maxCurrentMa: 3_000 });
    expect(values.cableCurrentMa).toBe(3_000);
  });

  it('round-trips form → scenario → form and keeps what the form does not show', () => {
    const base = {
      ...defaultScenario,
      sink: { ...defaultScenario.sink, load: { currentMa: 1_200 } },
      faults: [{ kind: 'drop' as const, from: 'sink' as const, messageType: 'GoodCRC', nth: 1, count: 2 }],
    };
    const values = formOf(base);
    const changed = { ...values, policy: defaultPolicy('pps'), capsIntervalMs: 150, seed: 9 };
    const mapped = scenarioOfForm(changed, base);
    if (!mapped.ok) throw new Error(mapped.error.message);
    expect(mapped.scenario.sink?.load).toEqual({ currentMa: 1_200 });
    expect(mapped.scenario.source.behaviour).toEqual({ capsIntervalMs: 150 });
    expect(mapped.scenario.faults?.[0]).toEqual({ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 1, count: 2 });
    expect(mapped.scenario.source.caps).toEqual(defaultScenario.source.caps);
    expect(formOf(mapped.scenario)).toEqual(changed);
  });

  it('refuses through the engine schema what a run would refuse, on the field that caused it', () => {
    const values = formOf(defaultScenario);
    const bad = benchFormResolverSchema.safeParse({ ...values, faults: [{ kind: 'delay', from: 'source', messageType: 'Accept' }] });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues.some((issue) => issue.path.join('.') === 'faults.0.delayMs' && /delayMs/.test(issue.message))).toBe(true);
    const tooMany = benchFormResolverSchema.safeParse({ ...values, offers: Array.from({ length: 8 }, () => values.offers[0]) });
    expect(tooMany.error?.issues[0]?.path).toEqual(['offers']);
    expect(benchFormResolverSchema.safeParse(values).success).toBe(true);
  });

  it('parses JSON text with "field: message" errors', () => {
    expect(parseScenarioText('{').ok).toBe(false);
    const missing = parseScenarioText('{"sink": {}}');
    expect(missing.ok ? '' : missing.error.message).toMatch(/^source: /);
    const wrong = parseScenarioText(JSON.stringify({ ...defaultScenario, durationMs: 0 }));
    expect(wrong.ok ? '' : wrong.error.message).toMatch(/^durationMs: /);
    expect(parseScenarioText(JSON.stringify(defaultScenario)).ok).toBe(true);
  });
});
