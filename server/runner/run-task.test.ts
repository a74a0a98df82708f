import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { builtInVectorsDir } from '../features/vectors/seed.ts';
import { isPropertyVectorText } from './pool.ts';
import { keptOfResult, runVectorBatch, runVectorTask } from './run-task.ts';

/** The run pool's threads never evaluate property code: the pool routes it to the sandbox, and a worker refuses it. */
describe('property vectors and the thread pool', () => {
  const property = {
    vector: 1,
    id: 'property/any',
    title: 'Any',
    tags: [],
    ref: 'common practice',
    kind: 'property',
    input: { code: 'export default ({ fc }) => fc.property(fc.constant(0), () => true);', runs: 1, seed: 1 },
    expect: { holds: true },
  };

  it('a worker refuses a property vector with a clear message', async () => {
    const result = await runVectorTask({ text: JSON.stringify(property), vectorId: property.id, vectorsRoot: '/nonexistent' });
    expect(result).toMatchObject({ id: 'property/any', ok: false, message: "input.code: property vectors run only in the property sandbox, not in the server's run pool" });
  });

  it('the pool tells a property vector by its parsed kind', () => {
    expect(isPropertyVectorText(JSON.stringify(property))).toBe(true);
    // A JSON escape cannot hide the kind from the parser.
    expect(isPropertyVectorText('{"kind": "propert\\u0079"}')).toBe(true);
    expect(isPropertyVectorText(JSON.stringify({ ...property, kind: 'caps', note: '"kind": "property"' }))).toBe(false);
    expect(isPropertyVectorText('not json')).toBe(false);
    expect(isPropertyVectorText('null')).toBe(false);
  });
});

describe('what a run batch sends back', () => {
  it('a pass carries its verdict and time only; a failure keeps its evidence', async () => {
    // A library vector (Accept from a source, header 0x03a3) and a copy that expects Reject instead.
    const passing = JSON.parse(readFileSync(join(builtInVectorsDir, 'decode/control/accept-from-source.vector.json'), 'utf8')) as {
      id: string;
      expect: { message: { header: Record<string, unknown> } };
    };
    const failing = structuredClone(passing);
    failing.id = 'decode/control/accept-expected-as-reject';
    failing.expect.message.header.messageType = 'Reject';
    const tasks = [passing, failing].map((v) => ({ text: JSON.stringify(v), vectorId: v.id, vectorsRoot: builtInVectorsDir }));
    const full = await Promise.all(tasks.map(runVectorTask));
    const kept = await runVectorBatch(tasks);
    expect(full.map((r) => r.ok)).toEqual([true, false]);
    expect(full[0]!.actual).toBeDefined();
    expect(kept[0]).toEqual({ id: passing.id, ok: true, durationMs: kept[0]!.durationMs });
    expect(kept[1]).toMatchObject({ id: failing.id, ok: false, message: full[1]!.message, expected: full[1]!.expected, actual: full[1]!.actual, mismatches: full[1]!.mismatches });
    expect(keptOfResult(full[1]!)).toBe(full[1]);
  });
});
