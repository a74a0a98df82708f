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

export function createRandom(seed: number): Random {
  let state = seed >>> 0;
  function next(): number {
    state = (state + 0x6d2b_79f5) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4_294_967_296;
  }
  return {
    next,
    between(minInclusive, maxInclusive) {
      if (maxInclusive <= minInclusive) return minInclusive;
      return minInclusive + Math.floor(next() * (maxInclusive - minInclusive + 1));
    },
  };
}
