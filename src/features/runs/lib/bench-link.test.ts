import { describe, expect, it } from 'vitest';
import { benchHref } from './bench-link.ts';
import { sharedFromHash } from '../../bench/lib/share-url.ts';

// The Bench owns the format; this link must read back there exactly.
describe('benchHref', () => {
  it('gives a /bench link whose hash the Bench decodes to the same scenario', () => {
    const scenario = { source: { caps: { pdos: ['0x0001912c'] } }, sink: { policy: { kind: 'max-power' } }, durationMs: 2_000, seed: 7 };
    const href = benchHref(scenario);
    expect(href.startsWith('/bench#scenario=')).toBe(true);
    expect(sharedFromHash(href.slice('/bench'.length))).toEqual({ ok: true, value: scenario });
  });
});
