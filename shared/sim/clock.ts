/**
 * The simulator's injected clock: time in integer microseconds that only moves forward. The runner
 * owns it; actors never read a wall clock.
 */
export interface SimClock {
  readonly nowUs: number;
  /** Moves to `tUs`; a time in the past leaves the clock where it is (time never runs backwards). */
  advanceTo(tUs: number): number;
}

export function createClock(startUs = 0): SimClock {
  let nowUs = startUs;
  return {
    get nowUs() {
      return nowUs;
    },
    advanceTo(tUs) {
      if (tUs > nowUs) nowUs = tUs;
      return nowUs;
    },
  };
}
