import { describe, expect, it } from 'vitest';
import { describeZodError, scenarioJsonSchema, traceJsonSchema, vectorJsonSchema, vectorSchema } from './schema.ts';

// The vector file of docs/vector.md; the JSON Schemas are generated with zod 4's
// z.toJSONSchema (draft 2020-12).
const caps = {
  vector: 1,
  id: 'caps/power-rules/45w-without-9v',
  title: 'A 45 W source must offer 9 V',
  tags: ['power-rules'],
  ref: 'USB PD R3.1, §10.2.3',
  kind: 'caps',
  input: { pdos: ['0x0001912c', '0x0004b12c', '0x000640e1'], pdpW: 45 },
  expect: { findings: { include: ['caps.power-rules-missing'], exclude: [] } },
};

describe('vectorSchema', () => {
  it('accepts the vector.md example', () => {
    expect(vectorSchema.safeParse(caps).success).toBe(true);
  });

  it('rejects a bad id, an unknown kind, an unknown key and a wrong expect key, saying where', () => {
    const bad = (patch: object) => {
      const parsed = vectorSchema.safeParse({ ...caps, ...patch });
      return parsed.success ? '' : describeZodError(parsed.error);
    };
    expect(bad({ id: 'Caps/Upper' })).toMatch(/^id: lower-case words/);
    expect(bad({ id: 'caps//double' })).toMatch(/^id: /);
    expect(bad({ kind: 'nope' })).toMatch(/^kind: /);
    expect(bad({ extra: 1 })).toMatch(/extra/);
    expect(bad({ expect: { hex: 'a303' } })).toMatch(/^expect: /);
    expect(bad({ input: { pdpW: 45 } })).toMatch(/^input\.pdos: give hex or pdos/);
    expect(bad({ vector: 2 })).toMatch(/^vector: /);
  });

  it("fills a property vector's defaults (runs 100, seed 1)", () => {
    const parsed = vectorSchema.parse({ ...caps, kind: 'property', input: { code: 'export default () => 1' }, expect: { holds: true } });
    expect(parsed.kind === 'property' && parsed.input).toMatchObject({ runs: 100, seed: 1 });
  });
});

describe('JSON Schemas', () => {
  it('describe every kind of vector', () => {
    const schema = vectorJsonSchema();
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    const text = JSON.stringify(schema);
    for (const kind of ['decode', 'encode', 'caps', 'request', 'negotiation', 'trace', 'property']) expect(text).toContain(`"const":"${kind}"`);
  });

  it('describe the scenario and the trace record with its header line', () => {
    expect(JSON.stringify(scenarioJsonSchema())).toContain('currentRatingMa');
    const trace = traceJsonSchema();
    expect(JSON.stringify(trace)).toContain('"msg"');
    expect(trace.$defs).toHaveProperty('header');
  });
});
