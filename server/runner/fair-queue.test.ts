import { describe, expect, it } from 'vitest';
import { createFairQueue } from './fair-queue.ts';

/** A task that ends when the test says so, recording when it started. */
function gate(log: string[], name: string) {
  let open!: () => void;
  const done = new Promise<void>((resolve) => (open = resolve));
  return {
    task: async () => {
      log.push(name);
      await done;
      return name;
    },
    open: () => open(),
  };
}

const settle = () => new Promise((resolve) => setImmediate(resolve));

describe('the fair queue', () => {
  it('one running task per owner: a second owner starts at once while the first one waits', async () => {
    const queue = createFairQueue({ atOnce: 2, perOwner: 1 });
    const log: string[] = [];
    const a1 = gate(log, 'a1');
    const a2 = gate(log, 'a2');
    const b1 = gate(log, 'b1');
    const runs = [queue.run('a', a1.task), queue.run('a', a2.task), queue.run('b', b1.task)];
    await settle();
    expect(log).toEqual(['a1', 'b1']);
    expect(queue.view('a')).toMatchObject({ running: 2, waiting: 1, owners: 2, yours: { running: 1, waiting: [{ position: 1, ahead: 0, aheadYours: 0 }] } });
    expect(queue.view('b')).toMatchObject({ yours: { running: 1, waiting: [] } });
    b1.open();
    await settle();
    // b's slot is free, but a may run only one at a time.
    expect(log).toEqual(['a1', 'b1']);
    a1.open();
    await settle();
    expect(log).toEqual(['a1', 'b1', 'a2']);
    a2.open();
    expect(await Promise.all(runs)).toEqual(['a1', 'a2', 'b1']);
    expect(queue.view('a')).toMatchObject({ running: 0, waiting: 0, owners: 0 });
  });

  it('with one slot, the owner served longest ago goes next (round-robin), not the first to queue', async () => {
    const queue = createFairQueue({ atOnce: 1, perOwner: 1 });
    const log: string[] = [];
    const tasks = Object.fromEntries(['a1', 'a2', 'a3', 'b1', 'b2', 'c1'].map((name) => [name, gate(log, name)]));
    const runs = ['a1', 'a2', 'a3', 'b1', 'b2', 'c1'].map((name) => queue.run(name[0]!, tasks[name]!.task));
    await settle();
    expect(log).toEqual(['a1']);
    // Planned: b1 and c1 have never run, then a2, b2, a3.
    expect(queue.view('a').yours.waiting).toEqual([
      { position: 3, ahead: 2, aheadYours: 0 },
      { position: 5, ahead: 4, aheadYours: 1 },
    ]);
    expect(queue.view('c').yours.waiting).toEqual([{ position: 2, ahead: 1, aheadYours: 0 }]);
    for (const name of ['a1', 'b1', 'c1', 'a2', 'b2', 'a3']) {
      tasks[name]!.open();
      await settle();
    }
    await Promise.all(runs);
    expect(log).toEqual(['a1', 'b1', 'c1', 'a2', 'b2', 'a3']);
  });

  it('a failing task frees its slot; close rejects the waiting tasks and refuses new ones', async () => {
    const queue = createFairQueue({ atOnce: 1, perOwner: 1 });
    const log: string[] = [];
    const failing = queue.run('a', async () => {
      throw new Error('boom');
    });
    await expect(failing).rejects.toThrow('boom');
    const held = gate(log, 'a1');
    const running = queue.run('a', held.task);
    const waiting = queue.run('b', async () => 'never');
    await settle();
    queue.close(new Error('closed'));
    await expect(waiting).rejects.toThrow('closed');
    await expect(queue.run('c', async () => 'late')).rejects.toThrow('closed');
    held.open();
    expect(await running).toBe('a1');
  });
});
