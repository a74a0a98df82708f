import { describe, expect, it } from 'vitest';
import { sniffTrace } from './sniff.ts';

const bytes = (text: string) => new TextEncoder().encode(text);

describe('sniffTrace', () => {
  it('reads the format from the content (trace.md: JSON Lines open with "{", VCD with "$" keywords)', () => {
    expect(sniffTrace(bytes('{"trace": 1}\n{"t": 0, "event": "attach"}\n'), true)).toEqual({ ok: true, format: 'jsonl' });
    expect(sniffTrace(bytes('0.152000  SRC  a1 61 2c 91 01 00\n'), true)).toEqual({ ok: true, format: 'text' });
    expect(sniffTrace(bytes('$timescale 1ns $end\n$var wire 1 ! cc $end\n'), true)).toEqual({ ok: true, format: 'vcd' });
  });

  it('turns away empty, binary and non-trace text files with a sentence that says why', () => {
    const empty = sniffTrace(new Uint8Array(0), true);
    expect(empty.ok).toBe(false);
    const png = sniffTrace(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]), true);
    expect(png).toMatchObject({ ok: false, error: { code: 'trace.not-a-trace', message: expect.stringContaining('binary') } });
    const prose = sniffTrace(bytes('Dear support,\nmy laptop charges slowly.\n'), true);
    expect(prose).toMatchObject({ ok: false, error: { code: 'trace.not-a-trace', message: expect.stringContaining('line 1') } });
    const json = sniffTrace(bytes('{\n  "name": "not a trace"\n}\n'), true);
    expect(json).toMatchObject({ ok: false, error: { code: 'trace.not-a-trace', message: expect.stringContaining('JSON Lines') } });
  });

  it('ignores a line cut at the end of the kilobyte and accepts a head of comments only', () => {
    expect(sniffTrace(bytes('0.1 SRC 41 00\n0.2 SR'), false)).toEqual({ ok: true, format: 'text' });
    expect(sniffTrace(bytes('# console log\n# more comments\n'), true)).toEqual({ ok: true, format: 'text' });
  });
});
