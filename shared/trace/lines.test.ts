import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createLineSplitter } from './lines.ts';

function split(chunks: string[]): [string, number][] {
  const out: [string, number][] = [];
  const s = createLineSplitter((line, n) => out.push([line, n]));
  for (const c of chunks) s.push(c);
  s.end();
  return out;
}

describe('createLineSplitter', () => {
  it('joins lines cut between chunks and numbers them', () => {
    expect(split(['ab', 'c\nde', 'f\r\n', '\ng'])).toEqual([
      ['abc', 1],
      ['def', 2],
      ['', 3],
      ['g', 4],
    ]);
  });
  it('gives the same lines however the text is cut', () => {
    fc.assert(
      fc.property(fc.string(), fc.array(fc.nat(), { maxLength: 8 }), (text, cuts) => {
        const points = [...new Set(cuts.map((c) => c % (text.length + 1)))].sort((a, b) => a - b);
        const chunks: string[] = [];
        let last = 0;
        for (const p of points) {
          chunks.push(text.slice(last, p));
          last = p;
        }
        chunks.push(text.slice(last));
        expect(split(chunks)).toEqual(split([text]));
      }),
    );
  });
});
