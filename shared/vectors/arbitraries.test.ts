import * as fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fixedPdoRaw, lawfulCapsPdos, pdoHex, ppsApdoRaw, scenario } from './arbitraries.ts';
import { scenarioSchema } from '../sim/scenario.ts';

describe('hand-packed PDOs', () => {
  // USB PD R3.1 V1.8 Table 6-9 (Fixed Supply PDO, from memory): 5 V = 100 × 50 mV in B19..10, 3 A = 300 × 10 mA;
  // vector.md's example offers 0x0001912c (5 V 3 A) and 0xc0dc213c (PPS 3.3–11 V 3 A, Table 6-13).
  it('match the contract examples', () => {
    expect(pdoHex(fixedPdoRaw(5_000, 3_000))).toBe('0x0001912c');
    expect(pdoHex(fixedPdoRaw(20_000, 2_250))).toBe('0x000640e1');
    expect(pdoHex(ppsApdoRaw(3_300, 11_000, 3_000))).toBe('0xc0dc213c');
  });
});

describe('lawfulCapsPdos', () => {
  // USB PD R3.1 V1.8 §10.2.3.2, Table 10-2 (from memory).
  it('offers what the Power Rules require for a PDP', () => {
    expect(lawfulCapsPdos(15)).toEqual(['0x0001912c']);
    expect(lawfulCapsPdos(10)).toEqual([pdoHex(fixedPdoRaw(5_000, 2_000))]);
    expect(lawfulCapsPdos(45)).toEqual(['0x0001912c', '0x0002d12c', '0x0004b12c']);
    expect(lawfulCapsPdos(65)).toEqual(['0x0001912c', '0x0002d12c', '0x0004b12c', '0x00064145']);
    // 20 W / 9 V = 2.222 A, rounded up to the 10 mA step so the offer is never short.
    expect(lawfulCapsPdos(20)[1]).toBe(pdoHex(fixedPdoRaw(9_000, 2_230)));
  });

  it('gives scenarios the simulator accepts', () => {
    fc.assert(
      fc.property(scenario({ faults: ['drop-goodcrc'] }), (s) => {
        expect(scenarioSchema.safeParse(s).success).toBe(true);
      }),
      { numRuns: 50, seed: 1 },
    );
  });
});
