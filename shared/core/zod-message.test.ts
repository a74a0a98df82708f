import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { fieldOf, zodMessage } from './zod-message.ts';

const schema = z.object({ pdos: z.array(z.string().length(8, 'must be 8 hex digits')), pdpW: z.number({ error: 'must be a number' }) });
const errorOf = (value: unknown) => {
  const parsed = schema.safeParse(value);
  if (parsed.success) throw new Error('expected a failure');
  return parsed.error;
};

describe('zodMessage', () => {
  it('reads "field: message" with dotted paths, every issue by default', () => {
    expect(zodMessage(errorOf({ pdos: ['0001912c', '12'], pdpW: 'x' }))).toBe('pdos.1: must be 8 hex digits; pdpW: must be a number');
  });
  it('names the input for an empty path, or puts a prefix before every path', () => {
    expect(zodMessage(errorOf('text'), { where: 'body' })).toMatch(/^body: /);
    expect(zodMessage(errorOf({ pdos: ['12'], pdpW: 1 }), { prefix: 'source' })).toBe('source.pdos.0: must be 8 hex digits');
  });
  it('shows the first issues and counts the rest', () => {
    expect(zodMessage(errorOf({ pdos: ['1', '2', '3'], pdpW: 1 }), { limit: 1 })).toBe('pdos.0: must be 8 hex digits (and 2 more)');
  });
  it('fieldOf: the same field names the details list carries', () => {
    expect(fieldOf([], { where: 'query' })).toBe('query');
    expect(fieldOf(['faults', 0, 'delayMs'])).toBe('faults.0.delayMs');
  });
});
