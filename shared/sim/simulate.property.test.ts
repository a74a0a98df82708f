/**
 * Properties over random lawful scenarios (offers that pass the Power Rules, any policy, cable,
 * revision and seed; shared/vectors/arbitraries.ts). Without faults a contract is always reached
 * within 1 s of attach — tCCDebounce ≤ 200 ms + tFirstSourceCap ≤ 250 ms + tSrcTransition ≤ 35 ms
 * plus the slew and a few message times (USB PD R3.2 V1.1 §6.6 Time Values, USB Type-C R2.3
 * §4.11.2) — and the analyser finds no error in the simulated trace. With one lost GoodCRC the
 * retry (§6.7.2) still gets a contract.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraries } from '../vectors/arbitraries.ts';
import { parseScenario, simulate } from './index.ts';

function parsed(input: unknown) {
  const result = parseScenario(input);
  if (!result.ok) throw new Error(result.error.message);
  return result.scenario;
}

describe('simulate over lawful scenarios', () => {
  it('reaches a contract within 1 s of attach and the analyser finds no error', () => {
    fc.assert(
      fc.property(arbitraries.scenario(), (input) => {
        const result = simulate(parsed(input));
        expect(result.contracts[0]?.t ?? Infinity).toBeLessThanOrEqual(1_000_000);
        expect(result.findings.filter((f) => f.severity === 'error')).toEqual([]);
      }),
      { numRuns: 60, seed: 20_260_101 },
    );
  });

  it('still reaches a contract with one GoodCRC lost', () => {
    fc.assert(
      fc.property(arbitraries.scenario({ faults: ['drop-goodcrc'] }), (input) => {
        const result = simulate(parsed(input), { decode: false, analyze: false });
        expect(result.contract).not.toBeNull();
      }),
      { numRuns: 150, seed: 20_260_102 },
    );
  });
});
