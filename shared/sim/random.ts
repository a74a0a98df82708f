/**
 * A seeded pseudo-random generator (mulberry32: a 32-bit state, one multiply-xorshift round a
 * draw). Timing jitter comes only from here, so the same seed gives the same run.
 */
export interface Random {
  /** A float in [0, 1). */
  next(): number;
  /** An integer uniformly in [minInclusive, maxInclusive]. */
  between(minInclusive: number, maxInclusive: number): number;
}

/** A class, not closures: a run creates one, and the hot path calls it for every timer and delay. */
class Mulberry32 implements Random {
  private state: number;
  constructor(seed: number) {
    this.state = seed >>> 0;
  }
  next(): number {
    this.state = (this.state + 0x6d2b_79f5) >>> 0;
    let z = this.state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4_294_967_296;
  }
  between(minInclusive: number, maxInclusive: number): number {
    if (maxInclusive <= minInclusive) return minInclusive;
    return minInclusive + Math.floor(this.next() * (maxInclusive - minInclusive + 1));
  }
}

export function createRandom(seed: number): Random {
  return new Mulberry32(seed);
}
