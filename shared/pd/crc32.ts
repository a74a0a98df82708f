/**
 * The USB PD CRC-32 (USB PD R3.2 §5.6.2, worked example in Appendix A): polynomial 0x04C1_1DB7,
 * initial value 0xFFFF_FFFF, bits processed least significant first (reflected), result inverted.
 * The 32-bit result is sent after the data least significant byte first.
 */

/** Reflected polynomial 0x04C1_1DB7 (bit order reversed because bits go out LSB first). */
const POLY_REFLECTED = 0xedb8_8320;

const TABLE: Uint32Array = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ POLY_REFLECTED : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/** CRC-32 over header + data objects, as an unsigned 32-bit number. */
export function crc32(bytes: Uint8Array): number {
  let crc = 0xffff_ffff;
  for (let i = 0; i < bytes.length; i++) {
    crc = (TABLE[(crc ^ (bytes[i] ?? 0)) & 0xff] ?? 0) ^ (crc >>> 8);
  }
  return (crc ^ 0xffff_ffff) >>> 0;
}

/** The CRC as the four bytes that follow the data on the wire (least significant byte first). */
export function crc32Bytes(bytes: Uint8Array): Uint8Array {
  const crc = crc32(bytes);
  return Uint8Array.of(crc & 0xff, (crc >>> 8) & 0xff, (crc >>> 16) & 0xff, crc >>> 24);
}
