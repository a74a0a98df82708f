/**
 * The analyser against the simulator's own ports, not against itself (tests/support/one-truth.ts):
 * a fixed seed here; `npm run bench:one-truth` runs a larger campaign.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { judge, oneTruthScenarios } from '../../tests/support/one-truth.ts';
import { contractMismatches } from './agreement.ts';

describe('one truth between simulator and analyser', () => {
  it("no analyser error, and its contract equals both ports' at every instant", () => {
    fc.assert(
      fc.property(oneTruthScenarios(), (input) => {
        const verdict = judge(input);
        expect(verdict.errors).toEqual([]);
        expect(verdict.mismatches).toEqual([]);
      }),
      { numRuns: 40, seed: 20_261_204 },
    );
  });

  it('finds a mismatch when one port believes another contract', () => {
    const contract = { kind: 'fixed' as const, objectPosition: 2, voltageMv: 9_000, currentMa: 2_000, powerMw: 18_000 };
    const other = { ...contract, currentMa: 3_000, powerMw: 27_000 };
    const found = contractMismatches(
      [{ startUs: 1_000, contract }],
      [
        { tUs: 1_000, side: 'sink', contract },
        { tUs: 1_200, side: 'source', contract: other },
      ],
      10_000,
      2_000,
    );
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ analyser: contract, sink: contract, source: other });
    expect(
      contractMismatches(
        [{ startUs: 1_000, contract }],
        [
          { tUs: 1_000, side: 'sink', contract },
          { tUs: 1_200, side: 'source', contract },
        ],
        10_000,
        2_000,
      ),
    ).toEqual([]);
  });
});
