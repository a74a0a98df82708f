/**
 * How long a message occupies the CC wire, from its length: times in a trace are preamble starts,
 * and the specification measures response times from the end of a message (its EOP), so the
 * analyser needs each message's end.
 *
 * Packet format, USB PD R3.2 V1.1 §5.6 (R3.1 V1.8 §5.6, R2.0 V1.3 §5.6): a Preamble of 64 bits
 * (§5.6.1.1), the SOP* ordered set of four K-codes (§5.6.1.2, 4 × 5 bits), the header and data
 * objects with each byte sent as two 4b5b symbols (§5.3, 10 bits a byte), the CRC-32 as eight
 * symbols (§5.6.2, 40 bits) and the EOP K-code (§5.6.3, 5 bits). Bit rate: fBitRate 270–330 kbps,
 * 300 kbps nominal (§5.8.1, BMC transmitter table; from memory).
 */

export const PREAMBLE_BITS = 64;
export const SOP_BITS = 4 * 5;
export const BITS_PER_BYTE = 10;
export const CRC_BITS = 8 * 5;
export const EOP_BITS = 5;
export const BIT_RATE_BPS = 300_000;

/** Microseconds on the wire for a message of `byteLength` bytes (header and objects, no CRC), rounded. */
export function messageDurationUs(byteLength: number, bitRateBps: number = BIT_RATE_BPS): number {
  const bits = PREAMBLE_BITS + SOP_BITS + byteLength * BITS_PER_BYTE + CRC_BITS + EOP_BITS;
  return Math.round((bits * 1_000_000) / bitRateBps);
}
