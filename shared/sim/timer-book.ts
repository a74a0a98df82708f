/**
 * The runner's running timers: one per (layer, name), each with a generation so that an expiry
 * scheduled before a stop or restart is recognised as stale, and a span for the timeline.
 */
import type { TimerName } from '../core/timers.ts';
import type { Side, TimerSpan } from './types.ts';

interface Running {
  gen: number;
  span: TimerSpan;
}

export class TimerBook {
  readonly spans: TimerSpan[] = [];
  /** By layer, then timer name (plain objects: this is the hot path). */
  private readonly running: Record<string, Partial<Record<TimerName, Running>>> = {};
  private gen = 0;

  private layer(layer: string): Partial<Record<TimerName, Running>> {
    const running = this.running[layer] ?? {};
    this.running[layer] = running;
    return running;
  }

  /** Starts (or restarts) a timer; returns the generation its expiry entry must carry. */
  start(layer: string, side: Side, name: TimerName, startUs: number, durationUs: number): number {
    this.stop(layer, name, startUs);
    const span: TimerSpan = { name, side, startUs, endUs: startUs + durationUs, expired: false };
    const gen = ++this.gen;
    this.layer(layer)[name] = { gen, span };
    this.spans.push(span);
    return gen;
  }

  stop(layer: string, name: TimerName, nowUs: number): void {
    const timers = this.running[layer];
    const timer = timers?.[name];
    if (!timer) return;
    timer.span.endUs = Math.max(timer.span.startUs, nowUs);
    timers[name] = undefined;
  }

  isRunning(layer: string, name: TimerName): boolean {
    return this.running[layer]?.[name] !== undefined;
  }

  /** Stops every timer of a layer (a reset). */
  stopLayer(layer: string, nowUs: number): void {
    const timers = this.running[layer];
    if (!timers) return;
    for (const name of Object.keys(timers) as TimerName[]) this.stop(layer, name, nowUs);
  }

  /** True when the expiry is current: the timer is marked expired and forgotten. */
  expire(layer: string, name: TimerName, gen: number): boolean {
    const timers = this.running[layer];
    const timer = timers?.[name];
    if (!timer || timer.gen !== gen) return false;
    timer.span.expired = true;
    timers[name] = undefined;
    return true;
  }

  /** At the end of a run: spans still running end at `nowUs`. */
  close(nowUs: number): void {
    for (const timers of Object.values(this.running)) {
      for (const timer of Object.values(timers)) if (timer) timer.span.endUs = Math.min(timer.span.endUs, nowUs);
    }
  }
}
