/**
 * The property sandbox's queue: at most `atOnce` tasks run at a time, at most `perOwner` of them
 * for one owner (a user or a CI token), and a freed slot goes to the next owner in turn
 * (round-robin), so one user's endless properties cannot hold back another user's short one.
 * Within one owner, tasks start in the order they were queued.
 *
 * `view(owner)` tells an owner where their waiting tasks stand: the position each would start at
 * if nobody queued more and running tasks finished in the order they started. It counts other
 * owners' tasks and never names them.
 */

export interface FairQueueOptions {
  /** Tasks running at once, over all owners. */
  atOnce: number;
  /** Tasks running at once for one owner. */
  perOwner: number;
}

export interface QueuedPosition {
  /** 1 = starts next. */
  position: number;
  /** Tasks that start before this one. */
  ahead: number;
  /** How many of those are the owner's own. */
  aheadYours: number;
}

export interface QueueView {
  atOnce: number;
  perOwner: number;
  /** Over every owner. */
  running: number;
  waiting: number;
  /** Owners with a task running or waiting. */
  owners: number;
  yours: { running: number; waiting: QueuedPosition[] };
}

export interface FairQueue {
  /** Runs `task` when its turn comes; rejects with `reason` when the queue is closed before that. */
  run<T>(owner: string, task: () => Promise<T>): Promise<T>;
  view(owner: string): QueueView;
  /** Refuses new tasks and rejects the waiting ones; running ones finish on their own. */
  close(reason: Error): void;
}

interface Waiting {
  owner: string;
  /** Queue order over all owners, for ties between owners served equally long ago. */
  seq: number;
  start: () => void;
  reject: (reason: Error) => void;
}

/**
 * The owner to serve next: among those with a waiting task and a free place of their own, the
 * one served longest ago (never served counts as longest), ties to the task queued first.
 */
function nextOwner(heads: ReadonlyMap<string, number>, lastServed: ReadonlyMap<string, number>, canRun: (owner: string) => boolean): string | undefined {
  let best: string | undefined;
  let bestKey: [number, number] = [Number.POSITIVE_INFINITY, Number.POSITIVE_INFINITY];
  for (const [owner, headSeq] of heads) {
    if (!canRun(owner)) continue;
    const key: [number, number] = [lastServed.get(owner) ?? -1, headSeq];
    if (key[0] < bestKey[0] || (key[0] === bestKey[0] && key[1] < bestKey[1])) {
      best = owner;
      bestKey = key;
    }
  }
  return best;
}

export function createFairQueue(options: FairQueueOptions): FairQueue {
  const atOnce = Math.max(1, Math.floor(options.atOnce));
  const perOwner = Math.max(1, Math.floor(options.perOwner));
  /** Waiting tasks per owner, in the order they were queued. */
  const waiting = new Map<string, Waiting[]>();
  /** When each owner last had a task started (a counter, not a clock). */
  const lastServed = new Map<string, number>();
  /** Running tasks' owners, in the order they started. */
  const running: string[] = [];
  let seq = 0;
  let served = 0;
  let closedWith: Error | undefined;

  const count = (list: readonly string[], owner: string): number => list.filter((o) => o === owner).length;
  const heads = (): Map<string, number> => new Map([...waiting].map(([owner, queue]) => [owner, queue[0]!.seq]));

  const dispatch = (): void => {
    while (running.length < atOnce) {
      const owner = nextOwner(heads(), lastServed, (o) => count(running, o) < perOwner);
      if (owner === undefined) return;
      const queue = waiting.get(owner)!;
      const next = queue.shift()!;
      if (queue.length === 0) waiting.delete(owner);
      lastServed.set(owner, served++);
      running.push(owner);
      next.start();
    }
  };

  const finished = (owner: string): void => {
    running.splice(running.indexOf(owner), 1);
    dispatch();
  };

  /** The owners of the waiting tasks in the order they would start, by the rules of `dispatch`. */
  const plannedOrder = (): string[] => {
    const queues = new Map([...waiting].map(([owner, queue]) => [owner, queue.map((w) => w.seq)]));
    const last = new Map(lastServed);
    const busy = [...running];
    const started: string[] = [];
    let tick = served;
    while (queues.size > 0) {
      const owner = busy.length < atOnce ? nextOwner(new Map([...queues].map(([o, q]) => [o, q[0]!])), last, (o) => count(busy, o) < perOwner) : undefined;
      if (owner === undefined) {
        // No free slot, or every owner with work is at its limit: the oldest running task ends first.
        busy.shift();
        continue;
      }
      const queue = queues.get(owner)!;
      queue.shift();
      if (queue.length === 0) queues.delete(owner);
      last.set(owner, tick++);
      busy.push(owner);
      started.push(owner);
    }
    return started;
  };

  return {
    run(owner, task) {
      if (closedWith) return Promise.reject(closedWith);
      return new Promise((resolve, reject) => {
        const start = (): void => {
          task()
            .then(resolve, reject)
            .finally(() => finished(owner));
        };
        const queue = waiting.get(owner) ?? [];
        queue.push({ owner, seq: seq++, start, reject });
        waiting.set(owner, queue);
        dispatch();
      });
    },
    view(owner) {
      const order = plannedOrder();
      const positions: QueuedPosition[] = [];
      let yoursBefore = 0;
      order.forEach((o, index) => {
        if (o !== owner) return;
        positions.push({ position: index + 1, ahead: index, aheadYours: yoursBefore });
        yoursBefore += 1;
      });
      const owners = new Set([...running, ...waiting.keys()]);
      return { atOnce, perOwner, running: running.length, waiting: order.length, owners: owners.size, yours: { running: count(running, owner), waiting: positions } };
    },
    close(reason) {
      closedWith = reason;
      const dropped = [...waiting.values()].flat();
      waiting.clear();
      for (const entry of dropped) entry.reject(reason);
    },
  };
}
