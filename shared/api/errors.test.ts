import { describe, expect, it } from 'vitest';
import { apiErrorCodes } from './errors.ts';

describe('apiErrorCodes', () => {
  it('spells every code noun.kebab-case, once', () => {
    for (const code of apiErrorCodes) expect(code).toMatch(/^[a-z]+(-[a-z]+)*\.[a-z]+(-[a-z]+)*$/);
    expect(new Set(apiErrorCodes).size).toBe(apiErrorCodes.length);
  });
});
