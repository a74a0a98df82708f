/**
 * The bits of one packet in wire order (USB PD R3.2 §5.6 "Packet Format"; section
 * numbers from memory): preamble, SOP* ordered set, 4b5b-coded header + data + CRC-32, EOP. Hard Reset and Cable
 * Reset are a preamble and their ordered set only, with no EOP (§5.6.4, §5.6.5).
 */
import { K_CODES, encode4b5b, pushSymbolBits } from './4b5b.ts';
import { crc32Bytes } from '../pd/crc32.ts';
import { orderedSetBits } from './ordered-sets.ts';
import type { WirePacket } from './types.ts';

/** Preamble length in bits (§5.6.1.1: 64 bits of alternating 0 and 1, starting with 0, ending with 1). */
export const PREAMBLE_BITS = 64;

export function preambleBits(): number[] {
  return Array.from({ length: PREAMBLE_BITS }, (_, i) => i & 1);
}

/** Wire-order bits of a packet; a message gets its CRC-32 appended here. */
export function packetBits(packet: WirePacket): number[] {
  const bits = preambleBits();
  if ('orderedSet' in packet) {
    bits.push(...orderedSetBits(packet.orderedSet));
    return bits;
  }
  bits.push(...orderedSetBits(packet.sop));
  const crc = crc32Bytes(packet.bytes);
  const framed = new Uint8Array(packet.bytes.length + 4);
  framed.set(packet.bytes);
  framed.set(crc, packet.bytes.length);
  bits.push(...encode4b5b(framed));
  pushSymbolBits(bits, K_CODES.EOP);
  return bits;
}
