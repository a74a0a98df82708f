import { describe, expect, it } from 'vitest';
import { createHeap, type Scheduled } from './heap.ts';

describe('createHeap', () => {
  it('pops by time, then by insertion order on a tie', () => {
    const heap = createHeap<Scheduled & { name: string }>();
    [
      { tUs: 30, seq: 0, name: 'c' },
      { tUs: 10, seq: 1, name: 'a1' },
      { tUs: 20, seq: 2, name: 'b' },
      { tUs: 10, seq: 3, name: 'a2' },
      { tUs: 5, seq: 4, name: 'first' },
    ].forEach((entry) => {
      heap.push(entry);
    });
    const order: string[] = [];
    while (heap.size > 0) order.push(heap.pop()!.name);
    expect(order).toEqual(['first', 'a1', 'a2', 'b', 'c']);
    expect(heap.pop()).toBeUndefined();
  });

  it('stays ordered over many random pushes and pops', () => {
    const heap = createHeap<Scheduled>();
    let seq = 0;
    let x = 12_345;
    const rand = () => {
      x = (x * 1_103_515_245 + 12_345) % 2_147_483_648;
      return x % 1_000;
    };
    for (let i = 0; i < 500; i++) heap.push({ tUs: rand(), seq: seq++ });
    let last = -1;
    for (let i = 0; i < 250; i++) {
      const entry = heap.pop()!;
      expect(entry.tUs).toBeGreaterThanOrEqual(last);
      last = entry.tUs;
    }
    expect(heap.peek()!.tUs).toBeGreaterThanOrEqual(last);
  });
});
