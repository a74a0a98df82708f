import { describe, expect, it } from 'vitest';
import { formatVector } from './format.ts';

// The file layout is docs/vector.md's: keys in its order, two-space indent, final newline.
const sample = {
  expect: { findings: { exclude: [], include: ['caps.power-rules-missing'] } },
  input: { pdpW: 45, pdos: ['0x0001912c', '0x0004b12c', '0x000640e1'] },
  kind: 'caps',
  ref: 'USB PD R3.1, §10.2.3',
  tags: ['power-rules'],
  title: 'A 45 W source must offer 9 V',
  id: 'caps/power-rules/45w-without-9v',
  vector: 1,
};

const expected = `{
  "vector": 1,
  "id": "caps/power-rules/45w-without-9v",
  "title": "A 45 W source must offer 9 V",
  "tags": ["power-rules"],
  "ref": "USB PD R3.1, §10.2.3",
  "kind": "caps",
  "input": {
    "pdos": ["0x0001912c", "0x0004b12c", "0x000640e1"],
    "pdpW": 45
  },
  "expect": {
    "findings": {
      "include": ["caps.power-rules-missing"],
      "exclude": []
    }
  }
}
`;

describe('formatVector', () => {
  it('writes keys in the contract order, two-space indent and a final newline', () => {
    expect(formatVector(sample)).toBe(expected);
  });

  it('is byte-stable: format(parse(format(v))) === format(v)', () => {
    const once = formatVector(sample);
    expect(formatVector(JSON.parse(once))).toBe(once);
  });

  it('does not depend on the key order it was given', () => {
    const reversed = Object.fromEntries(Object.entries(sample).reverse());
    expect(formatVector(reversed)).toBe(expected);
  });

  it('puts unknown keys after known ones, in code-point order, and keeps array order', () => {
    const text = formatVector({ zeta: 1, alpha: [3, 1, 2], id: 'x', Beta: {} });
    expect(text).toBe('{\n  "id": "x",\n  "Beta": {},\n  "alpha": [3, 1, 2],\n  "zeta": 1\n}\n');
  });

  it('writes arrays of objects one element a line and escapes strings as JSON does', () => {
    const text = formatVector({ trace: [{ t: 0, event: 'attach' }], code: 'export default () => "a\\nb";\n' });
    expect(text).toBe('{\n  "trace": [\n    {\n      "t": 0,\n      "event": "attach"\n    }\n  ],\n  "code": "export default () => \\"a\\\\nb\\";\\n"\n}\n');
    expect(formatVector(JSON.parse(text))).toBe(text);
  });
});
