import { describe, expect, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { Readable } from 'node:stream';
import { crc32, gunzipSync } from 'node:zlib';
import { crc32Combine, deflateJson, gzipEnvelope, inflateStoredFile, parseStoredFile, storedFileBytes } from './deflated-json.ts';

describe('stored JSON sent as stored', () => {
  it('combines CRC-32s as zlib does: crc(A‖B) from crc(A), crc(B) and the length of B', () => {
    for (const [a, b] of [
      [0, 1],
      [1, 0],
      [5, 7],
      [1000, 4096],
      [65_537, 3],
    ] as [number, number][]) {
      const first = randomBytes(a);
      const second = randomBytes(b);
      expect(crc32Combine(crc32(first), crc32(second), second.length)).toBe(crc32(Buffer.concat([first, second])));
    }
    // The CRC-32 check value of "123456789" (the catalogue value of CRC-32/ISO-HDLC): 0xCBF43926.
    expect(crc32Combine(crc32('1234'), crc32('56789'), 5)).toBe(0xcbf43926);
  });

  it('wraps a stored body in one gzip member that any gunzip reads as prefix + JSON + suffix', async () => {
    const json = JSON.stringify({ findings: Array.from({ length: 2_000 }, (_, i) => ({ rule: 'timing.x', t: i * 17, text: 'Prüfung é' })) });
    const stored = deflateJson(json);
    const file = storedFileBytes(stored);
    expect(file.length).toBeLessThan(json.length / 5);
    const parts = gzipEnvelope('{"trace":{"id":7},"analysis":', stored, parseStoredFile(file).body, '}');
    const member = Buffer.concat(parts.map((p) => (Buffer.isBuffer(p) ? p : Buffer.alloc(0))));
    expect(JSON.parse(gunzipSync(member).toString('utf8'))).toEqual({ trace: { id: 7 }, analysis: JSON.parse(json) });
    expect(await inflateStoredFile(file)).toBe(json);
    expect(parts.some((p) => p instanceof Readable)).toBe(false);
  });
});
