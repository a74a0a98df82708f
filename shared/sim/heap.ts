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

/** A class, not closures: every run creates one (the hot path). */
class BinaryHeap<T extends Scheduled> implements Heap<T> {
  private readonly items: T[] = [];

  get size(): number {
    return this.items.length;
  }
  push(entry: T): void {
    this.items.push(entry);
    this.siftUp(this.items.length - 1);
  }
  peek(): T | undefined {
    return this.items[0];
  }
  pop(): T | undefined {
    const items = this.items;
    const top = items[0];
    const last = items.pop();
    if (items.length > 0 && last !== undefined) {
      items[0] = last;
      this.siftDown(0);
    }
    return top;
  }

  private siftUp(index: number): void {
    const items = this.items;
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

  private siftDown(index: number): void {
    const items = this.items;
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
}

export function createHeap<T extends Scheduled>(): Heap<T> {
  return new BinaryHeap<T>();
}
