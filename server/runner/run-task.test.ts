import { describe, expect, it } from 'vitest';
import { isPropertyVectorText } from './pool.ts';
import { runVectorTask } from './run-task.ts';

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
