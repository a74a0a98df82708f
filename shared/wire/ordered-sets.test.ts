import { describe, expect, it } from 'vitest';
import { K_CODES } from './4b5b.ts';
import { ORDERED_SETS, orderedSetAt, orderedSetBits, recognizeOrderedSet, type OrderedSetName } from './ordered-sets.ts';

const codes = (name: OrderedSetName): number[] => ORDERED_SETS[name].map((k) => K_CODES[k]);

describe('ordered sets', () => {
  it('are the K-code sequences of the specification', () => {
    // USB PD R3.2 V1.1 §5.4 "Ordered Sets" table and §5.6.4/§5.6.5 (Hard Reset, Cable Reset).
    expect(ORDERED_SETS).toEqual({
      SOP: ['Sync-1', 'Sync-1', 'Sync-1', 'Sync-2'],
      "SOP'": ['Sync-1', 'Sync-1', 'Sync-3', 'Sync-3'],
      "SOP''": ['Sync-1', 'Sync-3', 'Sync-1', 'Sync-3'],
      "SOP'_Debug": ['Sync-1', 'RST-2', 'RST-2', 'Sync-3'],
      "SOP''_Debug": ['Sync-1', 'RST-2', 'Sync-3', 'Sync-2'],
      Hard_Reset: ['RST-1', 'RST-1', 'RST-1', 'RST-2'],
      Cable_Reset: ['RST-1', 'Sync-1', 'RST-1', 'Sync-3'],
    });
  });

  it('recognise every set from its 20 bits', () => {
    for (const name of Object.keys(ORDERED_SETS) as OrderedSetName[]) {
      expect(orderedSetAt(orderedSetBits(name), 0)).toEqual({ name, corrected: false });
    }
  });

  it('accept one corrupted K-code out of four in any place', () => {
    // USB PD R3.2 V1.1 §5.4: valid when three of the four K-codes are correct.
    for (const name of Object.keys(ORDERED_SETS) as OrderedSetName[]) {
      for (let place = 0; place < 4; place++) {
        const symbols = codes(name);
        symbols[place] = 0b00000; // not a symbol at all
        expect(recognizeOrderedSet(symbols)).toEqual({ name, corrected: true });
      }
    }
  });

  it('reject two corrupted K-codes', () => {
    for (const name of Object.keys(ORDERED_SETS) as OrderedSetName[]) {
      const symbols = codes(name);
      symbols[1] = 0;
      symbols[3] = 0;
      expect(recognizeOrderedSet(symbols)).toBeNull();
    }
  });

  it("reject a set one K-code away from two sets (SOP and SOP')", () => {
    const s1 = K_CODES['Sync-1'];
    const s3 = K_CODES['Sync-3'];
    expect(recognizeOrderedSet([s1, s1, s1, s3])).toBeNull();
  });
});
