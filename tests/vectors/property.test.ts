/**
 * Property vectors: the runner finds a planted bug and shrinks it to the smallest failing input,
 * gives the same verdict for the same seed, and turns a Scenario counterexample into a negotiation
 * vector the user can save.
 */
import { describe, expect, it } from 'vitest';
import { engine, type EngineFacade } from '../../shared/vectors/engine-facade.ts';
import { checkProperty } from '../../shared/vectors/property.ts';
import { runVector } from '../../shared/vectors/run.ts';
import { vectorSchema } from '../../shared/vectors/schema.ts';

// The Fixed Supply PDO keeps the maximum current in B9..0 in 10 mA units (USB PD R3.1 V1.8
// §6.4.1.2.2, Table 6-9, from memory): a decoder that loses bit 8 is wrong from 256 × 10 mA on.
const currentRoundTrip = `
export default ({ fc, engine }) =>
  fc.property(fc.integer({ min: 0, max: 1023 }), (units: number) => {
    const raw = (100 << 10) | units; // 5 V (100 × 50 mV) at units × 10 mA
    const pdo = engine.codec.decodeSourcePdo(raw);
    if (pdo.maxCurrentMa !== units * 10) throw new Error(\`\${units * 10} mA decoded as \${pdo.maxCurrentMa} mA\`);
  });
`;

function withPlantedBug(): EngineFacade {
  const real = engine.codec.decodeSourcePdo;
  const buggy: typeof real = (raw) => real((raw & ~0x100) >>> 0);
  return { ...engine, codec: { ...engine.codec, decodeSourcePdo: buggy } };
}

describe('property vectors', () => {
  it('hold on the real codec', async () => {
    const outcome = await checkProperty(currentRoundTrip, { runs: 300, seed: 4 }, engine);
    expect(outcome).toMatchObject({ holds: true, numRuns: 300 });
    expect(outcome.durationMs).toBeGreaterThan(0);
  });

  it('find a planted bug and shrink it to the smallest failing current (256 × 10 mA)', async () => {
    const outcome = await checkProperty(currentRoundTrip, { runs: 300, seed: 4 }, withPlantedBug());
    expect(outcome.holds).toBe(false);
    expect(outcome.counterexample).toEqual([256]);
    expect(outcome.failure).toBe('2560 mA decoded as 0 mA');
    expect(outcome.numShrinks).toBeGreaterThan(0);
    // The same seed gives the same outcome (what makes the browser, the worker and CI agree).
    const again = await checkProperty(currentRoundTrip, { runs: 300, seed: 4 }, withPlantedBug());
    expect({ ...again, durationMs: 0 }).toEqual({ ...outcome, durationMs: 0 });
  });

  it('report code that does not compile or export a property as an input error', async () => {
    expect((await checkProperty('export default (', { runs: 1, seed: 1 }, engine)).error?.code).toBe('property.syntax');
    expect((await checkProperty('export const x = 1;', { runs: 1, seed: 1 }, engine)).error?.code).toBe('property.export');
    expect((await checkProperty('import fs from "node:fs"; export default () => fs;', { runs: 1, seed: 1 }, engine)).error?.message).toMatch(/import of "node:fs" is not available/);
  });

  it('turn a failing Scenario counterexample into a negotiation vector that validates', async () => {
    // A property that no scenario can satisfy, so the first generated scenario is the counterexample.
    const code = `export default ({ fc, engine }) => fc.property(engine.arbitraries.scenario(), (s) => { throw new Error('always'); });`;
    const vector = vectorSchema.parse({
      vector: 1,
      id: 'demo/always-fails',
      title: 'always fails',
      tags: [],
      ref: 'common practice',
      kind: 'property',
      input: { code, runs: 5, seed: 2 },
      expect: { holds: true },
    });
    const result = await runVector(vector);
    expect(result.ok).toBe(false);
    expect(result.counterexampleVector).toMatchObject({ id: 'demo/always-fails/counterexample', kind: 'negotiation' });
    expect(vectorSchema.safeParse(result.counterexampleVector).success).toBe(true);
  });
});
