import { describe, expect, it } from 'vitest';
import { compileProperty } from '../../../../shared/vectors/property.ts';
import { withContextType } from './context-type.ts';

describe('withContextType', () => {
  it('annotates an untyped ({ fc, engine }) default export and leaves typed code alone', () => {
    expect(withContextType('export default ({ fc, engine }) =>\n  fc.property(…)')).toBe('export default ({ fc, engine }: PropertyContext) =>\n  fc.property(…)');
    expect(withContextType('export default async ({fc,engine}) => 1')).toBe('export default async ({ fc, engine }: PropertyContext) => 1');
    const typed = 'export default ({ fc, engine }: PropertyContext) => 1';
    expect(withContextType(typed)).toBe(typed);
    expect(withContextType('export default ({ fc }) => 1')).toBe('export default ({ fc }) => 1');
  });

  it('gives code that still compiles and runs (sucrase strips the annotation)', () => {
    const compiled = compileProperty(withContextType('export default ({ fc, engine }) => fc.property(fc.nat(), (n: number) => { if (n < 0) throw new Error(String(engine)); });'));
    expect(compiled.ok).toBe(true);
  });
});
