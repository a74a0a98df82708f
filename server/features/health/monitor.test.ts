import { describe, expect, it } from 'vitest';
import { allHealthy, createHealthMonitor, type HealthParts } from './monitor.ts';

const healthy: HealthParts = { database: { ok: true, kind: 'sqlite' }, storage: { ok: true, kind: 'local' }, queue: { ok: true, kind: 'local' } };
const databaseDown: HealthParts = { ...healthy, database: { ok: false, kind: 'sqlite', message: 'the database is closed' } };

/** A check whose answers the test sets, counting its calls; after `hold()` the next one waits for `release()`. */
function scriptedCheck() {
  let answer = healthy;
  let held = false;
  let release: () => void = () => undefined;
  const state = {
    calls: 0,
    set: (parts: HealthParts) => (answer = parts),
    hold: () => (held = true),
    release: () => release(),
    check: async () => {
      state.calls += 1;
      const parts = answer;
      if (held) await new Promise<void>((resolve) => (release = resolve));
      return parts;
    },
  };
  return state;
}

describe('health monitor', () => {
  it('checks on the first request, then answers from that check while it is fresh', async () => {
    let nowMs = 0;
    const script = scriptedCheck();
    const monitor = createHealthMonitor(script.check, { freshMs: 1_000, staleMs: 5_000, nowMs: () => nowMs });
    expect(await monitor.parts()).toEqual(healthy);
    nowMs = 999;
    script.set(databaseDown);
    expect(await monitor.parts()).toEqual(healthy);
    expect(script.calls).toBe(1);
  });

  it('answers a stale result at once while one new check runs; the next request sees its failure', async () => {
    let nowMs = 0;
    const script = scriptedCheck();
    const monitor = createHealthMonitor(script.check, { freshMs: 1_000, staleMs: 5_000, nowMs: () => nowMs });
    await monitor.parts();
    nowMs = 1_500;
    script.set(databaseDown);
    script.hold();
    // Three probes while the check is pending: all answered from the last result, one check started.
    const answers = await Promise.all([monitor.parts(), monitor.parts(), monitor.parts()]);
    expect(answers).toEqual([healthy, healthy, healthy]);
    expect(script.calls).toBe(2);
    script.release();
    await new Promise((resolve) => setTimeout(resolve, 0));
    const after = await monitor.parts();
    expect(after).toEqual(databaseDown);
    expect(allHealthy(after)).toBe(false);
  });

  it('waits for a new check when the last one is older than the stale limit', async () => {
    let nowMs = 0;
    const script = scriptedCheck();
    const monitor = createHealthMonitor(script.check, { freshMs: 1_000, staleMs: 5_000, nowMs: () => nowMs });
    await monitor.parts();
    nowMs = 5_000;
    script.set(databaseDown);
    expect(await monitor.parts()).toEqual(databaseDown);
    expect(script.calls).toBe(2);
  });

  it('a check that throws fails the waiting request and leaves the next one to check again', async () => {
    let calls = 0;
    const monitor = createHealthMonitor(async () => {
      calls += 1;
      if (calls === 1) throw new Error('storage unreachable');
      return healthy;
    });
    await expect(monitor.parts()).rejects.toThrow('storage unreachable');
    expect(await monitor.parts()).toEqual(healthy);
  });
});
