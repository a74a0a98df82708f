import { describe, expect, it } from 'vitest';
import { messageDurationUs } from './wire-time.ts';

describe('messageDurationUs', () => {
  // USB PD R3.2 V1.1 §5.6: preamble 64 + SOP* 20 + 2 bytes × 10 + CRC 40 + EOP 5 = 149 bits;
  // at the nominal 300 kbps (§5.8.1, from memory) that is 496.7 µs.
  it('times a GoodCRC (header only)', () => {
    expect(messageDurationUs(2)).toBe(497);
  });
  // Source_Capabilities with 6 PDOs: 2 + 24 bytes → 64 + 20 + 260 + 40 + 5 = 389 bits → 1296.7 µs.
  it('times a six-PDO Source_Capabilities', () => {
    expect(messageDurationUs(26)).toBe(1297);
  });
  // Request: 6 bytes → 189 bits → 630 µs; at the slowest allowed 270 kbps (§5.8.1) 700 µs.
  it('scales with the bit rate', () => {
    expect(messageDurationUs(6)).toBe(630);
    expect(messageDurationUs(6, 270_000)).toBe(700);
  });
});
