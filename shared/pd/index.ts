/**
 * The message codec: public entry (README.md beside it).
 * Result-returning functions take user input and never throw; the building blocks are pure and
 * fast, and their writers throw RangeError on a field out of range.
 */
export type * from './types.ts';
export { parseHex, parseWords, toHex, hex16, hex32 } from './hex.ts';
export { crc32, crc32Bytes } from './crc32.ts';
export { decodeHeader, encodeHeader, decodeExtendedHeader, encodeExtendedHeader, type HeaderFields } from './header.ts';
export { messageTypeCode, messageTypeName, messageTypeNames } from './message-types.ts';
export { decodeSourcePdo, encodeSourcePdo } from './source-pdo.ts';
export { decodeSinkPdo, encodeSinkPdo } from './sink-pdo.ts';
export { decodeRdo, encodeRdo, rdoObjectPosition } from './rdo.ts';
export { decodeMessage, type DecodeOptions, type DecodeResult } from './decode-message.ts';
export { encodeMessage, type MessageInput, type DataObjectInput } from './encode-message.ts';
export { encodeChunks, createChunkAssembler, type ChunkAssembler, type ChunkStep } from './chunks.ts';
export { chunkDataBytes, chunkObjectCount, MAX_CHUNK_BYTES, MAX_EXTENDED_BYTES } from './decode-extended.ts';
export { decodeOtherObject, encodeOtherObject } from './other-objects.ts';
export { DECODE_RULES, type DecodeRule } from './findings.ts';
export { fieldValue, fieldCount, fieldMask, reservedMask, type FieldLayout, type WordLayout } from './layout.ts';
export { describeFields, fieldWords, formatValue, summarizeObject } from './describe.ts';
export { headerLayout, objectLayout, EXTENDED_HEADER_LAYOUT } from './layouts.ts';
export { decodeInput, type DecoderInput, type DecodeOutcome, type InputMode } from './decode-input.ts';
export {
  cableIdentityAck,
  cableIdentityVdos,
  cableLimits,
  discoverIdentityAck,
  discoverIdentityRequest,
  discoverSvidsAck,
  type CableIdentity,
  type CableLimits,
  type VdmMessageOptions,
} from './identity.ts';
export { vdmObjectKinds, PD_SID } from './vdm-objects.ts';
export { VDO_LAYOUTS } from './layouts-vdo.ts';
