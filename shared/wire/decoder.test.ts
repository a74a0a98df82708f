import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Sop } from '../pd/types.ts';
import { bmcEncode } from './bmc.ts';
import { createVcdDecoder, decodeVcd } from './decoder.ts';
import { K_CODES } from './4b5b.ts';
import { packetBits } from './packet-bits.ts';
import type { WireEvent, WirePacket } from './types.ts';
import { encodeWaveform } from './vcd-writer.ts';
import type { VcdTimescale } from './vcd-timescale.ts';

const GOOD_CRC = Uint8Array.of(0x41, 0x00);
const SOURCE_CAPS = Uint8Array.of(0xa1, 0x11, 0x2c, 0x91, 0x01, 0x00); // one fixed PDO, 5 V 3 A

/** A VCD of raw edge times in µs at 1 ns, line low at the start (for waveforms the writer would not make). */
function vcdOfEdges(edgesUs: number[], startHigh = false): string {
  let high = startHigh;
  const lines = ['$timescale 1 ns $end', '$var wire 1 ! cc $end', '$enddefinitions $end', '#0', high ? '1!' : '0!'];
  for (const e of edgesUs) {
    high = !high;
    lines.push(`#${Math.round(e * 1000)}`, high ? '1!' : '0!');
  }
  lines.push(`#${Math.round(((edgesUs.at(-1) ?? 0) + 100) * 1000)}`);
  return lines.join('\n') + '\n';
}

function summary(events: WireEvent[]) {
  return events.map((e) => (e.kind === 'message' ? { kind: e.kind, sop: e.sop, bytes: [...e.bytes], crcOk: e.crcOk, eop: e.eop } : { kind: e.kind }));
}

const sopArb = fc.constantFrom<Sop>('SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug");
const packetArb: fc.Arbitrary<WirePacket> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ sop: sopArb, bytes: fc.uint8Array({ minLength: 2, maxLength: 30 }) }) },
  { weight: 1, arbitrary: fc.record({ orderedSet: fc.constantFrom('Hard_Reset' as const, 'Cable_Reset' as const) }) },
);
const timescaleArb = fc.constantFrom<VcdTimescale>('1 ps', '10 ps', '100 ps', '1 ns', '10 ns', '100 ns');

function expected(packets: WirePacket[]) {
  return packets.map((p) =>
    'orderedSet' in p ? { kind: p.orderedSet === 'Hard_Reset' ? 'hard_reset' : 'cable_reset' } : { kind: 'message', sop: p.sop, bytes: [...p.bytes], crcOk: true, eop: true },
  );
}

describe('VCD decoder', () => {
  it('recovers messages, resets, their times and the bit rate', () => {
    const { vcd, durationUs } = encodeWaveform([{ sop: 'SOP', bytes: SOURCE_CAPS }, { sop: "SOP'", bytes: GOOD_CRC }, { orderedSet: 'Hard_Reset' }], { gapUs: 500 });
    const result = decodeVcd(vcd);
    if (!result.ok) throw new Error(result.error.message);
    const [caps, goodCrc, reset] = result.events;
    // Preamble 64 + SOP 20 + 10 bytes × 10 + EOP 5 = 189 bits at 300 kbps = 630 µs (§5.6), then the
    // closing edge; this packet's closing edge leaves the line low, so the next starts 500 µs later.
    expect(packetBits({ sop: 'SOP', bytes: SOURCE_CAPS })).toHaveLength(189);
    expect(bmcEncode(packetBits({ sop: 'SOP', bytes: SOURCE_CAPS }), 500, 10 / 3).endUs).toBeCloseTo(1130, 6);
    expect(caps).toMatchObject({ t: 500, kind: 'message', sop: 'SOP', crcOk: true, crc: expect.any(Number) });
    expect(Math.abs(caps!.kind === 'message' ? caps!.bitrateBps - 300_000 : 0)).toBeLessThan(10); // 1 ns ticks round the edges
    expect(goodCrc).toMatchObject({ t: 1630, sop: "SOP'", crcOk: true });
    expect(reset).toMatchObject({ kind: 'hard_reset' });
    expect(durationUs).toBeGreaterThan(2_000);
  });

  it('is the identity after encoding, at random bit rates (270–330 kbps) and timescales', () => {
    // fBitRate 270–330 kbps: USB PD R3.2 V1.1 §5.8 BMC common parameters (from memory).
    fc.assert(
      fc.property(
        fc.array(packetArb, { minLength: 1, maxLength: 4 }),
        fc.integer({ min: 270_000, max: 330_000 }),
        timescaleArb,
        fc.integer({ min: 30, max: 2_000 }),
        (packets, bitrate, timescale, gapUs) => {
          const { vcd } = encodeWaveform(packets, { bitrate, timescale, gapUs });
          const result = decodeVcd(vcd);
          expect(result.ok).toBe(true);
          if (!result.ok) return;
          expect(summary(result.events)).toEqual(expected(packets));
          for (const e of result.events) if (e.kind !== 'unreadable') expect(Math.abs(e.bitrateBps - bitrate)).toBeLessThan(bitrate * 0.01);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('streams: any chunking gives the same events', () => {
    const packets: WirePacket[] = [{ sop: 'SOP', bytes: SOURCE_CAPS }, { orderedSet: 'Cable_Reset' }, { sop: "SOP''", bytes: GOOD_CRC }];
    const { vcd } = encodeWaveform(packets, { gapUs: 40 });
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5_000 }), (size) => {
        const decoder = createVcdDecoder();
        const events: WireEvent[] = [];
        for (let i = 0; i < vcd.length; i += size) events.push(...decoder.push(vcd.slice(i, i + size)));
        const end = decoder.end();
        expect(end.ok).toBe(true);
        if (end.ok) events.push(...end.events);
        expect(summary(events)).toEqual(expected(packets));
      }),
      { numRuns: 40 },
    );
  });

  it('ignores glitches shorter than a quarter UI', () => {
    const uiUs = 1_000_000 / 300_000;
    const { edgesUs } = bmcEncode(packetBits({ sop: 'SOP', bytes: SOURCE_CAPS }), 50, uiUs);
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 1, max: edgesUs.length - 2 }), fc.double({ min: 0.05, max: 0.75, noNaN: true })), { minLength: 1, maxLength: 6 }), (glitches) => {
        const withGlitches = [...edgesUs];
        for (const [at, lengthUs] of glitches) {
          // A pulse in the middle of an interval: two extra edges `lengthUs` apart.
          const from = edgesUs[at]!;
          const to = edgesUs[at + 1]!;
          const mid = (from + to) / 2;
          withGlitches.push(mid - lengthUs / 2, mid + lengthUs / 2);
        }
        withGlitches.sort((a, b) => a - b);
        const result = decodeVcd(vcdOfEdges(withGlitches));
        if (!result.ok) throw new Error(result.error.message);
        expect(summary(result.events)).toEqual(expected([{ sop: 'SOP', bytes: SOURCE_CAPS }]));
      }),
      { numRuns: 60 },
    );
  });

  it('keeps a message whose CRC is wrong, with crcOk false', () => {
    const bits = packetBits({ sop: 'SOP', bytes: GOOD_CRC });
    // Swap the first CRC symbol for a different data symbol (nibble 0 → 11110 stays valid 4b5b).
    const crcAt = 64 + 20 + 20;
    const flipped = [...bits];
    for (let i = 0; i < 5; i++) flipped[crcAt + i] = (0b11110 >> i) & 1;
    const result = decodeVcd(vcdOfEdges(bmcEncode(flipped, 10, 10 / 3).edgesUs));
    if (!result.ok) throw new Error(result.error.message);
    expect(result.events).toHaveLength(1);
    expect(result.events[0]).toMatchObject({ kind: 'message', sop: 'SOP', crcOk: false, eop: true });
  });

  it('accepts an SOP with one corrupted K-code and marks it', () => {
    // USB PD R3.2 V1.1 §5.4: three of the four K-codes suffice.
    const bits = packetBits({ sop: "SOP'", bytes: GOOD_CRC });
    for (let i = 0; i < 5; i++) bits[64 + 10 + i] = 0; // third K-code → 00000
    const result = decodeVcd(vcdOfEdges(bmcEncode(bits, 10, 10 / 3).edgesUs));
    if (!result.ok) throw new Error(result.error.message);
    expect(result.events[0]).toMatchObject({ sop: "SOP'", crcOk: true, sopCorrected: true });
  });

  it('survives the loss of the first edge (line idling at the first preamble level)', () => {
    // USB PD R3.2 V1.1 §5.8.1: the receiver tolerates the loss of the preamble's first edge.
    const { edgesUs } = bmcEncode(packetBits({ sop: 'SOP', bytes: GOOD_CRC }), 100, 10 / 3);
    const result = decodeVcd(vcdOfEdges(edgesUs.slice(1), true));
    if (!result.ok) throw new Error(result.error.message);
    expect(result.events).toHaveLength(1);
    expect(result.events[0]).toMatchObject({ t: 100, sop: 'SOP', crcOk: true });
  });

  it('reports a message that ends without EOP', () => {
    const bits = packetBits({ sop: 'SOP', bytes: GOOD_CRC }).slice(0, -5);
    const result = decodeVcd(vcdOfEdges(bmcEncode(bits, 10, 10 / 3).edgesUs));
    if (!result.ok) throw new Error(result.error.message);
    expect(result.events[0]).toMatchObject({ crcOk: true, eop: false });
    expect(K_CODES.EOP).toBe(0b01101);
  });

  it('never throws on VCD-like noise', () => {
    const token = fc.oneof(
      fc.constantFrom('$var', '$end', '$timescale', '$enddefinitions', '$scope', '$upscope', 'wire', '1', '!', 'cc', '#', '1 ns', '0!', '1!', 'x!', 'b1', 'r2.5', '$dumpvars', '\n', ' '),
      fc.string({ maxLength: 6 }),
      fc.integer({ min: 0, max: 1e9 }).map((n) => `#${n}`),
    );
    fc.assert(
      fc.property(fc.array(token, { maxLength: 80 }), fc.integer({ min: 1, max: 50 }), (tokens, size) => {
        const text = tokens.join(' ');
        const decoder = createVcdDecoder();
        for (let i = 0; i < text.length; i += size) decoder.push(text.slice(i, i + size));
        const end = decoder.end();
        expect(typeof end.ok).toBe('boolean');
      }),
      { numRuns: 300 },
    );
    // Random edges on a valid header: no throw, only events or nothing.
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 5_000 }), { maxLength: 400 }), (gapsNs) => {
        let t = 0;
        const edges = gapsNs.map((g) => (t += g / 1000));
        expect(decodeVcd(vcdOfEdges(edges)).ok).toBe(true);
      }),
      { numRuns: 200 },
    );
  });
});
