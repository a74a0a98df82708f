import { describe, expect, it } from 'vitest';
import { createClock } from './clock.ts';
import { createRandom } from './random.ts';

describe('createRandom', () => {
  it('repeats for one seed and differs for another', () => {
    const a = createRandom(7);
    const b = createRandom(7);
    const c = createRandom(8);
    const draw = (r: ReturnType<typeof createRandom>) => Array.from({ length: 5 }, () => r.between(0, 1_000_000));
    const first = draw(a);
    expect(draw(b)).toEqual(first);
    expect(draw(c)).not.toEqual(first);
  });

  it('stays within inclusive bounds and reaches both ends', () => {
    const r = createRandom(1);
    const seen = new Set<number>();
    for (let i = 0; i < 2_000; i++) {
      const v = r.between(3, 6);
      expect(v).toBeGreaterThanOrEqual(3);
      expect(v).toBeLessThanOrEqual(6);
      seen.add(v);
    }
    expect([...seen].sort()).toEqual([3, 4, 5, 6]);
    expect(r.between(9, 9)).toBe(9);
  });
});

describe('createClock', () => {
  it('never runs backwards', () => {
    const clock = createClock();
    expect(clock.advanceTo(500)).toBe(500);
    expect(clock.advanceTo(200)).toBe(500);
    expect(clock.nowUs).toBe(500);
  });
});
