import { describe, expect, it } from 'vitest';
import { mappedTextToJsonl, readMappedText, textMappingSchema, wireHexOf } from './mapped-text-reader.ts';

// A console log as a charger's firmware might print it (invented for this test).
const consoleLog = [
  '# boot 1.2.0',
  '[  0.150200] PD TX SRC 0x11A1 0x0001912C',
  '[  0.151300] PD RX SNK 0x0041',
  'some other line the firmware prints',
  '[  0.153900] PD RX SNK 0x1042 0x1001912C',
].join('\n');

const columns = textMappingSchema.parse({
  name: 'K-series console',
  mode: 'pattern',
  pattern: String.raw`^\[\s*(?<time>[\d.]+)\]\s+PD\s+\w+\s+(?<dir>SRC|SNK)\s+(?<data>.+)$`,
  timeUnit: 's',
  data: 'words',
  sourceWords: ['SRC'],
  sinkWords: ['SNK'],
  commentPrefix: '#',
});

describe('mapped text reader', () => {
  it('turns printed words into wire-order bytes (USB PD R3.2 V1.1 §6.2.1.1 Table 6.1: header 0x11A1 = Source_Capabilities, 1 object, source, DFP, rev 3.0)', () => {
    const hex = wireHexOf('0x11A1 0x0001912C', 'words');
    expect(hex).toEqual({ ok: true, hex: 'a1112c910100' });
    expect(wireHexOf('a1 11 2c 91 01 00', 'bytes')).toEqual({ ok: true, hex: 'a1112c910100' });
    expect(wireHexOf('0x11A1 0x10001912C', 'words').ok).toBe(false);
    expect(wireHexOf('zz', 'bytes').ok).toBe(false);
  });

  it('reads a console log through a pattern, skipping what is no message', () => {
    const read = readMappedText(consoleLog, columns);
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    expect(read.records).toEqual([
      { t: 150_200, msg: 'a1112c910100', from: 'source' },
      { t: 151_300, msg: '4100', from: 'sink' },
      { t: 153_900, msg: '42102c910110', from: 'sink' },
    ]);
    expect(read.skipped).toEqual([{ line: 4, reason: 'the pattern does not match' }]);
  });

  it('reads columns with a time unit, and names the mapping in the JSON Lines header', () => {
    const mapping = textMappingSchema.parse({
      name: 'csv',
      mode: 'columns',
      separator: ',',
      timeColumn: 1,
      directionColumn: 2,
      dataColumn: 3,
      timeUnit: 'ms',
      data: 'bytes',
      sourceWords: ['tx'],
      sinkWords: ['rx'],
    });
    const out = mappedTextToJsonl('150.2,TX,a1 11 2c 91 01 00\n151.3,RX,41 00\n', mapping, 'bench log');
    expect(out.ok && out.jsonl.split('\n')[0]).toBe('{"trace":1,"title":"bench log","importedWith":"csv"}');
    expect(out.ok && out.messages).toBe(2);
    expect(out.ok && JSON.parse(out.jsonl.split('\n')[1]!)).toEqual({ t: 150_200, msg: 'a1112c910100', from: 'source' });
  });

  it('refuses a mapping that cannot work, with the field', () => {
    const noGroups = textMappingSchema.safeParse({ name: 'x', mode: 'pattern', pattern: '^(\\d+) (\\w+) (.*)$', timeUnit: 's', data: 'bytes', sourceWords: ['a'], sinkWords: ['b'] });
    expect(noGroups.success).toBe(false);
    expect(noGroups.error?.issues[0]?.message).toContain('named groups (?<time>…), (?<dir>…), (?<data>…)');
    const noColumns = textMappingSchema.safeParse({ name: 'x', mode: 'columns', timeUnit: 's', data: 'bytes', sourceWords: ['a'], sinkWords: ['b'] });
    expect(noColumns.error?.issues.map((i) => i.path.join('.'))).toEqual(['timeColumn', 'directionColumn', 'dataColumn']);
    const read = readMappedText('hello\nworld\n', columns);
    expect(read.ok).toBe(false);
    expect(!read.ok && read.error.code).toBe('mapping.empty');
  });
});
