/**
 * The CC-line decoder: VCD text (streamed in chunks) → wire events (messages, Hard Reset, Cable
 * Reset). `push` returns the events completed by that chunk; `end` returns the rest, or the error
 * that stopped the reading. Errors are values: the first one stops the decoder.
 */
import type { Failure, Result } from '../core/result.ts';
import { createBurstSplitter, type BurstOptions } from './edge-bursts.ts';
import { decodeBurst } from './packet-decoder.ts';
import type { WireEvent } from './types.ts';
import { createVcdReader } from './vcd-reader.ts';

export interface VcdDecoderOptions extends BurstOptions {
  /** The signal to read (its name or dotted scope path); default the first 1-bit signal. */
  signal?: string;
}

export interface VcdDecoder {
  push(chunk: string): WireEvent[];
  end(): Result<{ events: WireEvent[] }>;
  /** The error that stopped the decoder, if any. */
  failure(): Failure | null;
}

export function createVcdDecoder(options: VcdDecoderOptions = {}): VcdDecoder {
  let pending: WireEvent[] = [];
  let failure: Failure | null = null;
  const bursts = createBurstSplitter(options, (edgesUs, line) => {
    const event = decodeBurst(edgesUs, line);
    if (event) pending.push(event);
  });
  const reader = createVcdReader({ signal: options.signal }, bursts.change);

  function take(): WireEvent[] {
    const out = pending;
    pending = [];
    return out;
  }

  return {
    push(chunk) {
      if (failure) return [];
      failure = reader.push(chunk);
      return failure ? [] : take();
    },
    end() {
      if (!failure) failure = reader.end();
      if (failure) return failure;
      bursts.end();
      return { ok: true, events: take() };
    },
    failure: () => failure,
  };
}

/** Decodes a whole VCD text at once. */
export function decodeVcd(text: string, options: VcdDecoderOptions = {}): Result<{ events: WireEvent[] }> {
  const decoder = createVcdDecoder(options);
  const first = decoder.push(text);
  const rest = decoder.end();
  return rest.ok ? { ok: true, events: [...first, ...rest.events] } : rest;
}
