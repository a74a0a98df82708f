import { describe, expect, it } from 'vitest';
import { decodeExtendedHeader, decodeHeader, encodeExtendedHeader, encodeHeader } from './header.ts';
import { messageTypeCode } from './message-types.ts';

// Every example below was worked out by hand from the bit layout of USB PD R3.2 V1.1 §6.2.1.1,
// Table 6.1 "Message Header" (bit 15 Extended, 14..12 Number of Data Objects, 11..9 MessageID,
// 8 Port Power Role / Cable Plug, 7..6 Specification Revision, 5 Port Data Role, 4..0 Message Type).
describe('decodeHeader', () => {
  it('0x61a1 is a Source_Capabilities with 6 objects from a source DFP, revision 3.x', () => {
    // 0x61a1 = 0110 0001 1010 0001b: NDO 110b = 6, ID 000b, bit 8 = 1 (source), rev 10b, bit 5 = 1 (DFP), type 00001b.
    expect(decodeHeader(0x61a1, 'SOP')).toEqual({
      raw: '0x61a1',
      messageType: 'Source_Capabilities',
      category: 'data',
      numDataObjects: 6,
      messageId: 0,
      specRevision: '3.0',
      powerRole: 'source',
      dataRole: 'dfp',
      extended: false,
    });
  });
  it('0x1282 is a Request (1 object, MessageID 1) from a sink UFP', () => {
    // 0001 0010 1000 0010b: NDO 1, ID 001b, bit 8 = 0 (sink), rev 10b, bit 5 = 0 (UFP), type 00010b = Request.
    expect(decodeHeader(0x1282, 'SOP')).toMatchObject({ messageType: 'Request', numDataObjects: 1, messageId: 1, powerRole: 'sink', dataRole: 'ufp' });
  });
  it('0x0081 with no objects is the control message GoodCRC (type 00001b in Table 6.5)', () => {
    expect(decodeHeader(0x0081, 'SOP')).toMatchObject({ messageType: 'GoodCRC', category: 'control', specRevision: '3.0' });
  });
  it('revision codes 00b/01b/10b/11b are 1.0, 2.0, 3.x ("3.0"), reserved (Table 6.1)', () => {
    expect([0x00, 0x40, 0x80, 0xc0].map((r) => decodeHeader(0x0003 | r, 'SOP').specRevision)).toEqual(['1.0', '2.0', '3.0', 'reserved']);
  });
  it("on SOP' bit 8 is Cable Plug and there is no data role (Table 6.1)", () => {
    const h = decodeHeader(0x118f, "SOP'");
    expect(h).toMatchObject({ messageType: 'Vendor_Defined', cablePlug: true });
    expect(h).not.toHaveProperty('dataRole');
    expect(h).not.toHaveProperty('powerRole');
  });
  it('an extended header bit selects the extended table (Table 6.53: 0x11 EPR_Source_Capabilities)', () => {
    expect(decodeHeader(0x8000 | (7 << 12) | 0x80 | 0x100 | 0x11, 'SOP')).toMatchObject({ messageType: 'EPR_Source_Capabilities', category: 'extended', extended: true });
  });
  it('reserved codes give Reserved', () => {
    expect(decodeHeader(0x0080 | 0x19, 'SOP').messageType).toBe('Reserved'); // control 0x19–0x1F reserved
    expect(decodeHeader(0x1080 | 0x0d, 'SOP').messageType).toBe('Reserved'); // data 0x0D–0x0E reserved
    expect(decodeHeader(0x8080 | 0x13, 'SOP').messageType).toBe('Reserved'); // extended 0x13–0x1D reserved
  });
});

describe('encodeHeader', () => {
  it('inverts decodeHeader', () => {
    for (const raw of [0x61a1, 0x1282, 0x0081, 0x9191]) expect(encodeHeader(decodeHeader(raw, 'SOP'))).toBe(raw);
    expect(encodeHeader(decodeHeader(0x118f, "SOP'"))).toBe(0x118f);
  });
  it('throws a RangeError naming the field', () => {
    expect(() => encodeHeader({ messageType: 'Accept', numDataObjects: 0, messageId: 8, specRevision: '3.0' })).toThrow(/messageId/);
    expect(() => encodeHeader({ messageType: 'Hello', numDataObjects: 0, messageId: 0, specRevision: '3.0' })).toThrow(/messageType/);
  });
});

describe('message type codes', () => {
  // USB PD R3.2 V1.1 Table 6.5 (control), 6.6 (data), 6.53 (extended); R3.1 V1.8 numbering, from memory for R3.2.
  it.each([
    ['GoodCRC', 'control', 0x01],
    ['GotoMin', 'control', 0x02],
    ['Accept', 'control', 0x03],
    ['Reject', 'control', 0x04],
    ['Ping', 'control', 0x05],
    ['PS_RDY', 'control', 0x06],
    ['Get_Source_Cap', 'control', 0x07],
    ['Get_Sink_Cap', 'control', 0x08],
    ['DR_Swap', 'control', 0x09],
    ['PR_Swap', 'control', 0x0a],
    ['VCONN_Swap', 'control', 0x0b],
    ['Wait', 'control', 0x0c],
    ['Soft_Reset', 'control', 0x0d],
    ['Data_Reset', 'control', 0x0e],
    ['Data_Reset_Complete', 'control', 0x0f],
    ['Not_Supported', 'control', 0x10],
    ['Get_Source_Cap_Extended', 'control', 0x11],
    ['Get_Status', 'control', 0x12],
    ['FR_Swap', 'control', 0x13],
    ['Get_PPS_Status', 'control', 0x14],
    ['Get_Country_Codes', 'control', 0x15],
    ['Get_Sink_Cap_Extended', 'control', 0x16],
    ['Get_Source_Info', 'control', 0x17],
    ['Get_Revision', 'control', 0x18],
    ['Source_Capabilities', 'data', 0x01],
    ['Request', 'data', 0x02],
    ['BIST', 'data', 0x03],
    ['Sink_Capabilities', 'data', 0x04],
    ['Battery_Status', 'data', 0x05],
    ['Alert', 'data', 0x06],
    ['Get_Country_Info', 'data', 0x07],
    ['Enter_USB', 'data', 0x08],
    ['EPR_Request', 'data', 0x09],
    ['EPR_Mode', 'data', 0x0a],
    ['Source_Info', 'data', 0x0b],
    ['Revision', 'data', 0x0c],
    ['Vendor_Defined', 'data', 0x0f],
    ['Source_Capabilities_Extended', 'extended', 0x01],
    ['Status', 'extended', 0x02],
    ['Get_Battery_Cap', 'extended', 0x03],
    ['Get_Battery_Status', 'extended', 0x04],
    ['Battery_Capabilities', 'extended', 0x05],
    ['Get_Manufacturer_Info', 'extended', 0x06],
    ['Manufacturer_Info', 'extended', 0x07],
    ['Security_Request', 'extended', 0x08],
    ['Security_Response', 'extended', 0x09],
    ['Firmware_Update_Request', 'extended', 0x0a],
    ['Firmware_Update_Response', 'extended', 0x0b],
    ['PPS_Status', 'extended', 0x0c],
    ['Country_Info', 'extended', 0x0d],
    ['Country_Codes', 'extended', 0x0e],
    ['Sink_Capabilities_Extended', 'extended', 0x0f],
    ['Extended_Control', 'extended', 0x10],
    ['EPR_Source_Capabilities', 'extended', 0x11],
    ['EPR_Sink_Capabilities', 'extended', 0x12],
    ['Vendor_Defined_Extended', 'extended', 0x1e],
  ])('%s is %s 0x%s', (name, category, code) => {
    expect(messageTypeCode(name)).toEqual({ category, code });
  });
});

describe('extended header', () => {
  // USB PD R3.2 V1.1 §6.2.1.2, Table 6.3: bit 15 Chunked, 14..11 Chunk Number, 10 Request Chunk, 9 Reserved, 8..0 Data Size.
  it('0x8028 is chunk 0 of a chunked 40-byte block', () => {
    expect(decodeExtendedHeader(0x8028)).toEqual({ raw: '0x8028', chunked: true, chunkNumber: 0, requestChunk: false, dataSize: 40 });
  });
  it('0x8c00 is a request for chunk 1 (Request Chunk, Data Size 0)', () => {
    // 1000 1100 0000 0000b: chunked, chunk number 0001b, request chunk 1.
    expect(decodeExtendedHeader(0x8c00)).toMatchObject({ chunked: true, chunkNumber: 1, requestChunk: true, dataSize: 0 });
  });
  it('encodes back, keeping reserved bit 9 from raw', () => {
    expect(encodeExtendedHeader(decodeExtendedHeader(0x8c00))).toBe(0x8c00);
    expect(encodeExtendedHeader(decodeExtendedHeader(0x8228))).toBe(0x8228);
    expect(() => encodeExtendedHeader({ chunked: true, chunkNumber: 16, requestChunk: false, dataSize: 0 })).toThrow(/chunkNumber/);
  });
});
