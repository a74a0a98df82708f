import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { messageArb } from './arbitraries.ts';
import { decodeMessage } from './decode-message.ts';
import { encodeMessage } from './encode-message.ts';
import type { SourcePdo } from './types.ts';

// Properties over every message type of USB PD R3.2 V1.1 Tables 6.5, 6.6 and 6.53 and every
// object kind: the writer and the reader agree (decode ∘ encode = identity on valid messages).
describe('codec round trip', () => {
  it('decodeMessage(encodeMessage(x)) equals x for every valid message', () => {
    fc.assert(
      fc.property(messageArb, fc.boolean(), ({ message, caps }, withCrc) => {
        const input = withCrc ? { ...message, crc: {} } : message;
        const encoded = encodeMessage(input);
        expect(encoded.ok, encoded.ok ? '' : encoded.error.message).toBe(true);
        if (!encoded.ok) return;
        const decoded = decodeMessage(encoded.bytes, { sop: message.sop, caps: caps as SourcePdo[] | undefined, crc: withCrc });
        expect(decoded.ok, decoded.ok ? '' : decoded.error.message).toBe(true);
        if (!decoded.ok) return;
        expect(decoded.message).toMatchObject(message);
        expect(decoded.warnings.filter((w) => w.severity === 'error')).toEqual([]);
        if (withCrc) expect(decoded.message.crc?.ok).toBe(true);
        // And back again: the decoded form (with raw fields) encodes to the same bytes.
        const again = encodeMessage(decoded.message);
        expect(again.ok && Array.from(again.bytes)).toEqual(Array.from(encoded.bytes));
      }),
      { numRuns: 3000 },
    );
  });

  it('decodes arbitrary bytes without throwing, returning a Result', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), fc.constantFrom('SOP' as const, "SOP'" as const), fc.boolean(), (bytes, sop, crc) => {
        const r = decodeMessage(bytes, { sop, crc });
        expect(typeof r.ok).toBe('boolean');
        if (!r.ok) expect(r.error.code).toMatch(/^decode\./);
      }),
      { numRuns: 5000 },
    );
  });

  it('decodes every well-formed 2 + 4n byte string and encodes it back to the same bytes', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 0x7fff }), fc.uint32Array({ maxLength: 7 }), (header, words) => {
        const h = (header & 0x8fff) | (words.length << 12);
        const bytes = new Uint8Array(2 + 4 * words.length);
        const view = new DataView(bytes.buffer);
        view.setUint16(0, h & 0x7fff, true);
        for (const [i, w] of words.entries()) view.setUint32(2 + 4 * i, w, true);
        const r = decodeMessage(bytes);
        expect(r.ok).toBe(true);
        if (!r.ok) return;
        const e = encodeMessage(r.message);
        expect(e.ok, e.ok ? '' : e.error.message).toBe(true);
        if (e.ok) expect(Array.from(e.bytes)).toEqual(Array.from(bytes));
      }),
      { numRuns: 3000 },
    );
  });
});
