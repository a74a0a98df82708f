import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createTextReader, readAnyLine, readTextLine } from './text-reader.ts';

// The plain-text format of docs/trace.md ("Plain text").
describe('readTextLine', () => {
  it('reads the examples of trace.md', () => {
    expect(readTextLine('0.152000  SRC  a1 61 2c 91 01 00 2c d1 02 00')).toEqual({ t: 152_000, msg: 'a1612c9101002cd10200', from: 'source' });
    // Words: a 16-bit header as a number, sent low byte first (USB PD R3.2 V1.1 §6.2.1).
    expect(readTextLine('152.9ms   SNK  0x0041')).toEqual({ t: 152_900, msg: '4100', from: 'sink' });
    expect(readTextLine('181ms     VBUS 5030mV 410mA')).toEqual({ t: 181_000, vbus: { mv: 5_030, ma: 410 } });
    expect(readTextLine('0.9s      SNK  HARD_RESET')).toEqual({ t: 900_000, event: 'hard_reset', from: 'sink' });
  });
  it('reads words with objects, units, names in any case and an SOP* token', () => {
    expect(readTextLine('1500us source 0x61A1 0x0001912C')).toEqual({ t: 1_500, msg: 'a1612c910100', from: 'source' });
    expect(readTextLine("2 cbl SOP' 41 00")).toEqual({ t: 2_000_000, msg: '4100', from: 'cable', sop: "SOP'" });
    expect(readTextLine('3 Host 5.03V 0.41A')).toBe('who: "Host" is none of SRC, SNK, CBL, VBUS');
    expect(readTextLine('3 VBUS 5.03V 0.41A')).toEqual({ t: 3_000_000, vbus: { mv: 5_030, ma: 410 } });
    expect(readTextLine('4 SRC a1612c9101002cd10200')).toEqual({ t: 4_000_000, msg: 'a1612c9101002cd10200', from: 'source' });
    expect(readTextLine('5 SNK attach')).toEqual({ t: 5_000_000, event: 'attach', from: 'sink' });
  });
  it('skips comments and blank lines', () => {
    expect(readTextLine('# captured on bench 2')).toBeUndefined();
    expect(readTextLine('   ')).toBeUndefined();
    expect(readTextLine('0.1 SRC a1 01 # GoodCRC')).toEqual({ t: 100_000, msg: 'a101', from: 'source' });
  });
  it('says what is wrong with a line', () => {
    expect(readTextLine('soon SRC a1 01')).toMatch(/^time:/);
    expect(readTextLine('0.1')).toMatch(/^who:/);
    expect(readTextLine('0.1 HOST a1 01')).toMatch(/^who:/);
    expect(readTextLine('0.1 SRC')).toMatch(/^payload:/);
    expect(readTextLine('0.1 SRC 0x12345 0xzz')).toMatch(/^payload:/);
    expect(readTextLine('0.1 VBUS 5 volts')).toMatch(/^vbus:/);
    expect(readTextLine('0.1 VBUS 410mA')).toMatch(/^vbus:/);
  });
});

// The one-pass reader of the common shapes must read every line exactly as the token reader does.
describe('readTextLine fast path', () => {
  const piece = fc.constantFrom(
    '0.152000',
    '152.9ms',
    '1500us',
    '3',
    '.5',
    '1.',
    '2S',
    '4Ms',
    '7uS',
    '1e5',
    'soon',
    '1m',
    '0.1s',
    '23.004140',
    '1.0000005',
    '0.0000015s',
    '2.5005ms',
    '0.5us',
    'SRC',
    'snk',
    'Cbl',
    'VBUS',
    'vbus',
    'VbUs',
    'sRc',
    'SRCX',
    'Host',
    "SOP'",
    'HARD_RESET',
    'a1',
    '61',
    '2C',
    'fF',
    '0x41',
    '00',
    'zz',
    'a',
    'abc',
    'a1612c9101002cd10200',
    '0x0041',
    '5030mV',
    '410mA',
    '5.03V',
    '0.41A',
    '5.V',
    '.5V',
    '12mv',
    '3MA',
    '#',
    '# note',
  );
  const sep = fc.constantFrom(' ', '  ', '\t', ' \t ');
  const line = fc.tuple(fc.array(fc.tuple(piece, sep), { maxLength: 8 }), fc.constantFrom('', ' ', '\r')).map(
    ([parts, end]) =>
      parts
        .map(([p, s]) => p + s)
        .join('')
        .trimEnd() + end,
  );
  it('agrees with the token reader on generated lines', () => {
    fc.assert(
      fc.property(line, (l) => {
        expect(readTextLine(l)).toEqual(readAnyLine(l));
      }),
      { numRuns: 3_000, seed: 11 },
    );
  });
  it('reads a stream, lines where they stand in chunks cut anywhere, as it reads each line alone', () => {
    const log = fc.tuple(fc.array(line, { minLength: 1, maxLength: 12 }), fc.constantFrom('\n', '\r\n'), fc.array(fc.nat(), { maxLength: 6 }));
    fc.assert(
      fc.property(log, ([lines, newline, cuts]) => {
        const text = lines.map((l) => l.replace(/\r$/, '')).join(newline);
        const expected: unknown[] = [];
        text.split(newline).forEach((l, index) => {
          const read = readTextLine(l);
          if (read !== undefined) expected.push(typeof read === 'string' ? { line: index + 1, reason: read } : { line: index + 1, record: read });
        });
        const got: unknown[] = [];
        const reader = createTextReader({ push: (record, lineNo) => got.push({ line: lineNo, record }), malformed: (lineNo, reason) => got.push({ line: lineNo, reason }) });
        const at = [...new Set(cuts.map((c) => c % (text.length + 1)))].sort((a, b) => a - b);
        let from = 0;
        for (const cut of [...at, text.length]) {
          reader.push(text.slice(from, cut));
          from = cut;
        }
        reader.end();
        expect(got).toEqual(expected);
      }),
      { numRuns: 1_000, seed: 17 },
    );
  });
  it('agrees on the common shapes', () => {
    for (const l of [
      '0.152000 SRC a1 61 2c 91',
      '23.004140 SNK 82 10 28 84 03 51',
      '1.05 VBUS 8380mV 2100mA',
      '1 vbus 5.03V',
      '2 SNK A1 FF',
      '3 Src a1 61 ',
      '4 SNK a1\t61',
      '5 cbl a1  61',
      '6 SRC a1 6',
    ])
      expect(readTextLine(l)).toEqual(readAnyLine(l));
  });
});
