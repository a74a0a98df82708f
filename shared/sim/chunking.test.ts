/** Chunked extended messages (USB PD R3.2 V1.1 §6.2.1.2.1: chunks of at most 26 bytes, a chunk request before each next chunk). */
import { describe, expect, it } from 'vitest';
import { chunkStep, initialChunks, type ChunkEffect } from './chunking.ts';
import { unpackExtendedHeader } from './wire.ts';

const block = Array.from({ length: 40 }, (_, i) => i + 1);

describe('chunkStep', () => {
  it('sends a 40-byte block as chunk 0 (26 bytes) and, when asked, chunk 1 (14 bytes); the receiver gets the whole block', () => {
    let [tx, out] = chunkStep(initialChunks, { kind: 'send', type: 'EPR_Source_Capabilities', bytes: block });
    const chunk0 = out[0] as Extract<ChunkEffect, { kind: 'transmit' }>;
    expect(unpackExtendedHeader(chunk0.objects[0]!)).toEqual({ chunked: true, chunkNumber: 0, requestChunk: false, dataSize: 40 });
    expect(chunk0.objects).toHaveLength(7); // (2 + 26) / 4
    [tx, out] = chunkStep(tx, { kind: 'sent', type: 'EPR_Source_Capabilities' });
    expect(out).toEqual([{ kind: 'start-timer', name: 'tChunkSenderRequest' }]);

    let [rx, back] = chunkStep(initialChunks, { kind: 'received', type: 'EPR_Source_Capabilities', objects: chunk0.objects });
    const request = back.find((e) => e.kind === 'transmit') as Extract<ChunkEffect, { kind: 'transmit' }>;
    expect(unpackExtendedHeader(request.objects[0]!)).toEqual({ chunked: true, chunkNumber: 1, requestChunk: true, dataSize: 0 });
    expect(back).toContainEqual({ kind: 'start-timer', name: 'tChunkSenderResponse' });

    [tx, out] = chunkStep(tx, { kind: 'received', type: 'EPR_Source_Capabilities', objects: request.objects });
    const chunk1 = out.find((e) => e.kind === 'transmit') as Extract<ChunkEffect, { kind: 'transmit' }>;
    expect(chunk1.objects).toHaveLength(4); // (2 + 14) / 4
    [rx, back] = chunkStep(rx, { kind: 'received', type: 'EPR_Source_Capabilities', objects: chunk1.objects });
    expect(back).toContainEqual({ kind: 'deliver', type: 'EPR_Source_Capabilities', bytes: block });
    expect(rx.rx).toBeNull();
    [tx, out] = chunkStep(tx, { kind: 'sent', type: 'EPR_Source_Capabilities' });
    expect(out).toEqual([{ kind: 'sent', type: 'EPR_Source_Capabilities' }]);
  });

  it('gives up when no chunk request comes within tChunkSenderRequest', () => {
    let [tx] = chunkStep(initialChunks, { kind: 'send', type: 'EPR_Source_Capabilities', bytes: block });
    [tx] = chunkStep(tx, { kind: 'sent', type: 'EPR_Source_Capabilities' });
    const [, out] = chunkStep(tx, { kind: 'timer', name: 'tChunkSenderRequest' });
    expect(out).toEqual([{ kind: 'failed', type: 'EPR_Source_Capabilities' }]);
  });
});
