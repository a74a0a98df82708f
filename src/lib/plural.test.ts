import { describe, expect, it } from 'vitest';
import { countsText, plural, SEVERITY_WORD } from './plural.ts';

describe('plural', () => {
  it('counts in words', () => {
    expect(plural(1, 'error')).toBe('1 error');
    expect(plural(0, 'error')).toBe('0 errors');
    expect(plural(20_085, 'warning')).toBe('20,085 warnings');
    expect(plural(2, 'property', 'properties')).toBe('2 properties');
    // Grouped as en-GB's Intl groups them, without calling it for whole numbers.
    for (const n of [0, 7, 999, 1_000, 12_345, 999_999, 1_000_000, 1_234_567_890, -4_321]) expect(plural(n, 'x')).toBe(`${n.toLocaleString('en-GB')} x${n === 1 ? '' : 's'}`);
    expect(plural(1.5, 'volt')).toBe('1.5 volts');
  });

  it('names the info severity as docs/rules.md and the command line do', () => {
    expect(SEVERITY_WORD.info).toBe('info');
    expect(countsText(1, { error: 1, warning: 0, info: 2 })).toBe('1 message · 1 error · 0 warnings · 2 info');
  });
});
