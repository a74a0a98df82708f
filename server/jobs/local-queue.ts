/**
 * The in-process job queue (SQLite, one server): a job runs as soon as it is queued, at most one
 * per kind and key; the heavy part of every job is already in a worker-thread pool. Jobs left
 * unfinished by a stopped process are picked up by the start-up resume of their feature.
 */
import { createJobEvents } from './events.ts';
import { isFinalEvent, topicOf, type JobEvent, type JobHandler, type JobKind, type JobQueue } from './types.ts';

export function createLocalJobQueue(options: { onError?(kind: string, key: string, cause: unknown): void } = {}): JobQueue {
  const events = createJobEvents();
  const handlers = new Map<string, JobHandler<unknown, JobEvent>>();
  const running = new Map<string, Promise<void>>();
  const stop = new AbortController();

  function finishedOf<E extends JobEvent>(topic: string): Promise<E> {
    return new Promise((resolveFinal) => {
      const unsubscribe = events.subscribe(topic, (event) => {
        if (!isFinalEvent(event)) return;
        unsubscribe();
        resolveFinal(event as E);
      });
    });
  }

  return {
    name: 'local',
    handle(kind, handler) {
      handlers.set(kind.name, handler as JobHandler<unknown, JobEvent>);
    },
    async enqueue<P, E extends JobEvent>(kind: JobKind<P, E>, key: string | number, payload: P) {
      const topic = topicOf(kind, key);
      const handler = handlers.get(kind.name);
      if (!handler) throw new Error(`no handler for jobs of kind ${kind.name}`);
      if (stop.signal.aborted) throw new Error('the job queue is closed');
      const finished = finishedOf<E>(topic);
      if (!running.has(topic)) {
        const job = handler(payload, { key: String(key), publish: (event) => events.publish(topic, event), signal: stop.signal })
          .catch((cause: unknown) => options.onError?.(kind.name, String(key), cause))
          .finally(() => running.delete(topic));
        running.set(topic, job);
      }
      return { finished };
    },
    async isActive(kind, key) {
      return running.has(topicOf(kind, key));
    },
    latest: (kind, key) => events.latest(topicOf(kind, key)) as never,
    subscribe: (kind, key, listener) => events.subscribe(topicOf(kind, key), listener as (event: JobEvent) => void),
    async check() {
      return stop.signal.aborted ? { ok: false, message: 'closed' } : { ok: true };
    },
    async close() {
      stop.abort();
      await Promise.allSettled(running.values());
    },
  };
}
