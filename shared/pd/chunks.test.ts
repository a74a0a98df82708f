import { describe, expect, it } from 'vitest';
import { createChunkAssembler, encodeChunks } from './chunks.ts';
import { decodeMessage } from './decode-message.ts';
import type { MessageInput } from './encode-message.ts';

const fixed = (voltageMv: number, maxCurrentMa: number) => ({
  kind: 'fixed' as const,
  voltageMv,
  maxCurrentMa,
  peakCurrent: 0,
  dualRolePower: false,
  usbSuspendSupported: false,
  unconstrainedPower: false,
  usbCommunicationsCapable: false,
  dualRoleData: false,
  unchunkedExtendedMessages: false,
  eprModeCapable: true,
});

// An EPR_Source_Capabilities (USB PD R3.2 V1.1 §6.5.15.1): SPR offers in positions 1–7 (unused ones
// zero), EPR offers from position 8. 10 objects = 40 bytes = chunks of 26 and 14 bytes (§6.2.1.2.1).
const EPR_CAPS: MessageInput = {
  header: { messageType: 'EPR_Source_Capabilities', messageId: 3, specRevision: '3.0', powerRole: 'source', dataRole: 'dfp' },
  objects: [
    fixed(5000, 3000),
    fixed(9000, 3000),
    fixed(15_000, 3000),
    fixed(20_000, 5000),
    { kind: 'raw', raw: '0x00000000' },
    { kind: 'raw', raw: '0x00000000' },
    { kind: 'raw', raw: '0x00000000' },
    fixed(28_000, 5000),
    fixed(36_000, 5000),
    { kind: 'epr-avs', minVoltageMv: 15_000, maxVoltageMv: 36_000, pdpW: 180, peakCurrent: 0 },
  ],
};

describe('encodeChunks + createChunkAssembler', () => {
  it('splits a 40-byte block into chunks of 26 and 14 bytes and puts it back together', () => {
    const split = encodeChunks(EPR_CAPS);
    expect(split.ok).toBe(true);
    if (!split.ok) return;
    expect(split.chunks.map((c) => c.length)).toEqual([2 + 4 * 7, 2 + 4 * 4]); // ceil((2+26)/4) = 7, ceil((2+14)/4) = 4
    const assembler = createChunkAssembler();
    const first = decodeMessage(split.chunks[0]!);
    const second = decodeMessage(split.chunks[1]!);
    if (!first.ok || !second.ok) throw new Error('chunk did not decode');
    expect(first.message.extendedHeader).toMatchObject({ chunked: true, chunkNumber: 0, dataSize: 40 });
    expect(first.message.objects).toEqual([]); // incomplete block: no objects yet
    expect(second.message.header.messageId).toBe(4);
    expect(assembler.push(first.message)).toEqual({ state: 'pending', nextChunk: 1 });
    const done = assembler.push(second.message);
    expect(done.state).toBe('complete');
    if (done.state !== 'complete') return;
    expect(done.message.objects).toHaveLength(10);
    expect(done.message.objects.slice(4, 7)).toEqual([
      { kind: 'raw', raw: '0x00000000' },
      { kind: 'raw', raw: '0x00000000' },
      { kind: 'raw', raw: '0x00000000' },
    ]);
    expect(done.message.objects[7]).toMatchObject({ kind: 'fixed', voltageMv: 28_000, maxCurrentMa: 5000 });
    expect(done.message.objects[9]).toMatchObject({ kind: 'epr-avs', maxVoltageMv: 36_000, pdpW: 180 });
    expect(done.message.payload).toHaveLength(80);
  });

  it('reports a chunk out of order', () => {
    const split = encodeChunks(EPR_CAPS);
    if (!split.ok) throw new Error('split');
    const second = decodeMessage(split.chunks[1]!);
    if (!second.ok) throw new Error('decode');
    expect(createChunkAssembler().push(second.message)).toMatchObject({ state: 'error', error: { code: 'decode.chunk' } });
  });

  it('passes non-chunked messages through', () => {
    const r = decodeMessage(Uint8Array.of(0x81, 0x00));
    if (!r.ok) throw new Error('decode');
    expect(createChunkAssembler().push(r.message).state).toBe('passthrough');
  });
});
