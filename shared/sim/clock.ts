/**
 * The simulator's injected clock: time in integer microseconds that only moves forward. The runner
 * owns it; actors never read a wall clock.
 */
export interface SimClock {
  readonly nowUs: number;
  /** Moves to `tUs`; a time in the past leaves the clock where it is (time never runs backwards). */
  advanceTo(tUs: number): number;
}

class ForwardClock implements SimClock {
  constructor(public nowUs: number) {}
  advanceTo(tUs: number): number {
    if (tUs > this.nowUs) this.nowUs = tUs;
    return this.nowUs;
  }
}

export function createClock(startUs = 0): SimClock {
  return new ForwardClock(startUs);
}
