/**
 * Public entry of the wire level: CRC-32, 4b5b, ordered sets, BMC, the VCD writer and the streaming
 * VCD decoder (README.md beside it).
 */
// The CRC-32 belongs to the message codec (pd); wire re-exports it so callers of the wire level keep one import.
export { crc32, crc32Bytes } from '../pd/crc32.ts';
export { DATA_SYMBOLS, K_CODES, decode4b5b, decodeSymbol, encode4b5b, type KCodeName, type Symbol5 } from './4b5b.ts';
export { ORDERED_SETS, orderedSetBits, recognizeOrderedSet, type OrderedSetMatch, type OrderedSetName } from './ordered-sets.ts';
export { PREAMBLE_BITS, packetBits, preambleBits } from './packet-bits.ts';
export { bmcDecode, bmcEncode } from './bmc.ts';
export { DEFAULT_BITRATE_BPS, DEFAULT_GAP_US, encodeWaveform, maxTickUs, type WaveformOptions } from './vcd-writer.ts';
export { createVcdDecoder, decodeVcd, type VcdDecoder, type VcdDecoderOptions } from './decoder.ts';
export { parseTimescaleUs, type VcdTimescale } from './vcd-timescale.ts';
export type { ResetOrderedSet, WireEvent, WireMessageEvent, WirePacket, WireResetEvent, WireUnreadableEvent } from './types.ts';
