/**
 * The Decoder's connection to workers/codec.worker.ts: one worker for the page's life, and hooks
 * that decode the current input (latest call wins) and a dropped VCD file.
 */
import { useEffect, useRef, useState } from 'react';
import { createEngineWorker, isCancelled, type EngineWorker } from '../../../lib/engine-worker.ts';
import type { DecodeOutcome, DecoderInput } from '../../../../shared/pd/index.ts';
import type { CodecApi, VcdOutcome } from '../../../../workers/codec.worker.ts';

let shared: EngineWorker<CodecApi> | null = null;

function codecWorker(): EngineWorker<CodecApi> {
  shared ??= createEngineWorker<CodecApi>(() => new Worker(new URL('../../../../workers/codec.worker.ts', import.meta.url), { type: 'module' }));
  return shared;
}

export type DecodeState = { status: 'idle' } | { status: 'pending' } | { status: 'done'; outcome: DecodeOutcome } | { status: 'failed'; message: string };

/** Decodes `input` in the worker whenever it changes; an empty text is `idle`. */
export function useDecoded(input: DecoderInput): DecodeState {
  const [state, setState] = useState<DecodeState>({ status: 'idle' });
  const generation = useRef(0);
  const { text, mode, sop, crc, caps } = input;
  useEffect(() => {
    const mine = ++generation.current;
    if (text.trim() === '') {
      setState({ status: 'idle' });
      return;
    }
    setState((previous) => (previous.status === 'done' ? previous : { status: 'pending' }));
    codecWorker()
      .run<DecodeOutcome>((api) => api.decodeInput({ text, mode, sop, crc, caps }) as Promise<DecodeOutcome>)
      .then(
        (outcome) => mine === generation.current && setState({ status: 'done', outcome }),
        (error: unknown) => {
          if (mine === generation.current && !isCancelled(error)) setState({ status: 'failed', message: error instanceof Error ? error.message : String(error) });
        },
      );
  }, [text, mode, sop, crc, caps]);
  return state;
}

export function decodeVcdFile(text: string): Promise<VcdOutcome> {
  return codecWorker().run<VcdOutcome>((api) => api.decodeVcdText(text) as Promise<VcdOutcome>);
}
