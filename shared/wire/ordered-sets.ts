/**
 * Ordered sets (USB PD R3.2 §5.4, Table 5-5 "Ordered Sets"): four K-codes, each sent as one 5-bit
 * symbol. A receiver accepts an ordered set when at least three of its four K-codes arrive in the
 * right place (§5.4, "Validation of Ordered Sets", and §5.6.4/§5.6.5 for Hard Reset and Cable
 * Reset). Every pair of ordered sets differs in at least two places, so a received set with one
 * corrupted K-code can sit one K-code away from two sets; such a tie is rejected, not guessed.
 */
import type { Sop } from '../pd/types.ts';
import { K_CODES, pushSymbolBits, symbolAt, type KCodeName } from './4b5b.ts';
import type { ResetOrderedSet } from './types.ts';

export type OrderedSetName = Sop | ResetOrderedSet;

export const ORDERED_SETS: Readonly<Record<OrderedSetName, readonly [KCodeName, KCodeName, KCodeName, KCodeName]>> = {
  SOP: ['Sync-1', 'Sync-1', 'Sync-1', 'Sync-2'],
  "SOP'": ['Sync-1', 'Sync-1', 'Sync-3', 'Sync-3'],
  "SOP''": ['Sync-1', 'Sync-3', 'Sync-1', 'Sync-3'],
  "SOP'_Debug": ['Sync-1', 'RST-2', 'RST-2', 'Sync-3'],
  "SOP''_Debug": ['Sync-1', 'RST-2', 'Sync-3', 'Sync-2'],
  Hard_Reset: ['RST-1', 'RST-1', 'RST-1', 'RST-2'],
  Cable_Reset: ['RST-1', 'Sync-1', 'RST-1', 'Sync-3'],
};

const ENTRIES = Object.entries(ORDERED_SETS).map(([name, codes]) => [name as OrderedSetName, codes.map((code) => K_CODES[code])] as const);

/** The 20 wire bits of an ordered set, first K-code first, each symbol b0 first. */
export function orderedSetBits(name: OrderedSetName): number[] {
  const bits: number[] = [];
  for (const code of ORDERED_SETS[name]) pushSymbolBits(bits, K_CODES[code]);
  return bits;
}

export interface OrderedSetMatch {
  name: OrderedSetName;
  /** True when one K-code of four was corrupted. */
  corrected: boolean;
}

/** Recognises four received 5-bit symbols as an ordered set, tolerating one corrupted K-code. */
export function recognizeOrderedSet(symbols: readonly number[]): OrderedSetMatch | null {
  let near: OrderedSetName | null = null;
  let nearCount = 0;
  for (const [name, codes] of ENTRIES) {
    let same = 0;
    for (let i = 0; i < 4; i++) if (symbols[i] === codes[i]) same++;
    if (same === 4) return { name, corrected: false };
    if (same === 3) {
      near = name;
      nearCount++;
    }
  }
  return nearCount === 1 && near !== null ? { name: near, corrected: true } : null;
}

/** Recognises the ordered set whose first bit is at `offset` of a wire-order bit array. */
export function orderedSetAt(bits: ArrayLike<number>, offset: number): OrderedSetMatch | null {
  if (offset + 20 > bits.length) return null;
  return recognizeOrderedSet([0, 5, 10, 15].map((k) => symbolAt(bits, offset + k)));
}
