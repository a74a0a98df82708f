import { describe, expect, it } from 'vitest';
import { inputFromSearch, searchFromInput } from './search-params.ts';

describe('decoder search params', () => {
  it('round-trips an input through the URL, leaving defaults out', () => {
    const input = { text: '0x1082 0x1304b12c', mode: 'words' as const, sop: "SOP'" as const, crc: true, caps: 'a1612c91' };
    const search = searchFromInput(input);
    expect(search.toString()).toBe('in=0x1082+0x1304b12c&mode=words&sop=SOP%27&crc=1&caps=a1612c91');
    expect(inputFromSearch(new URLSearchParams(search.toString()))).toEqual(input);
    expect(searchFromInput({ text: '', mode: 'bytes', sop: 'SOP', crc: false, caps: '' }).toString()).toBe('');
  });
  it('falls back to defaults for unknown values', () => {
    expect(inputFromSearch(new URLSearchParams('sop=SOP9&mode=x'))).toEqual({ text: '', mode: 'bytes', sop: 'SOP', crc: false, caps: '' });
  });
});
