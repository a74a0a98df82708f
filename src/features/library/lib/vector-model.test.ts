import { describe, expect, it } from 'vitest';
import { getIn, listFromText, parseText, setIn, templateFor, toText, vectorKinds } from './vector-model.ts';
import { vectorSchema } from '../../../../shared/vectors/schema.ts';

describe('the vector page model', () => {
  it('sets and removes nested values without touching the original', () => {
    const start = { vector: 1, expect: { findings: { include: ['caps.order'] } } };
    const added = setIn(start, ['expect', 'findings', 'exclude'], ['*error']);
    expect(getIn(added, ['expect', 'findings'])).toEqual({ include: ['caps.order'], exclude: ['*error'] });
    expect(start.expect.findings).toEqual({ include: ['caps.order'] });
    const removed = setIn(setIn(added, ['expect', 'findings', 'exclude'], undefined), ['expect', 'findings', 'include'], undefined);
    expect(removed).toEqual({ vector: 1, expect: {} });
  });

  it('writes the byte-stable file: vector.md key order, two spaces, final newline', () => {
    const text = toText({ kind: 'caps', id: 'caps/x', vector: 1, title: 't', ref: 'r', tags: [], input: { pdos: ['0x0001912c'] }, expect: {} });
    expect(text.startsWith('{\n  "vector": 1,\n  "id": "caps/x",')).toBe(true);
    expect(text.endsWith('}\n')).toBe(true);
    expect(parseText(text)).toEqual({ ok: true, value: JSON.parse(text) });
    expect(parseText('[1]').ok).toBe(false);
    expect(parseText('{').ok).toBe(false);
  });

  it('gives every kind a template the engine schema accepts (decode and encode need their hex filled in)', () => {
    for (const kind of vectorKinds) {
      const result = vectorSchema.safeParse(templateFor(kind));
      if (kind === 'decode' || kind === 'encode') expect(result.success).toBe(false);
      else expect(result.success, `${kind}: ${JSON.stringify(result.error?.issues)}`).toBe(true);
    }
  });

  it('reads lists typed with commas or spaces', () => {
    expect(listFromText('caps.order, caps.duplicate  *error')).toEqual(['caps.order', 'caps.duplicate', '*error']);
    expect(listFromText('  ')).toBeUndefined();
  });
});
