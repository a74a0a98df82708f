import { describe, expect, it } from 'vitest';
import type { Finding } from '../core/finding.ts';
import { describeMismatches, matchFindings, matchPartial, matchSequence, matchWithin } from './match.ts';

// The matching rules are docs/vector.md's ("Matching is partial: …").
const finding = (rule: string, severity: Finding['severity'] = 'error'): Finding => ({ rule, severity, message: `${rule} fired.`, ref: 'common practice' });

describe('matchPartial', () => {
  it('ignores keys the actual output has beyond the expected ones', () => {
    expect(matchPartial({ header: { messageType: 'Accept' } }, { sop: 'SOP', header: { messageType: 'Accept', messageId: 3 } }, 'expect.message')).toEqual([]);
  });

  it('names the path and both values of a mismatch', () => {
    const [m] = matchPartial({ header: { messageType: 'Accept' } }, { header: { messageType: 'Reject' } }, 'expect.message');
    expect(m?.message).toBe('expect.message.header.messageType: expected "Accept", got "Reject"');
    expect(m).toMatchObject({ path: 'expect.message.header.messageType', expected: 'Accept', actual: 'Reject' });
  });

  it('matches arrays element by element by index, each element partially', () => {
    const actual = {
      objects: [
        { kind: 'fixed', voltageMv: 5_000 },
        { kind: 'fixed', voltageMv: 9_000 },
      ],
    };
    expect(matchPartial({ objects: [{ voltageMv: 5_000 }, { voltageMv: 9_000 }] }, actual, 'expect')).toEqual([]);
    expect(matchPartial({ objects: [{ voltageMv: 5_000 }] }, actual, 'expect')).toEqual([]);
    const [m] = matchPartial({ objects: [{}, { voltageMv: 12_000 }] }, actual, 'expect');
    expect(m?.path).toBe('expect.objects[1].voltageMv');
  });

  it('reports an expected element the actual array lacks', () => {
    const [m] = matchPartial([1, 2, 3], [1, 2], 'expect.list');
    expect(m?.message).toBe('expect.list[2]: expected 3, got nothing (only 2 elements)');
  });

  it('reports a missing key and a type change', () => {
    expect(matchPartial({ a: 1 }, {}, 'expect')[0]?.message).toBe('expect.a: expected 1, got nothing');
    expect(matchPartial({ a: { b: 1 } }, { a: 7 }, 'expect')[0]?.message).toBe('expect.a: expected {"b":1}, got 7');
    expect(matchPartial(null, { kind: 'fixed' }, 'expect.contract')).toHaveLength(1);
    expect(matchPartial(null, null, 'expect.contract')).toEqual([]);
  });

  it('compares scalars strictly (no string to number coercion)', () => {
    expect(matchPartial(5_000, '5000', 'expect.v')).toHaveLength(1);
    expect(matchPartial(false, undefined, 'expect.v')).toHaveLength(1);
  });
});

describe('matchFindings', () => {
  const actual = [finding('caps.power-rules-missing'), finding('caps.cable-current', 'info')];

  it('include: every listed rule must fire', () => {
    expect(matchFindings({ include: ['caps.power-rules-missing'] }, actual)).toEqual([]);
    expect(matchFindings({ include: ['caps.order'] }, actual)[0]?.message).toBe('expect.findings.include: expected rule "caps.order" to fire, got ["caps.power-rules-missing","caps.cable-current"]');
  });

  it('exclude: no listed rule may fire', () => {
    expect(matchFindings({ exclude: ['caps.order'] }, actual)).toEqual([]);
    expect(matchFindings({ exclude: ['caps.cable-current'] }, actual)[0]?.message).toBe('expect.findings.exclude: expected rule "caps.cable-current" not to fire, got it: caps.cable-current fired.');
  });

  it('"*error" in exclude means no finding of severity error at all', () => {
    expect(matchFindings({ exclude: ['*error'] }, [finding('caps.cable-current', 'info'), finding('caps.pps-range', 'warning')])).toEqual([]);
    expect(matchFindings({ exclude: ['*error'] }, actual)[0]?.path).toBe('expect.findings.exclude');
  });

  it('an empty expectation matches anything', () => {
    expect(matchFindings({}, actual)).toEqual([]);
    expect(matchFindings({ include: [], exclude: [] }, [])).toEqual([]);
  });
});

describe('matchSequence', () => {
  const names = ['Source_Capabilities', 'GoodCRC', 'Request', 'GoodCRC', 'Accept', 'GoodCRC', 'PS_RDY', 'GoodCRC'];

  it('accepts an in-order subsequence with others between', () => {
    expect(matchSequence(['Source_Capabilities', 'Request', 'Accept', 'PS_RDY'], names)).toEqual([]);
    expect(matchSequence([], names)).toEqual([]);
  });

  it('rejects the wrong order and a missing name', () => {
    expect(matchSequence(['Accept', 'Request'], names)[0]?.path).toBe('expect.sequence[1]');
    expect(matchSequence(['Reject'], names)[0]?.message).toMatch(/^expect\.sequence\[0\]: expected "Reject", got/);
  });
});

describe('matchWithin and describeMismatches', () => {
  it('needs a contract no later than the bound', () => {
    expect(matchWithin(500, 300)).toEqual([]);
    expect(matchWithin(500, 500)).toEqual([]);
    expect(matchWithin(500, 501)[0]?.message).toBe('expect.contractWithinMs: expected a contract within 500 ms, got one at 501 ms');
    expect(matchWithin(500, null)[0]?.message).toBe('expect.contractWithinMs: expected a contract within 500 ms, got no contract');
  });

  it('summarises several mismatches by the first and the paths of the rest', () => {
    const all = matchPartial({ a: 1, b: 2, c: 3 }, { a: 0, b: 0, c: 3 }, 'expect');
    expect(describeMismatches(all)).toBe('expect.a: expected 1, got 0 (and 1 more: expect.b)');
    expect(describeMismatches([])).toBeUndefined();
  });
});
