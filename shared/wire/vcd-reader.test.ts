import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createVcdReader, type VcdValue } from './vcd-reader.ts';
import { parseTimescaleUs } from './vcd-timescale.ts';

function read(text: string, options: { signal?: string } = {}, chunkChars = text.length || 1) {
  const changes: [number, VcdValue][] = [];
  const reader = createVcdReader(options, (tUs, v) => changes.push([tUs, v]));
  for (let i = 0; i < text.length; i += chunkChars) {
    const error = reader.push(text.slice(i, i + chunkChars));
    if (error) return { error, changes };
  }
  return { error: reader.end(), changes };
}

// IEEE 1364-2005 §18.2: header keywords, `$var type size id ref $end`, `#time`, scalar changes `0!`.
const TWO_SIGNALS = `$date today $end
$version a logic analyser $end
$timescale 10 ns $end
$scope module top $end
$var wire 8 # bus [7:0] $end
$var wire 1 ! clk $end
$scope module pd $end
$var wire 1 " cc $end
$upscope $end
$upscope $end
$enddefinitions $end
#0
$dumpvars
b00000000 #
0!
1"
$end
#15
1!
b1010 #
#20
0"
x!
#300
1"
`;

describe('VCD reader', () => {
  it('takes the first 1-bit wire by default, at the declared timescale', () => {
    const { error, changes } = read(TWO_SIGNALS);
    expect(error).toBeNull();
    expect(changes).toEqual([
      [0, '0'],
      [0.15, '1'],
      [0.2, 'x'],
    ]);
  });

  it('takes a signal by name or dotted path', () => {
    expect(read(TWO_SIGNALS, { signal: 'cc' }).changes).toEqual([
      [0, '1'],
      [0.2, '0'],
      [3, '1'],
    ]);
    expect(read(TWO_SIGNALS, { signal: 'top.pd.cc' }).changes).toHaveLength(3);
  });

  it('gives the same changes however the text is cut into chunks', () => {
    const whole = read(TWO_SIGNALS, { signal: 'cc' }).changes;
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), (size) => {
        expect(read(TWO_SIGNALS, { signal: 'cc' }, size).changes).toEqual(whole);
      }),
    );
  });

  it('parses every timescale from 1 fs to 100 s', () => {
    // IEEE 1364-2005 §18.2.3.7: 1, 10 or 100 of s, ms, us, ns, ps, fs.
    expect(parseTimescaleUs('1 ns')).toBe(0.001);
    expect(parseTimescaleUs('10ns')).toBeCloseTo(0.01, 12);
    expect(parseTimescaleUs('100 ps')).toBeCloseTo(0.0001, 12);
    expect(parseTimescaleUs('1 s')).toBe(1_000_000);
    expect(parseTimescaleUs('1 us')).toBe(1);
    expect(parseTimescaleUs('3 ns')).toBeNull();
  });

  it('reports a file that is not a VCD, with its line', () => {
    expect(read('{"t": 0, "msg": "4100"}\n').error).toEqual({ ok: false, error: expect.objectContaining({ code: 'vcd.format', line: 1 }) });
    expect(read('').error?.error.code).toBe('vcd.empty');
    expect(read('$timescale 1 ns $end\n$var wire 1 ! cc $end\n').error?.error.code).toBe('vcd.format');
    expect(read('$timescale 7 ns $end\n').error?.error).toMatchObject({ code: 'vcd.timescale', line: 1 });
  });

  it('reports a missing or too wide signal', () => {
    expect(read(TWO_SIGNALS, { signal: 'vbus' }).error?.error).toMatchObject({ code: 'vcd.signal', line: 11 });
    expect(read(TWO_SIGNALS, { signal: 'bus' }).error?.error.message).toContain('8 bits wide');
  });

  it('reports a bad line in the value changes, and time running backwards', () => {
    expect(read(TWO_SIGNALS + 'hello\n').error?.error).toMatchObject({ code: 'vcd.syntax', line: 26 });
    expect(read(TWO_SIGNALS + '#10\n').error?.error).toMatchObject({ code: 'vcd.time', line: 26 });
  });
});
