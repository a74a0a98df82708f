import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { globToRegExp, matchesGlob } from './glob.ts';

// `--filter <glob>` of docs/cli.md `run`; the `*`/`**`/`?` meanings are common
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

  it('agrees with globToRegExp on small ids and globs', () => {
    const id = fc.string({ unit: fc.constantFrom('a', 'b', '/', '.'), maxLength: 8 });
    const glob = fc.string({ unit: fc.constantFrom('a', 'b', '/', '.', '*', '?'), maxLength: 8 });
    fc.assert(
      fc.property(id, glob, (i, g) => matchesGlob(i, g) === globToRegExp(g).test(i)),
      { numRuns: 3_000, seed: 20_261_201 },
    );
  });

  it('answers at once for globs that make a backtracking engine take exponential time', () => {
    expect(matchesGlob('a'.repeat(60), `${'*a'.repeat(40)}b`)).toBe(false);
    expect(matchesGlob('a'.repeat(60), `${'**'.repeat(40)}b`)).toBe(false);
    expect(matchesGlob('a/'.repeat(30), `${'**/'.repeat(40)}b`)).toBe(false);
    expect(matchesGlob('a'.repeat(60), '*a'.repeat(40))).toBe(true);
  });
});
