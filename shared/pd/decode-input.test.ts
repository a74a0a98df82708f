import { describe, expect, it } from 'vitest';
import { decodeInput } from './decode-input.ts';

// Source_Capabilities worked out by hand in header.test.ts and source-pdo.test.ts
// (USB PD R3.2 V1.1 Table 6.1 and the source PDO tables).
const CAPS = 'a1612c9101082cd102002cc103002cb10400454106003c21dcc0';
const base = { mode: 'bytes' as const, sop: 'SOP' as const, crc: false, caps: '' };

describe('decodeInput', () => {
  it('decodes pasted bytes', () => {
    const r = decodeInput({ ...base, text: CAPS });
    expect(r.ok && r.message.objects[0]).toMatchObject({ kind: 'fixed', voltageMv: 5000, maxCurrentMa: 3000 });
  });
  it('types a Request by the given offers', () => {
    const r = decodeInput({ ...base, mode: 'words', text: '0x1082 0x60038428', caps: CAPS });
    expect(r.ok && r.message.objects[0]).toMatchObject({ kind: 'rdo-pps', outputVoltageMv: 9000 });
  });
  it('says which stage failed, with the offset', () => {
    expect(decodeInput({ ...base, text: 'a1 6x' })).toMatchObject({ ok: false, stage: 'input', error: { code: 'input.hex', offset: 4 } });
    expect(decodeInput({ ...base, text: CAPS.slice(0, -2) })).toMatchObject({ ok: false, stage: 'decode', error: { code: 'decode.length', offset: 25 }, hex: CAPS.slice(0, -2) });
    expect(decodeInput({ ...base, text: '8100', caps: '8100' })).toMatchObject({ ok: false, stage: 'caps', error: { code: 'input.caps' } });
  });
});
