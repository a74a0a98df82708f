import { describe, expect, it } from 'vitest';
import type { Contract } from '../core/contract.ts';
import { classifyOutcome } from './outcome.ts';

const c9: Contract = { kind: 'fixed', objectPosition: 2, voltageMv: 9_000, currentMa: 3_000, powerMw: 27_000 };
const c5: Contract = { kind: 'fixed', objectPosition: 1, voltageMv: 5_000, currentMa: 3_000, powerMw: 15_000 };
const none = { hardResets: 0, softResets: 0 };

describe('classifyOutcome', () => {
  it('names the five classes', () => {
    expect(classifyOutcome(c9, c9, none)).toBe('same-power');
    expect(classifyOutcome(c5, c9, none)).toBe('different-power');
    expect(classifyOutcome(c9, c9, { hardResets: 0, softResets: 1 })).toBe('after-soft-reset');
    expect(classifyOutcome(c9, c9, { hardResets: 1, softResets: 1 })).toBe('after-hard-reset');
    expect(classifyOutcome(null, c9, { hardResets: 3, softResets: 0 })).toBe('no-contract');
  });
});
