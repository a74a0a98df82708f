/**
 * Chunked extended messages between a port's policy engine and its protocol layer, as a pure
 * step (USB PD R3.2 V1.1 §6.2.1.2.1 Chunking, §8.3.3.1 chunked Rx/Tx state machines): a data
 * block goes as chunks of at most 26 bytes; after each chunk but the last the sender waits
 * tChunkSenderRequest for the receiver's chunk request (a message of the same type with Request
 * Chunk set and the next Chunk Number), which the receiver sends once it has the chunk, then waits
 * tChunkSenderResponse for that chunk. The policy engine sees the whole block.
 */
import type { TimerName } from '../core/timers.ts';
import { extendedBytes, extendedObjects, MAX_CHUNK_BYTES, packExtendedHeader, unpackExtendedHeader, type ExtendedType } from './wire.ts';

export interface ChunkState {
  tx: { type: ExtendedType; bytes: readonly number[]; sentChunk: number } | null;
  rx: { type: ExtendedType; bytes: number[]; dataSize: number; nextChunk: number } | null;
}

export const initialChunks: ChunkState = { tx: null, rx: null };

export type ChunkEvent =
  | { kind: 'send'; type: ExtendedType; bytes: readonly number[] }
  /** The protocol layer got the GoodCRC for a chunk or chunk request of this type. */
  | { kind: 'sent'; type: ExtendedType }
  | { kind: 'failed'; type: ExtendedType }
  | { kind: 'received'; type: ExtendedType; objects: readonly number[] }
  | { kind: 'timer'; name: TimerName };

export type ChunkEffect =
  | { kind: 'transmit'; type: ExtendedType; objects: readonly number[] }
  | { kind: 'deliver'; type: ExtendedType; bytes: readonly number[] }
  | { kind: 'sent'; type: ExtendedType }
  | { kind: 'failed'; type: ExtendedType }
  | { kind: 'start-timer'; name: TimerName }
  | { kind: 'stop-timer'; name: TimerName };

function chunkObjects(bytes: readonly number[], chunk: number): number[] {
  const part = bytes.slice(chunk * MAX_CHUNK_BYTES, (chunk + 1) * MAX_CHUNK_BYTES);
  return extendedObjects(packExtendedHeader(true, chunk, false, bytes.length), part);
}

const chunkCount = (size: number) => Math.max(1, Math.ceil(size / MAX_CHUNK_BYTES));

export function chunkStep(state: ChunkState, event: ChunkEvent): [ChunkState, ChunkEffect[]] {
  switch (event.kind) {
    case 'send':
      return [{ ...state, tx: { type: event.type, bytes: event.bytes, sentChunk: 0 } }, [{ kind: 'transmit', type: event.type, objects: chunkObjects(event.bytes, 0) }]];
    case 'sent': {
      const tx = state.tx;
      // The GoodCRC of our own chunk request, or of a chunk nobody is waiting on.
      if (!tx || tx.type !== event.type) return [state, []];
      if (tx.sentChunk + 1 >= chunkCount(tx.bytes.length)) return [{ ...state, tx: null }, [{ kind: 'sent', type: tx.type }]];
      return [state, [{ kind: 'start-timer', name: 'tChunkSenderRequest' }]];
    }
    case 'failed': {
      if (state.tx?.type === event.type)
        return [
          { ...state, tx: null },
          [
            { kind: 'stop-timer', name: 'tChunkSenderRequest' },
            { kind: 'failed', type: event.type },
          ],
        ];
      return [{ ...state, rx: null }, [{ kind: 'stop-timer', name: 'tChunkSenderResponse' }]];
    }
    case 'timer':
      if (event.name === 'tChunkSenderRequest' && state.tx) return [{ ...state, tx: null }, [{ kind: 'failed', type: state.tx.type }]];
      if (event.name === 'tChunkSenderResponse') return [{ ...state, rx: null }, []];
      return [state, []];
    case 'received': {
      const header = unpackExtendedHeader(event.objects[0] ?? 0);
      if (header.requestChunk) {
        const tx = state.tx;
        if (!tx || tx.type !== event.type || header.chunkNumber !== tx.sentChunk + 1) return [state, []];
        return [
          { ...state, tx: { ...tx, sentChunk: header.chunkNumber } },
          [
            { kind: 'stop-timer', name: 'tChunkSenderRequest' },
            { kind: 'transmit', type: tx.type, objects: chunkObjects(tx.bytes, header.chunkNumber) },
          ],
        ];
      }
      const take = Math.min(MAX_CHUNK_BYTES, header.dataSize - header.chunkNumber * MAX_CHUNK_BYTES);
      const part = extendedBytes(event.objects, Math.max(0, take));
      const effects: ChunkEffect[] = [];
      let rx = state.rx;
      if (header.chunkNumber === 0) rx = { type: event.type, bytes: [], dataSize: header.dataSize, nextChunk: 0 };
      else effects.push({ kind: 'stop-timer', name: 'tChunkSenderResponse' });
      if (!rx || rx.type !== event.type || rx.nextChunk !== header.chunkNumber) return [{ ...state, rx: null }, effects];
      const bytes = [...rx.bytes, ...part];
      if (bytes.length >= rx.dataSize || !header.chunked) {
        effects.push({ kind: 'deliver', type: event.type, bytes });
        return [{ ...state, rx: null }, effects];
      }
      const nextChunk = header.chunkNumber + 1;
      effects.push({ kind: 'transmit', type: event.type, objects: extendedObjects(packExtendedHeader(true, nextChunk, true, 0), [0, 0]) }, { kind: 'start-timer', name: 'tChunkSenderResponse' });
      return [{ ...state, rx: { ...rx, bytes, nextChunk } }, effects];
    }
  }
}
