/**
 * `npm test` runs the whole built-in library: one test per vector, table-driven. A vector listed in
 * vectors/known-failing.json runs as `it.fails` with its reason in the test name, so it is never
 * silently skipped, and the list must be updated the day the engine is fixed (the test then fails).
 * The expected values in the vectors cite their sources in each file's `ref`.
 */
import { readFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ruleIds } from '../../shared/rules/catalog.ts';
import { formatVector } from '../../shared/vectors/format.ts';
import { parseVector, runVector } from '../../shared/vectors/run.ts';
import { VECTOR_KINDS, type Vector } from '../../shared/vectors/schema.ts';
import { knownFailures, libraryFiles } from './support.ts';

const files = libraryFiles();
const known = new Map(knownFailures().map((k) => [k.id, k.reason]));
const vectors = files.map((file) => {
  const parsed = parseVector(file.text);
  return { file, vector: parsed.ok ? parsed.vector : undefined, error: parsed.ok ? undefined : parsed.error.message };
});

describe('the built-in library', () => {
  it('has at least 80 valid vectors with unique ids, every kind, in folders by kind', () => {
    expect(files.length).toBeGreaterThanOrEqual(80);
    expect(vectors.filter((v) => v.error).map((v) => `${v.file.path}: ${v.error}`)).toEqual([]);
    const ids = vectors.map((v) => v.vector?.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const { file, vector } of vectors) expect(file.path).toBe(`${vector?.id}.vector.json`);
    expect(new Set(vectors.map((v) => v.vector?.kind))).toEqual(new Set(VECTOR_KINDS));
  });

  it('stores every file byte-stable (formatVector of the parsed file is the file)', () => {
    const unstable = files.filter((f) => formatVector(JSON.parse(f.text)) !== f.text).map((f) => f.path);
    expect(unstable).toEqual([]);
  });

  it('has, for every rule id of the catalog, a vector that makes it fire and one that keeps it quiet', () => {
    const fired = new Set<string>();
    const quiet = new Set<string>();
    for (const { vector } of vectors) {
      const findings = (vector?.expect as { findings?: { include?: string[]; exclude?: string[] } } | undefined)?.findings;
      for (const r of findings?.include ?? []) fired.add(r);
      for (const r of findings?.exclude ?? []) quiet.add(r);
    }
    expect(ruleIds.filter((r) => !fired.has(r))).toEqual([]);
    expect(ruleIds.filter((r) => !quiet.has(r))).toEqual([]);
    const known: string[] = [...ruleIds, '*error'];
    expect([...fired, ...quiet].filter((r) => !known.includes(r))).toEqual([]);
  });

  it('lists only library vectors as known failing, each with a reason', () => {
    for (const [id, reason] of known) {
      expect(
        vectors.some((v) => v.vector?.id === id),
        id,
      ).toBe(true);
      expect(reason.length).toBeGreaterThan(20);
    }
  });

  it('gives every vector a ref', () => {
    expect(vectors.filter((v) => (v.vector?.ref ?? '').trim().length < 5).map((v) => v.file.path)).toEqual([]);
  });
});

const run = (vector: Vector, absolute: string) => runVector(vector, { readFile: (path) => readFile(resolve(dirname(absolute), path), 'utf8') });

describe.each(VECTOR_KINDS.map((kind) => ({ kind })))('$kind vectors', ({ kind }) => {
  for (const { file, vector } of vectors) {
    if (!vector || vector.kind !== kind) continue;
    const reason = known.get(vector.id);
    if (reason === undefined) {
      it(vector.id, async () => {
        const result = await run(vector, file.absolute);
        expect(result.message ?? '').toBe('');
        expect(result.ok).toBe(true);
      });
    } else {
      it.fails(`${vector.id} (known failing: ${reason})`, async () => {
        const result = await run(vector, file.absolute);
        expect(result.message ?? '').toBe('');
      });
    }
  }
});
