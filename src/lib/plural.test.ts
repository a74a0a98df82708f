import { describe, expect, it } from 'vitest';
import { countsText, plural, SEVERITY_WORD } from './plural.ts';

describe('plural', () => {
  it('counts in words', () => {
    expect(plural(1, 'error')).toBe('1 error');
    expect(plural(0, 'error')).toBe('0 errors');
    expect(plural(20_085, 'warning')).toBe('20,085 warnings');
    expect(plural(2, 'property', 'properties')).toBe('2 properties');
  });

  it('names the info severity as docs/rules.md and the command line do', () => {
    expect(SEVERITY_WORD.info).toBe('info');
    expect(countsText(1, { error: 1, warning: 0, info: 2 })).toBe('1 message · 1 error · 0 warnings · 2 info');
  });
});
