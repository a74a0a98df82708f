import { describe, expect, it } from 'vitest';
import { matchesGlob } from './glob.ts';

// `--filter <glob>` of ../shared/contract/cli.md `run`; the `*`/`**`/`?` meanings are common
// practice for path globs (one segment, any segments, one character).
describe('matchesGlob', () => {
  it('* stays within one word', () => {
    expect(matchesGlob('caps/power-rules', 'caps/*')).toBe(true);
    expect(matchesGlob('caps/power-rules/45w', 'caps/*')).toBe(false);
    expect(matchesGlob('caps/power-rules/45w', '*/power-rules/*')).toBe(true);
  });

  it('** crosses words, also none', () => {
    expect(matchesGlob('caps/power-rules/45w', 'caps/**')).toBe(true);
    expect(matchesGlob('caps', 'caps/**')).toBe(true);
    expect(matchesGlob('decode/control/accept', '**/accept')).toBe(true);
    expect(matchesGlob('accept', '**/accept')).toBe(true);
    expect(matchesGlob('a/x/y/b', 'a/**/b')).toBe(true);
    expect(matchesGlob('anything/at/all', '**')).toBe(true);
  });

  it('? is one character but not /, everything else literal', () => {
    expect(matchesGlob('caps/45w', 'caps/4?w')).toBe(true);
    expect(matchesGlob('caps/4/w', 'caps/4?w')).toBe(false);
    expect(matchesGlob('caps/a.b', 'caps/a.b')).toBe(true);
    expect(matchesGlob('caps/axb', 'caps/a.b')).toBe(false);
  });
});
