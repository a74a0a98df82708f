import { describe, expect, it } from 'vitest';
import { decodeHeader } from '../pd/index.ts';
import { extendedBytes, extendedObjects, frameBytes, frameHex, HARD_RESET_DURATION_US, packetDurationUs, packExtendedHeader, packHeader, unpackExtendedHeader } from './wire.ts';

const SOURCE = { roleBit: true, dfp: true };
const SINK = { roleBit: false, dfp: false };

describe('packHeader', () => {
  // USB PD R3.2 V1.1 §6.2.1.1 Table 6.1: a source (DFP) Source_Capabilities with 3 objects,
  // MessageID 0, revision 3.x is 0x31a1 (the header of vector.md's example trace, "a131…").
  it('packs a Source_Capabilities header as the codec reads it back', () => {
    const raw = packHeader('Source_Capabilities', 3, 0, SOURCE, '3.0');
    expect(raw).toBe(0x31a1);
    expect(decodeHeader(raw, 'SOP')).toMatchObject({ messageType: 'Source_Capabilities', numDataObjects: 3, messageId: 0, specRevision: '3.0', powerRole: 'source', dataRole: 'dfp' });
  });

  // trace.md's example: "4100" from the sink is a GoodCRC, MessageID 0, revision 2.0 code 01b.
  it('packs a sink GoodCRC of revision 2.0 as 0x0041', () => {
    expect(packHeader('GoodCRC', 0, 0, SINK, '2.0')).toBe(0x0041);
    expect(decodeHeader(packHeader('Request', 1, 5, SINK, '3.0'), 'SOP')).toMatchObject({ messageType: 'Request', messageId: 5, powerRole: 'sink', dataRole: 'ufp' });
  });
});

describe('frameHex', () => {
  it('writes the header and objects little-endian, like the bytes', () => {
    const hex = frameHex(0x31a1, [0x0001_912c]);
    expect(hex).toBe('a1312c910100');
    expect(Buffer.from(frameBytes(0x31a1, [0x0001_912c])).toString('hex')).toBe(hex);
  });
});

describe('packetDurationUs', () => {
  // USB PD R3.2 V1.1 §5.6/§5.8.1: 64-bit preamble, SOP 20 bits, header 20, CRC 40, EOP 5 at 300 kbit/s.
  it('is about 497 µs for a control message and 133 µs more per object', () => {
    expect(packetDurationUs(0)).toBe(497);
    expect(packetDurationUs(1) - packetDurationUs(0)).toBe(133);
    expect(HARD_RESET_DURATION_US).toBe(280);
  });
});

describe('extended messages', () => {
  // §6.2.1.2 Table 6.3: Chunked b15, Chunk Number b14..11, Request Chunk b10, Data Size b8..0.
  it('packs the extended header and pads the body to whole objects', () => {
    const header = packExtendedHeader(true, 1, false, 40);
    expect(header).toBe(0x8828);
    expect(unpackExtendedHeader(header)).toEqual({ chunked: true, chunkNumber: 1, requestChunk: false, dataSize: 40 });
    const objects = extendedObjects(header, [1, 2, 3]);
    expect(objects).toEqual([0x0201_8828, 0x0000_0003]);
    expect(extendedBytes(objects, 3)).toEqual([1, 2, 3]);
  });
  // An EPR_KeepAlive is Extended_Control (0x10) with a 2-byte block: one object (§6.5.14).
  it('packs an extended message header with the Extended bit', () => {
    const raw = packHeader('Extended_Control', 1, 3, SINK, '3.0');
    expect(decodeHeader(raw, 'SOP')).toMatchObject({ extended: true, messageType: 'Extended_Control', numDataObjects: 1, messageId: 3 });
  });
});
