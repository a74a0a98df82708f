/**
 * In-process event hub for jobs: the latest event per job and its listeners. A final event stays
 * readable for `keepFinalMs` so a stream that opens just after the end still gets it.
 */
import { EventEmitter } from 'node:events';
import { isFinalEvent, type JobEvent, type JobEvents } from './types.ts';

export function createJobEvents(options: { keepFinalMs?: number } = {}): JobEvents {
  const keepFinalMs = options.keepFinalMs ?? 5 * 60_000;
  const hub = new EventEmitter();
  hub.setMaxListeners(0);
  const latest = new Map<string, JobEvent>();
  const expiry = new Map<string, NodeJS.Timeout>();
  return {
    publish(topic, event) {
      latest.set(topic, event);
      clearTimeout(expiry.get(topic));
      expiry.delete(topic);
      if (isFinalEvent(event)) {
        const timer = setTimeout(() => {
          latest.delete(topic);
          expiry.delete(topic);
        }, keepFinalMs);
        timer.unref();
        expiry.set(topic, timer);
      }
      hub.emit(topic, event);
    },
    latest: (topic) => latest.get(topic),
    subscribe(topic, listener) {
      hub.on(topic, listener);
      return () => hub.off(topic, listener);
    },
  };
}
