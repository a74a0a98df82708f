import { describe, expect, it } from 'vitest';
import { parseHex } from '../pd/index.ts';
import { encodeWaveform } from '../wire/index.ts';
import type { TraceRecord } from './records.ts';
import { createVcdReader } from './vcd-reader.ts';

function bytes(hex: string): Uint8Array {
  const parsed = parseHex(hex);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return parsed.bytes;
}

describe('createVcdReader', () => {
  it('turns a waveform into message and reset records, chunk by chunk', () => {
    // A GoodCRC from the sink (header 0x0081, USB PD R3.2 V1.1 Table 6.1) on SOP', then a Hard Reset
    // ordered set (§5.6.4), BMC-coded by the wire writer.
    const { vcd } = encodeWaveform([{ sop: "SOP'", bytes: bytes('8100') }, { orderedSet: 'Hard_Reset' }]);
    const records: TraceRecord[] = [];
    const reader = createVcdReader({ push: (r) => records.push(r), malformed: () => undefined });
    for (let i = 0; i < vcd.length; i += 97) reader.push(vcd.slice(i, i + 97));
    expect(reader.end().ok).toBe(true);
    expect(records).toHaveLength(2);
    expect(records[0]).toMatchObject({ msg: '8100', sop: "SOP'", crcOk: true });
    expect(records[1]).toMatchObject({ event: 'hard_reset' });
    expect(records[1]!.t).toBeGreaterThan(records[0]!.t);
  });
});
