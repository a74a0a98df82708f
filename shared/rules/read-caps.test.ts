import { describe, expect, it } from 'vitest';
import { readCapsHex, readPdoList } from './read-caps.ts';

// Header 0x61a1 (objects.md's example): Source_Capabilities (data type 1, USB PD R3.1 V1.8 Table 6-6),
// 6 objects, revision 3.0, source/dfp. 0x0001912c = fixed 5 V 3 A (Table 6-9: 100 × 50 mV, 300 × 10 mA).
const sixtyFiveHex = 'a161' + ['0001912c', '0002d12c', '0004b12c', '00064145', 'c0dc213c', 'c1a4213c'].map((w) => w.match(/../g)!.reverse().join('')).join('');

describe('readCapsHex', () => {
  it('reads a Source_Capabilities message', () => {
    const r = readCapsHex(sixtyFiveHex);
    expect(r).toMatchObject({ ok: true, epr: false });
    if (r.ok) {
      expect(r.pdos.map((p) => p.kind)).toEqual(['fixed', 'fixed', 'fixed', 'fixed', 'pps', 'pps']);
      expect(r.pdos[3]).toMatchObject({ voltageMv: 20_000, maxCurrentMa: 3_250 });
      expect(r.pdos[4]).toMatchObject({ minVoltageMv: 3_300, maxVoltageMv: 11_000, maxCurrentMa: 3_000 });
    }
  });
  // Header 0x0041: control message 1, GoodCRC (USB PD R3.1 V1.8 Table 6-5, from memory).
  it('refuses other messages and bad hex with a field: message error', () => {
    expect(readCapsHex('4100')).toMatchObject({ ok: false, error: { code: 'input.caps', message: expect.stringMatching(/^caps: the message is /) } });
    expect(readCapsHex('zz')).toMatchObject({ ok: false, error: { code: 'input.caps', message: expect.stringMatching(/^caps: /) } });
  });
});

describe('readPdoList', () => {
  it('reads hex words with or without 0x', () => {
    const r = readPdoList(['0x0001912c', '0002d12c']);
    expect(r.ok && r.pdos.map((p) => p.kind === 'fixed' && p.voltageMv)).toEqual([5_000, 9_000]);
  });
  it('refuses a word that is not 32-bit hex', () => {
    expect(readPdoList(['0x0001912c', 'nine'])).toMatchObject({ ok: false, error: { code: 'input.pdos', message: expect.stringContaining('pdos: item 2') } });
    expect(readPdoList([])).toMatchObject({ ok: false });
  });
});
