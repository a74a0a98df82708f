/**
 * Engine work off the main thread: a comlink-wrapped module worker that can be cancelled.
 *
 *   const sim = createEngineWorker<SimApi>(
 *     () => new Worker(new URL('../../workers/sim.worker.ts', import.meta.url), { type: 'module' }),
 *   );
 *   const result = await sim.run((api) => api.simulate(scenario, progress((f) => setFraction(f))));
 *   sim.cancel(); // stops a long run; the next run() starts a fresh worker
 *
 * The factory must contain the literal `new Worker(new URL(…, import.meta.url), …)` so Vite bundles the worker.
 */
import { proxy, releaseProxy, wrap, type Remote } from 'comlink';

/** What the helper needs from a Worker (a MessagePort with `terminate` will do in tests). */
export type WorkerLike = {
  postMessage(message: unknown, transfer?: Transferable[]): void;
  addEventListener(type: string, listener: (event: Event) => void): void;
  removeEventListener(type: string, listener: (event: Event) => void): void;
  terminate(): void;
};

export class WorkerCancelledError extends Error {
  constructor() {
    super('Cancelled');
    this.name = 'WorkerCancelledError';
  }
}

export class WorkerFailedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'WorkerFailedError';
  }
}

export function isCancelled(error: unknown): error is WorkerCancelledError {
  return error instanceof WorkerCancelledError;
}

export type EngineWorker<TApi> = {
  /** Calls the worker; rejects with WorkerCancelledError when cancel() or terminate() comes first. */
  run<TResult>(call: (api: Remote<TApi>) => Promise<TResult>): Promise<TResult>;
  /** Stops every pending run by ending the worker; the next run() starts a fresh one. */
  cancel(): void;
  /** Ends the worker for good (call from an effect's cleanup). */
  terminate(): void;
  /** Number of runs in flight. */
  pending(): number;
};

type Live<TApi> = { worker: WorkerLike; api: Remote<TApi>; onError: (event: Event) => void };
type Pending = { reject: (error: Error) => void };

export function createEngineWorker<TApi>(factory: () => WorkerLike): EngineWorker<TApi> {
  let live: Live<TApi> | null = null;
  let ended = false;
  const inFlight = new Set<Pending>();

  function rejectAll(error: Error): void {
    for (const entry of inFlight) entry.reject(error);
    inFlight.clear();
  }

  function stop(): void {
    if (!live) return;
    live.worker.removeEventListener('error', live.onError);
    live.api[releaseProxy]();
    live.worker.terminate();
    live = null;
  }

  function start(): Live<TApi> {
    if (live) return live;
    const worker = factory();
    // A worker that fails to load or throws at top level would otherwise leave calls hanging.
    const onError = (event: Event) => {
      const message = event instanceof ErrorEvent && event.message ? event.message : 'The engine worker stopped unexpectedly.';
      stop();
      rejectAll(new WorkerFailedError(message));
    };
    worker.addEventListener('error', onError);
    live = { worker, api: wrap<TApi>(worker), onError };
    return live;
  }

  return {
    run<TResult>(call: (api: Remote<TApi>) => Promise<TResult>): Promise<TResult> {
      if (ended) return Promise.reject(new WorkerCancelledError());
      const { api } = start();
      return new Promise<TResult>((resolve, reject) => {
        const entry: Pending = { reject };
        inFlight.add(entry);
        call(api).then(
          (value) => {
            if (!inFlight.delete(entry)) return;
            resolve(value);
          },
          (error: unknown) => {
            if (!inFlight.delete(entry)) return;
            reject(error instanceof Error ? error : new WorkerFailedError(String(error)));
          },
        );
      });
    },
    cancel(): void {
      stop();
      rejectAll(new WorkerCancelledError());
    },
    terminate(): void {
      ended = true;
      stop();
      rejectAll(new WorkerCancelledError());
    },
    pending: () => inFlight.size,
  };
}

/** Wraps a callback (e.g. onProgress) so it can be passed to the worker by reference. */
export function progress<TArgs extends unknown[]>(callback: (...args: TArgs) => void): (...args: TArgs) => void {
  return proxy(callback);
}
