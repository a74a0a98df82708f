import { describe, expect, it } from 'vitest';
import { createFaultBook, faultsFor, isSilent } from './faults.ts';
import type { Fault } from './scenario.ts';

describe('faultsFor', () => {
  it('selects the nth matching transmission by side and type', () => {
    const fault: Fault = { kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 2 };
    const book = createFaultBook([fault]);
    expect(faultsFor(book, ['drop'], 'source', 'GoodCRC', 0)).toEqual([]);
    expect(faultsFor(book, ['drop'], 'sink', 'Request', 0)).toEqual([]);
    expect(faultsFor(book, ['drop'], 'sink', 'GoodCRC', 0)).toEqual([]);
    expect(faultsFor(book, ['drop'], 'sink', 'GoodCRC', 0)).toEqual([fault]);
    expect(faultsFor(book, ['drop'], 'sink', 'GoodCRC', 0)).toEqual([]);
  });
  it('takes count from the nth on, every one without nth, and only from atMs', () => {
    const counted = createFaultBook([{ kind: 'drop', messageType: 'Accept', nth: 1, count: 2 }]);
    expect([1, 2, 3].map(() => faultsFor(counted, ['drop'], 'source', 'Accept', 0).length)).toEqual([1, 1, 0]);
    const timed = createFaultBook([{ kind: 'corrupt', from: 'source', atMs: 5 }]);
    expect(faultsFor(timed, ['corrupt'], 'source', 'PS_RDY', 4_999).length).toBe(0);
    expect(faultsFor(timed, ['corrupt'], 'source', 'PS_RDY', 5_000).length).toBe(1);
    expect(faultsFor(timed, ['corrupt'], 'source', 'Accept', 9_000).length).toBe(1);
  });
  it('counts reject against the sink Requests', () => {
    const book = createFaultBook([{ kind: 'reject', nth: 1 }]);
    expect(faultsFor(book, ['reject'], 'sink', 'Request', 0).length).toBe(1);
    expect(faultsFor(book, ['reject'], 'sink', 'Request', 0).length).toBe(0);
  });
  it('keeps a side silent once its fault applied', () => {
    const book = createFaultBook([{ kind: 'silent', from: 'sink', atMs: 10 }]);
    expect(isSilent(book, 'sink', 'Request', 9_000)).toBe(false);
    expect(isSilent(book, 'sink', 'Request', 10_000)).toBe(true);
    expect(isSilent(book, 'sink', 'GoodCRC', 20_000)).toBe(true);
    expect(isSilent(book, 'source', 'GoodCRC', 20_000)).toBe(false);
  });
});
