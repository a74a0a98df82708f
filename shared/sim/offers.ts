/**
 * What a source offers for what it knows of the cable, in SPR or EPR mode, memoised per run so
 * that repeated offers are the same array (the sink's decode memo keys on it).
 *
 * - More than 3 A only over a cable that says 5 A (USB PD R3.2 V1.1 §4.4 / USB Type-C R2.3 §4.9,
 *   from memory): without such a cable every fixed, variable and PPS current is capped at 3 A.
 * - A source with EPR objects sets EPR Mode Capable (b23) in its first (vSafe5V fixed) PDO (§6.4.1.2.1).
 * - EPR_Source_Capabilities: positions 1–7 the SPR offers padded with empty objects, then the EPR
 *   objects from position 8 (§6.5.15.1).
 */
import { decodeSourcePdo } from '../pd/source-pdo.ts';
import type { SourcePdo } from '../pd/types.ts';
import type { EMarker } from './cable-identity.ts';
import type { Offers } from './source-pe.ts';

const EPR_MODE_CAPABLE = 1 << 23;
const SPR_SLOTS = 7;

function capAt3A(word: number): number {
  const type = word >>> 30;
  if (type === 0b00 || type === 0b10) {
    // Fixed and variable: Maximum Current b9..0 in 10 mA units.
    return (word & 0x3ff) > 300 ? ((word & ~0x3ff) | 300) >>> 0 : word;
  }
  if (type === 0b11 && ((word >>> 28) & 0b11) === 0) {
    // PPS APDO: Maximum Current b6..0 in 50 mA units.
    return (word & 0x7f) > 60 ? ((word & ~0x7f) | 60) >>> 0 : word;
  }
  return word;
}

export type OffersFor = (cable: EMarker | null, epr: boolean) => Offers;

const byCaps = new WeakMap<readonly number[], Map<readonly number[] | null, OffersFor>>();

/**
 * The offers function for a source's words (and EPR words), memoised by those arrays so repeated
 * runs of one scenario decode nothing again. `sprPdos` are the words already decoded.
 */
export function offersFor(sprWords: readonly number[], eprWords: readonly number[] | null, sprPdos?: readonly SourcePdo[]): OffersFor {
  let byEpr = byCaps.get(sprWords);
  if (!byEpr) {
    byEpr = new Map();
    byCaps.set(sprWords, byEpr);
  }
  let offers = byEpr.get(eprWords);
  if (!offers) {
    offers = createOffers(sprWords, eprWords, sprPdos);
    byEpr.set(eprWords, offers);
  }
  return offers;
}

function createOffers(sprWords: readonly number[], eprWords: readonly number[] | null, sprPdos?: readonly SourcePdo[]): OffersFor {
  const memo = new Map<string, Offers>();
  const decode = (words: readonly number[]): Offers => ({ words, pdos: words === sprWords && sprPdos ? sprPdos : words.map((word) => decodeSourcePdo(word) as SourcePdo) });
  return (cable, epr) => {
    const fiveAmps = (cable?.currentMa ?? 0) >= 5_000;
    const key = `${fiveAmps}|${epr}`;
    let offers = memo.get(key);
    if (offers) return offers;
    let spr = fiveAmps ? [...sprWords] : sprWords.map(capAt3A);
    if (eprWords && spr[0] !== undefined && spr[0] >>> 30 === 0) spr[0] = (spr[0] | EPR_MODE_CAPABLE) >>> 0;
    if (spr.every((word, i) => word === sprWords[i])) spr = sprWords as number[];
    const words = epr && eprWords ? [...spr, ...Array<number>(Math.max(0, SPR_SLOTS - spr.length)).fill(0), ...eprWords] : spr;
    offers = decode(words);
    memo.set(key, offers);
    return offers;
  };
}
