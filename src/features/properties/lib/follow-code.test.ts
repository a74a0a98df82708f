import { describe, expect, it } from 'vitest';
import { nameForCode } from './follow-code.ts';

const example = { id: 'property/caps/lawful-caps-pass', title: 'Lawful caps pass', code: 'export default () => true;\n', origin: 'library' as const };

describe('the save panel name follows the code', () => {
  it("is the example's while the code is the example's (trailing spaces aside)", () => {
    expect(nameForCode(example, 'export default () => true;   \r\n', false)).toEqual({ id: 'property/caps/lawful-caps-pass', title: 'Lawful caps pass' });
  });

  it('names a new property beside the example once the code changes', () => {
    expect(nameForCode(example, 'export default () => false;\n', false)).toEqual({ id: 'property/caps/lawful-caps-pass-edited', title: 'Lawful caps pass (edited)' });
  });

  it('keeps the template name for a new property (its code is meant to change)', () => {
    expect(nameForCode(example, 'anything', true)).toEqual({ id: 'property/caps/lawful-caps-pass', title: 'Lawful caps pass' });
  });
});
