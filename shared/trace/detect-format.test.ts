import { describe, expect, it } from 'vitest';
import { detectFormat } from './detect-format.ts';

describe('detectFormat', () => {
  // IEEE 1364-2005 §18.2.1: a VCD file starts with declaration commands such as $date or $timescale.
  it('recognises VCD by its declaration keywords', () => {
    expect(detectFormat('$date today $end\n$timescale 1ns $end')).toBe('vcd');
    expect(detectFormat('\n  $timescale 1 us $end')).toBe('vcd');
  });
  it('recognises JSON Lines by the opening brace, after a byte-order mark or blank lines', () => {
    expect(detectFormat('{"trace": 1}\n')).toBe('jsonl');
    expect(detectFormat('\ufeff\n\n{"t": 0, "note": "x"}')).toBe('jsonl');
  });
  it('reads everything else as plain text', () => {
    expect(detectFormat('# a firmware log\n0.152 SRC a1 61')).toBe('text');
    expect(detectFormat('')).toBe('text');
  });
});
