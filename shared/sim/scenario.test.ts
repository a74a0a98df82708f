import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { parseScenario, scenarioSchema } from './scenario.ts';

describe('scenarioSchema', () => {
  // vector.md "Scenario": the example given there parses as written.
  it('reads the vector.md example and fills the defaults', () => {
    const parsed = parseScenario({
      source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0xc0dc213c'] }, specRevision: '3.0', behaviour: { capsIntervalMs: 150 } },
      sink: { specRevision: '3.0', policy: { kind: 'pps', voltageMv: 8400, currentMa: 2500 }, changes: [{ atMs: 4000, policy: { kind: 'fixed', voltageMv: 5000, currentMa: 1500 } }] },
      cable: { currentRatingMa: 3000, resistanceMohm: 160 },
      faults: [{ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 1 }],
      durationMs: 20000,
      seed: 7,
    });
    expect(parsed.ok).toBe(true);
    const minimal = parseScenario({ source: { caps: { pdos: ['0x0001912c'] } } });
    expect(minimal.ok && minimal.scenario).toMatchObject({
      source: { specRevision: '3.0', behaviour: { slewMvPerMs: 1_000, rp: '3.0A' } },
      sink: { specRevision: '3.0', policy: { kind: 'max-power' }, changes: [], load: { steps: [] } },
      cable: { currentRatingMa: 3_000, resistanceMohm: 100 },
      faults: [],
      durationMs: 5_000,
      seed: 1,
    });
  });

  it('accepts caps as a Source_Capabilities message in hex', () => {
    // Header 0x11a1 (Source_Capabilities, 1 object, R3.0, source/DFP; USB PD R3.2 V1.1 Table 6.1), 5 V 3 A.
    expect(parseScenario({ source: { caps: { hex: 'a1112c910100' } } }).ok).toBe(true);
  });

  it('says which field is wrong, as "field: message"', () => {
    const bad = (input: unknown) => {
      const result = parseScenario(input);
      return result.ok ? '' : result.error.message;
    };
    expect(bad({ source: { caps: { pdos: ['0x0001912c'] } }, durationMs: -1 })).toMatch(/^durationMs: /);
    expect(bad({ source: { caps: { pdos: ['nonsense'] } } })).toMatch(/^source\.caps: PDO 1 "nonsense"/);
    expect(bad({ source: { caps: { hex: '4100' } } })).toMatch(/^source\.caps: caps\.hex is a GoodCRC message/);
    expect(bad({ source: { caps: { pdos: ['0x0001912c'] } }, faults: [{ kind: 'delay', from: 'sink' }] })).toBe('faults.0.delayMs: a delay fault needs delayMs');
    expect(bad({ source: { caps: { pdos: ['0x0001912c'] } }, faults: [{ kind: 'explode' }] })).toMatch(/^faults\.0\.kind: /);
    // vSrcSlewPos caps the slew at 30 mV/µs (USB PD R3.2 V1.1 §7.1.4.1).
    expect(bad({ source: { caps: { pdos: ['0x0001912c'] }, behaviour: { slewMvPerMs: 31_000 } } })).toMatch(/^source\.behaviour\.slewMvPerMs: /);
  });

  it('has a JSON Schema for `parley schema scenario`', () => {
    const schema = z.toJSONSchema(scenarioSchema, { io: 'input', unrepresentable: 'any' }) as { properties?: Record<string, unknown> };
    expect(Object.keys(schema.properties ?? {})).toEqual(['source', 'sink', 'cable', 'actions', 'faults', 'durationMs', 'seed', 'timers']);
  });
});
