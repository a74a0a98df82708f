import { afterEach, describe, expect, it } from 'vitest';
import { expose } from 'comlink';
import { createEngineWorker, isCancelled, progress, type WorkerLike } from './engine-worker.ts';

type TestApi = {
  add(a: number, b: number): number;
  slow(ms: number): Promise<string>;
  count(n: number, onProgress: (fraction: number) => void): number;
};

const opened: MessagePort[] = [];

/** A Worker stand-in: comlink on the far side of a MessageChannel, terminate closes both ends. */
function fakeWorker(): WorkerLike & { terminated: boolean } {
  const channel = new MessageChannel();
  const api: TestApi = {
    add: (a, b) => a + b,
    slow: (ms) => new Promise((resolve) => setTimeout(() => resolve('done'), ms)),
    count: (n, onProgress) => {
      for (let i = 1; i <= n; i += 1) onProgress(i / n);
      return n;
    },
  };
  expose(api, channel.port2 as unknown as Parameters<typeof expose>[1]);
  opened.push(channel.port1, channel.port2);
  const port = channel.port1 as unknown as WorkerLike;
  const fake = {
    terminated: false,
    postMessage: (message: unknown, transfer?: Transferable[]) => port.postMessage(message, transfer),
    addEventListener: (type: string, listener: (event: Event) => void) => port.addEventListener(type, listener),
    removeEventListener: (type: string, listener: (event: Event) => void) => port.removeEventListener(type, listener),
    terminate: () => {
      fake.terminated = true;
      channel.port1.close();
      channel.port2.close();
    },
  };
  return fake;
}

afterEach(() => {
  for (const port of opened.splice(0)) port.close();
});

describe('createEngineWorker', () => {
  it('calls the worker through comlink and starts it only once', async () => {
    let started = 0;
    const engine = createEngineWorker<TestApi>(() => {
      started += 1;
      return fakeWorker();
    });
    expect(await engine.run((api) => api.add(2, 3))).toBe(5);
    expect(await engine.run((api) => api.add(40, 2))).toBe(42);
    expect(started).toBe(1);
    engine.terminate();
  });

  it('passes progress callbacks by reference', async () => {
    const engine = createEngineWorker<TestApi>(fakeWorker);
    const seen: number[] = [];
    const total = await engine.run((api) =>
      api.count(
        4,
        progress((fraction: number) => seen.push(fraction)),
      ),
    );
    expect(total).toBe(4);
    // Callbacks arrive asynchronously; the last one may land just after the result.
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(seen).toEqual([0.25, 0.5, 0.75, 1]);
    engine.terminate();
  });

  it('cancel() rejects pending runs, ends the worker, and the next run starts a fresh one', async () => {
    const workers: Array<ReturnType<typeof fakeWorker>> = [];
    const engine = createEngineWorker<TestApi>(() => {
      const worker = fakeWorker();
      workers.push(worker);
      return worker;
    });
    const pending = engine.run((api) => api.slow(5_000));
    expect(engine.pending()).toBe(1);
    engine.cancel();
    const error = await pending.catch((caught: unknown) => caught);
    expect(isCancelled(error)).toBe(true);
    expect(engine.pending()).toBe(0);
    expect(workers[0]?.terminated).toBe(true);

    expect(await engine.run((api) => api.add(1, 1))).toBe(2);
    expect(workers).toHaveLength(2);
    engine.terminate();
  });

  it('refuses runs after terminate()', async () => {
    const engine = createEngineWorker<TestApi>(fakeWorker);
    engine.terminate();
    const error = await engine.run((api) => api.add(1, 2)).catch((caught: unknown) => caught);
    expect(isCancelled(error)).toBe(true);
  });
});
