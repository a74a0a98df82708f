import { describe, expect, it } from 'vitest';
import { runVector } from '../../../../shared/vectors/run.ts';
import { vectorSchema } from '../../../../shared/vectors/schema.ts';
import { examples, loadExamples } from './examples.ts';

describe('property examples', () => {
  it('bundle every property vector of the library, shipped ones first, and the planted bug last', () => {
    const ids = examples.map((example) => example.id);
    expect(ids).toContain('property/sink-policy/never-requests-more-than-offered');
    expect(ids).toContain('property/sim/one-lost-goodcrc-never-prevents-a-contract');
    expect(ids).toContain('property/codec/encode-after-decode-is-identity');
    expect(ids).toContain('property/rules/lawful-offers-have-no-error');
    expect(ids.at(-1)).toBe('property/demo/planted-bug-contract-above-offer');
    const firstUnshipped = examples.findIndex((example) => example.origin === 'library' && !example.tags.includes('shipped'));
    expect(examples.slice(0, firstUnshipped).every((example) => example.tags.includes('shipped'))).toBe(true);
    expect(new Set(ids).size).toBe(ids.length);
    // Every code is annotated for the editor's completion.
    expect(examples.every((example) => example.code.includes('({ fc, engine }: PropertyContext)'))).toBe(true);
  });

  it('skip files that are not property vectors', () => {
    const loaded = loadExamples({ a: '{"kind":"caps","id":"x","title":"t"}', b: 'not json' });
    expect(loaded.map((example) => example.id)).toEqual(['property/demo/planted-bug-contract-above-offer']);
  });

  it('planted bug: fails and shrinks to a 28 W source at 15 V with a max-power sink', async () => {
    const planted = examples.at(-1)!;
    const vector = vectorSchema.parse({
      vector: 1,
      id: planted.id,
      title: planted.title,
      tags: planted.tags,
      ref: planted.ref,
      kind: 'property',
      input: { code: planted.code, runs: planted.runs, seed: planted.seed },
      expect: { holds: planted.holds },
    });
    const result = await runVector(vector);
    expect(result.ok).toBe(true); // it is expected not to hold
    expect(result.property?.holds).toBe(false);
    expect(result.property?.numShrinks).toBeGreaterThan(0);
    // Power Rules (USB PD R3.1 V1.8 §10.2.3.2, Table 10-2, from memory): above 27 W a source adds
    // 15 V at PDP/15, so the smallest PDP with a 15 V offer is 28 W: 1.87 A, PDO 0x0004b0bb
    // (300 × 50 mV, 187 × 10 mA; Table 6-9).
    expect(result.property?.failure).toBe('a contract of 1920 mA on an offer of 1870 mA at 15000 mV');
    expect(result.counterexampleVector).toMatchObject({
      id: 'property/demo/planted-bug-contract-above-offer/counterexample',
      kind: 'negotiation',
      input: { scenario: { source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b0bb'] } }, sink: { policy: { kind: 'max-power' } } } },
    });
    expect(vectorSchema.safeParse(result.counterexampleVector).success).toBe(true);
  });
});

describe('the blank template', () => {
  it('holds on the real engine', async () => {
    const { blankExample } = await import('./examples.ts');
    const vector = vectorSchema.parse({
      vector: 1,
      id: blankExample.id,
      title: blankExample.title,
      tags: [],
      ref: blankExample.ref,
      kind: 'property',
      input: { code: blankExample.code, runs: 100, seed: 1 },
      expect: { holds: true },
    });
    const result = await runVector(vector);
    expect(result.message).toBeUndefined();
    expect(result.property?.holds).toBe(true);
  });
});
