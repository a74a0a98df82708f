/**
 * The Decoder's input lives in the URL so that a decode can be shared by link:
 * `?in=<text>&mode=words&sop=SOP'&crc=1&caps=<hex>` (defaults left out).
 */
import type { Sop } from '../../../../shared/pd/index.ts';
import type { DecoderInput, InputMode } from '../../../../shared/pd/index.ts';

const SOPS: readonly Sop[] = ['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"];

export function inputFromSearch(params: URLSearchParams): DecoderInput {
  const sop = params.get('sop');
  const mode = params.get('mode');
  return {
    text: params.get('in') ?? '',
    mode: mode === 'words' ? 'words' : ('bytes' as InputMode),
    sop: SOPS.includes(sop as Sop) ? (sop as Sop) : 'SOP',
    crc: params.get('crc') === '1',
    caps: params.get('caps') ?? '',
  };
}

export function searchFromInput(input: DecoderInput): URLSearchParams {
  const params = new URLSearchParams();
  if (input.text) params.set('in', input.text);
  if (input.mode !== 'bytes') params.set('mode', input.mode);
  if (input.sop !== 'SOP') params.set('sop', input.sop);
  if (input.crc) params.set('crc', '1');
  if (input.caps) params.set('caps', input.caps);
  return params;
}
