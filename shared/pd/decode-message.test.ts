import CRC32 from 'crc-32';
import { describe, expect, it } from 'vitest';
import { decodeMessage } from './decode-message.ts';
import { encodeMessage } from './encode-message.ts';
import { parseHex, toHex } from './hex.ts';
import type { SourcePdo } from './types.ts';

const bytes = (hex: string) => {
  const r = parseHex(hex);
  if (!r.ok) throw new Error(r.error.message);
  return r.bytes;
};

// A 6-object Source_Capabilities; header 0x61a1 and every PDO worked out by hand (see header.test.ts
// and source-pdo.test.ts): 5 V 3 A (unconstrained), 9 V 3 A, 12 V 3 A, 15 V 3 A, 20 V 3.25 A, PPS 3.3–11 V 3 A.
const CAPS = 'a1612c9101082cd102002cc103002cb10400454106003c21dcc0';

describe('decodeMessage', () => {
  it('decodes a Source_Capabilities into its offers', () => {
    const r = decodeMessage(bytes(CAPS));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.message.header).toMatchObject({ messageType: 'Source_Capabilities', numDataObjects: 6 });
    expect(r.message.objects.map((o) => [o.kind, (o as { voltageMv?: number }).voltageMv ?? (o as { maxVoltageMv?: number }).maxVoltageMv])).toEqual([
      ['fixed', 5000],
      ['fixed', 9000],
      ['fixed', 12_000],
      ['fixed', 15_000],
      ['fixed', 20_000],
      ['pps', 11_000],
    ]);
    expect(r.message.objects[4]).toMatchObject({ maxCurrentMa: 3250 });
    expect(r.warnings).toEqual([]);
  });

  it('fails with decode.length and the offset where the bytes and the header part', () => {
    // Header 0x61a1 says 6 objects = 26 bytes (§6.2.1.1.2); 2 bytes short.
    expect(decodeMessage(bytes(CAPS.slice(0, -4)))).toMatchObject({ ok: false, error: { code: 'decode.length', offset: 24 } });
    expect(decodeMessage(bytes(CAPS + '00'))).toMatchObject({ ok: false, error: { code: 'decode.length', offset: 26 } });
    expect(decodeMessage(new Uint8Array([0xa1]))).toMatchObject({ ok: false, error: { code: 'decode.length', offset: 1 } });
  });

  it('a reserved type code gives Reserved and a decode.reserved-type warning (Table 6.5: 0x19–0x1F)', () => {
    const r = decodeMessage(bytes('9900'));
    expect(r.ok && r.message.header.messageType).toBe('Reserved');
    expect(r.ok && r.warnings.map((w) => [w.rule, w.severity])).toEqual([['decode.reserved-type', 'warning']]);
  });

  it('reserved bits set give decode.reserved-bits with the object position (Table 6.9 B22)', () => {
    const r = decodeMessage(bytes('a1112c914100'));
    expect(r.ok && r.warnings).toEqual([expect.objectContaining({ rule: 'decode.reserved-bits', severity: 'warning', object: 1 })]);
  });

  it("bit 5 of a cable plug's header is reserved (Table 6.1)", () => {
    const r = decodeMessage(bytes('a101'), { sop: "SOP'" });
    expect(r.ok && r.warnings.map((w) => w.rule)).toEqual(['decode.reserved-bits']);
  });

  it('checks the CRC-32 in the last 4 bytes, agreeing with the crc-32 package (§5.6.2)', () => {
    const body = bytes(CAPS);
    const crc = CRC32.buf(body) >>> 0;
    const withCrc = new Uint8Array([...body, crc & 0xff, (crc >>> 8) & 0xff, (crc >>> 16) & 0xff, crc >>> 24]);
    const good = decodeMessage(withCrc, { crc: true });
    expect(good.ok && good.message.crc).toEqual({ value: '0x' + crc.toString(16).padStart(8, '0'), ok: true });
    withCrc[3] = withCrc[3]! ^ 0x01;
    const bad = decodeMessage(withCrc, { crc: true });
    expect(bad.ok && bad.message.crc?.ok).toBe(false);
    expect(bad.ok && bad.warnings.map((w) => [w.rule, w.severity])).toEqual([['decode.crc', 'error']]);
  });

  it('types a Request by the referenced offer when caps are given, else warns', () => {
    const caps = decodeMessage(bytes(CAPS));
    if (!caps.ok) throw new Error('caps');
    // 0x1082 header (Request, 1 object, sink UFP, rev 3.x); RDO 0x6003_8428 → position 6 = the PPS offer.
    const typed = decodeMessage(bytes('82102884' + '0360'), { caps: caps.message.objects as SourcePdo[] });
    expect(typed.ok && typed.message.objects[0]).toMatchObject({ kind: 'rdo-pps', objectPosition: 6, outputVoltageMv: 9000, operatingCurrentMa: 2000 });
    expect(typed.ok && typed.warnings).toEqual([]);
    const untyped = decodeMessage(bytes('8210288403 60'));
    expect(untyped.ok && untyped.message.objects[0]?.kind).toBe('rdo');
    expect(untyped.ok && untyped.warnings).toEqual([expect.objectContaining({ rule: 'decode.rdo-unknown-type', severity: 'warning', object: 1 })]);
  });

  it('reads an EPR_Request RDO by the PDO copy it carries; positions 8–13 are only valid there (§6.4.9)', () => {
    const m = encodeMessage({
      header: { messageType: 'EPR_Request', messageId: 2, specRevision: '3.0', powerRole: 'sink', dataRole: 'ufp' },
      objects: [
        {
          kind: 'rdo-avs',
          objectPosition: 8,
          outputVoltageMv: 28_000,
          operatingCurrentMa: 5000,
          capabilityMismatch: false,
          usbCommunicationsCapable: false,
          noUsbSuspend: true,
          unchunkedExtendedMessages: false,
          eprModeCapable: true,
        },
        { kind: 'epr-avs', minVoltageMv: 15_000, maxVoltageMv: 48_000, pdpW: 240, peakCurrent: 0 },
      ],
    });
    expect(m.ok).toBe(true);
    if (!m.ok) return;
    const r = decodeMessage(m.bytes);
    expect(r.ok && r.message.objects[0]).toMatchObject({ kind: 'rdo-avs', objectPosition: 8, outputVoltageMv: 28_000 });
    expect(r.ok && r.warnings).toEqual([]);
    // The same position in a plain Request is reserved.
    const plain = decodeMessage(bytes('8210' + toHex(m.bytes.subarray(2, 6))));
    expect(plain.ok && plain.warnings.map((w) => w.rule)).toContain('decode.object-position');
  });

  it('decodes an extended chunk: Data Size is the whole block, the chunk holds at most 26 bytes (§6.2.1.2)', () => {
    // PPS_Status (extended 0x0c) chunk 0 of a 4-byte block: 2 objects = ext header + 4 data + 2 padding.
    // Block: 0x01a4 × 20 mV = 8400 mV; 0x32 × 50 mA = 2500 mA; flags 0x02 → PTF 01b.
    const r = decodeMessage(bytes('ac a1 04 80 a4 01 32 02 00 00'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.message.header).toMatchObject({ messageType: 'PPS_Status', extended: true, numDataObjects: 2 });
    expect(r.message.extendedHeader).toEqual({ raw: '0x8004', chunked: true, chunkNumber: 0, requestChunk: false, dataSize: 4 });
    expect(r.message.payload).toBe('a4013202');
    expect(r.message.data).toEqual({ outputVoltageMv: 8400, outputCurrentMa: 2500, ptf: 1, omf: false });
  });

  it('warns on reserved bit 9 of the extended header (Table 6.3)', () => {
    const r = decodeMessage(bytes('ac a1 04 82 a4 01 32 02 00 00'));
    expect(r.ok && r.warnings.map((w) => w.rule)).toEqual(['decode.reserved-bits']);
  });

  it('rejects a chunk whose object count does not fit its data', () => {
    expect(decodeMessage(bytes('ac b1 04 80 a4 01 32 02 00 00 00 00 00 00'))).toMatchObject({ ok: false, error: { code: 'decode.length' } });
  });

  it('never throws, even on odd inputs', () => {
    expect(decodeMessage(new Uint8Array(0))).toMatchObject({ ok: false });
    expect(decodeMessage(null as unknown as Uint8Array)).toMatchObject({ ok: false, error: { code: 'decode.length' } });
    expect(decodeMessage(bytes('0080'), { crc: true })).toMatchObject({ ok: false, error: { code: 'decode.length' } });
  });
});
