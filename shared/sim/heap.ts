/**
 * A binary min-heap of scheduled entries, ordered by time (`tUs`) then by insertion order (`seq`),
 * so that two entries due at the same microsecond run in the order they were scheduled: that
 * tie-break is what makes a run deterministic.
 */
export interface Scheduled {
  tUs: number;
  seq: number;
}

export interface Heap<T extends Scheduled> {
  readonly size: number;
  push(entry: T): void;
  /** The earliest entry without removing it. */
  peek(): T | undefined;
  pop(): T | undefined;
}

function before(a: Scheduled, b: Scheduled): boolean {
  return a.tUs < b.tUs || (a.tUs === b.tUs && a.seq < b.seq);
}

export function createHeap<T extends Scheduled>(): Heap<T> {
  const items: T[] = [];

  function siftUp(index: number): void {
    const entry = items[index] as T;
    while (index > 0) {
      const parent = (index - 1) >> 1;
      const above = items[parent] as T;
      if (!before(entry, above)) break;
      items[index] = above;
      index = parent;
    }
    items[index] = entry;
  }

  function siftDown(index: number): void {
    const length = items.length;
    const entry = items[index] as T;
    for (;;) {
      const left = 2 * index + 1;
      if (left >= length) break;
      const right = left + 1;
      let child = left;
      if (right < length && before(items[right] as T, items[left] as T)) child = right;
      const below = items[child] as T;
      if (!before(below, entry)) break;
      items[index] = below;
      index = child;
    }
    items[index] = entry;
  }

  return {
    get size() {
      return items.length;
    },
    push(entry) {
      items.push(entry);
      siftUp(items.length - 1);
    },
    peek() {
      return items[0];
    },
    pop() {
      const top = items[0];
      const last = items.pop();
      if (items.length > 0 && last !== undefined) {
        items[0] = last;
        siftDown(0);
      }
      return top;
    },
  };
}
