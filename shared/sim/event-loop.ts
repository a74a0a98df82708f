/**
 * The runner's discrete-event loop: the injected clock (clock.ts, never backwards), the queue of
 * entries (heap.ts: by time, then in the order they were scheduled, which makes a run
 * deterministic) and the loop that pops them, fills the samples up to each entry, asks whether to
 * stop and reports progress.
 */
import { createClock, type SimClock } from './clock.ts';
import type { Entry, EntryBody } from './entries.ts';
import { createHeap } from './heap.ts';
import type { RunSamples } from './run-samples.ts';

/** What the caller may ask of a running loop (simulate's `onProgress` and `shouldStop`). */
export interface LoopControl {
  onProgress?(fraction: number): void;
  shouldStop?(): boolean;
}

/** Performs one entry; a plain function with its target, so that a run builds no closure. */
export type Dispatch<T> = (target: T, entry: Entry) => void;

export class EventLoop {
  readonly clock: SimClock = createClock();
  private readonly queue = createHeap<Entry>();
  private seq = 0;
  /** Set by the `end` entry, or by the first contract of an `untilContract` run. */
  done = false;

  /** The body literal becomes the entry (no copy: this is the hot path). */
  schedule(tUs: number, body: EntryBody): void {
    body.tUs = tUs;
    body.seq = this.seq++;
    this.queue.push(body as Entry);
  }

  /**
   * Runs the entries due up to `durationUs` (µs) until one sets `done`. The stop check runs every
   * 256 entries and at each percent of simulated time. Returns true when `shouldStop` ended the run.
   */
  run<T>(durationUs: number, dispatch: Dispatch<T>, target: T, control: LoopControl, samples: RunSamples | undefined): boolean {
    const clock = this.clock;
    const progressEveryUs = Math.max(1, Math.floor(durationUs / 100));
    let nextProgressUs = progressEveryUs;
    let handled = 0;
    while (!this.done) {
      const entry = this.queue.pop();
      if (!entry || entry.tUs > durationUs) break;
      if (samples) samples.until(entry.tUs);
      clock.advanceTo(entry.tUs);
      dispatch(target, entry);
      const checkpoint = clock.nowUs >= nextProgressUs;
      if (checkpoint) nextProgressUs = clock.nowUs + progressEveryUs;
      if (((++handled & 0xff) === 0 || checkpoint) && control.shouldStop?.()) return true;
      if (checkpoint) control.onProgress?.(Math.min(1, clock.nowUs / durationUs));
    }
    return false;
  }
}
