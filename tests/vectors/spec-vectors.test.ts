/**
 * The second-version rule vectors are written from the specification scenes
 * (tests/fixtures/traces/write-spec-vectors.ts); the committed files must still be what it writes.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { specVectors } from '../fixtures/traces/spec-vectors.ts';
import { formatVector } from '../../shared/vectors/format.ts';

describe('specification-scene vectors', () => {
  for (const v of specVectors()) {
    it(v.id, () => {
      expect(readFileSync(join(import.meta.dirname, '../../vectors', `${v.id}.vector.json`), 'utf8')).toBe(formatVector(v));
    });
  }
});
