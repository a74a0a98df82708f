/**
 * One burst of edges (a packet between idle gaps) → a wire event: bit rate from the preamble,
 * BMC bits, the ordered set, 4b5b symbols up to EOP, CRC-32 (USB PD R3.2 §5.6, §5.8.1).
 */
import { decodeSymbol, symbolAt } from './4b5b.ts';
import { bmcDecode, estimateUiUs } from './bmc.ts';
import { crc32 } from '../pd/crc32.ts';
import { orderedSetAt, type OrderedSetMatch } from './ordered-sets.ts';
import { PREAMBLE_BITS } from './packet-bits.ts';
import type { WireEvent } from './types.ts';

/** Fewer edges than this cannot hold a preamble and an ordered set. */
const MIN_EDGES = 40;
/** Bursts with fewer edges are taken for noise (a spike, ringing) and not reported. */
const REPORTED_EDGES = 16;
/** Bits before an ordered set that must alternate (the tail of the preamble) to accept it there. */
const PREAMBLE_TAIL_BITS = 8;

function alternates(bits: readonly number[], from: number, to: number): boolean {
  for (let i = from + 1; i < to; i++) if (bits[i] === bits[i - 1]) return false;
  return true;
}

/** The first ordered set that follows a stretch of preamble. */
function findOrderedSet(bits: readonly number[]): { offset: number; match: OrderedSetMatch } | null {
  for (let offset = PREAMBLE_TAIL_BITS; offset + 20 <= bits.length; offset++) {
    if (!alternates(bits, offset - PREAMBLE_TAIL_BITS, offset)) continue;
    const match = orderedSetAt(bits, offset);
    if (match) return { offset, match };
  }
  return null;
}

function unreadable(edgesUs: readonly number[], line: number, reason: string): WireEvent | null {
  if (edgesUs.length < REPORTED_EDGES) return null;
  const firstUs = edgesUs[0]!;
  return { t: Math.max(0, Math.round(firstUs)), kind: 'unreadable', edges: edgesUs.length, durationUs: Math.round(edgesUs[edgesUs.length - 1]! - firstUs), line, reason };
}

/** Decodes one burst; an `unreadable` event when it holds no packet, null for a spike of a few edges. */
export function decodeBurst(edgesUs: readonly number[], line = 0): WireEvent | null {
  if (edgesUs.length < MIN_EDGES) return unreadable(edgesUs, line, `${edgesUs.length} edges are too few for a preamble and an SOP*`);
  const roughUiUs = estimateUiUs(edgesUs);
  if (!(roughUiUs > 0)) return unreadable(edgesUs, line, 'no bit rate could be measured');
  const { bits, startsUs } = bmcDecode(edgesUs, roughUiUs);
  const found = findOrderedSet(bits);
  if (!found) return unreadable(edgesUs, line, `no SOP* after a preamble (about ${Math.round(1_000 / roughUiUs)} kbit/s; a capture sampled too coarsely for the bit rate reads like this)`);
  const { offset, match } = found;

  // Measured over the preamble's tail (its first edge may be lost, §5.8.1, or a glitch may precede
  // it); the preamble start is 64 UI before the ordered set.
  const span = Math.min(offset, PREAMBLE_BITS - PREAMBLE_TAIL_BITS);
  const sopUs = startsUs[offset]!;
  const uiUs = (sopUs - startsUs[offset - span]!) / span;
  const bitrateBps = Math.round(1_000_000 / uiUs);
  const t = Math.max(0, Math.round(sopUs - PREAMBLE_BITS * uiUs));

  if (match.name === 'Hard_Reset') return { t, kind: 'hard_reset', bitrateBps };
  if (match.name === 'Cable_Reset') return { t, kind: 'cable_reset', bitrateBps };

  const nibbles: number[] = [];
  let symbolErrors = 0;
  let eop = false;
  for (let at = offset + 20; ; at += 5) {
    const value = symbolAt(bits, at);
    if (value < 0) break;
    const symbol = decodeSymbol(value);
    if (symbol.kind === 'k' && symbol.name === 'EOP') {
      eop = true;
      break;
    }
    if (symbol.kind === 'data') nibbles.push(symbol.nibble);
    else {
      symbolErrors++;
      nibbles.push(0);
    }
  }
  const framed = new Uint8Array(nibbles.length >> 1);
  for (let i = 0; i < framed.length; i++) framed[i] = nibbles[2 * i]! | (nibbles[2 * i + 1]! << 4);
  // A header (2 bytes) and a CRC (4 bytes) at the least.
  if (framed.length < 6) return unreadable(edgesUs, line, `an ${match.name} with only ${framed.length} byte(s) after it`);
  const bytes = framed.slice(0, framed.length - 4);
  const crcBytes = framed.subarray(framed.length - 4);
  const crc = (crcBytes[0]! | (crcBytes[1]! << 8) | (crcBytes[2]! << 16) | (crcBytes[3]! << 24)) >>> 0;
  return {
    t,
    kind: 'message',
    sop: match.name,
    bytes,
    crc,
    crcOk: symbolErrors === 0 && crc32(bytes) === crc,
    bitrateBps,
    eop,
    symbolErrors,
    sopCorrected: match.corrected,
  };
}
