/**
 * Text as people paste it (bytes or words, SOP, CRC, optional Source_Capabilities) → the decoded
 * message, in one Result-like value that crosses a worker boundary intact (the Decoder page runs
 * it in workers/codec.worker.ts). `stage` says what a failure's offset counts.
 */
import type { Finding } from '../core/finding.ts';
import type { EngineError } from '../core/result.ts';
import { decodeMessage } from './decode-message.ts';
import { parseHex, parseWords, toHex } from './hex.ts';
import type { Message, Sop, SourcePdo } from './types.ts';

export type InputMode = 'bytes' | 'words';

export interface DecoderInput {
  text: string;
  mode: InputMode;
  sop: Sop;
  crc: boolean;
  /** Hex of the Source_Capabilities a Request refers to; empty for none. */
  caps: string;
}

export type DecodeOutcome =
  | { ok: true; message: Message; warnings: Finding[]; hex: string }
  /** `stage` says what the offset counts: characters of the text (`input`, `caps`) or bytes (`decode`). */
  | { ok: false; stage: 'input' | 'decode' | 'caps'; error: EngineError; hex?: string };

export function decodeInput(input: DecoderInput): DecodeOutcome {
  const parsed = input.mode === 'words' ? parseWords([input.text]) : parseHex(input.text);
  if (!parsed.ok) return { ok: false, stage: input.mode === 'words' ? 'decode' : 'input', error: parsed.error };
  let caps: SourcePdo[] | undefined;
  if (input.caps.trim() !== '') {
    const capsBytes = parseHex(input.caps);
    if (!capsBytes.ok) return { ok: false, stage: 'caps', error: capsBytes.error };
    const capsMessage = decodeMessage(capsBytes.bytes);
    if (!capsMessage.ok) return { ok: false, stage: 'caps', error: capsMessage.error };
    const type = capsMessage.message.header.messageType;
    if (type !== 'Source_Capabilities' && type !== 'EPR_Source_Capabilities') {
      return { ok: false, stage: 'caps', error: { code: 'input.caps', message: `the offers must be a Source_Capabilities message, not ${type}` } };
    }
    caps = capsMessage.message.objects as SourcePdo[];
  }
  const hex = toHex(parsed.bytes);
  const result = decodeMessage(parsed.bytes, { sop: input.sop, crc: input.crc, caps });
  if (!result.ok) return { ok: false, stage: 'decode', error: result.error, hex };
  return { ok: true, message: result.message, warnings: result.warnings, hex };
}
