import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCaptured } from '../test-io.ts';

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'parley-sweep-'));
  // Kestrel Devices K27: 5 V 3 A, 9 V 3 A; the sink asks 9 V 2 A.
  writeFileSync(
    join(dir, '9v.json'),
    JSON.stringify({ source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 5_000, seed: 3 }),
  );
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const cli = (...argv: string[]) => runCaptured(argv, { cwd: dir });

const junitNames = (file: string) => [...readFileSync(join(dir, file), 'utf8').matchAll(/<testcase [^>]*name="([^"]+)"/g)].map((m) => m[1]!);

describe('parley sweep', () => {
  it('sweeps a 9 V SPR scenario: ≥ 3 × the messages in runs, every invariant held, exit 0', async () => {
    const r = await cli('sweep', '9v.json', '--json');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout) as {
      ok: boolean;
      runs: number;
      brokenCount: number;
      messages: unknown[];
      outcomes: { outcome: string; runs: number; example: { run: string } }[];
      broken: unknown[];
    };
    expect(doc).toMatchObject({ ok: true, brokenCount: 0, broken: [] });
    expect(doc.messages).toHaveLength(8);
    expect(doc.runs).toBeGreaterThanOrEqual(3 * doc.messages.length);
    expect(doc.outcomes[0]).toMatchObject({ outcome: 'same-power', example: { run: 'fault-free' } });
    const people = await cli('sweep', '9v.json');
    expect(people.stdout).toContain('Every invariant held in every run');
  });

  it('--shard 1/2 and 2/2 cover exactly the runs of the campaign (one JUnit case a run)', async () => {
    const whole = await cli('sweep', '9v.json', '--timers', 'edges', '--junit', 'all.xml');
    const first = await cli('sweep', '9v.json', '--timers', 'edges', '--shard', '1/2', '--junit', 'one.xml');
    const second = await cli('sweep', '9v.json', '--timers', 'edges', '--shard', '2/2', '--junit', 'two.xml');
    expect([whole.code, first.code, second.code]).toEqual([0, 0, 0]);
    const all = junitNames('all.xml');
    const halves = [...junitNames('one.xml'), ...junitNames('two.xml')];
    expect(all.length).toBeGreaterThan(50);
    expect(new Set(halves).size).toBe(halves.length);
    expect(halves.sort()).toEqual([...all].sort());
  });

  it('gives the same runs from worker threads as from one thread', async () => {
    const one = JSON.parse((await cli('sweep', '9v.json', '--max', '20', '--json', '--workers', '1')).stdout) as unknown;
    const two = JSON.parse((await cli('sweep', '9v.json', '--max', '20', '--json', '--workers', '2')).stdout) as unknown;
    expect(two).toEqual(one);
  }, 60_000);

  it('writes a shrunk vector for each broken run under --out and exits 1', async () => {
    // Kestrel Devices K60 whose supply slews 34 mV/ms: 5 → 20 V takes ~470 ms, past tPSTransition's
    // 450 ms minimum, so the run with that timer at its minimum breaks an invariant (the source is too slow).
    writeFileSync(
      join(dir, 'slow.json'),
      JSON.stringify({
        source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c', '0x0006412c'] }, behaviour: { slewMvPerMs: 34 } },
        sink: { policy: { kind: 'max-power' } },
        durationMs: 8_000,
        seed: 3,
      }),
    );
    const r = await cli('sweep', 'slow.json', '--faults', 'drop', '--timers', 'edges', '--out', 'out', '--json');
    expect(r.code).toBe(1);
    const doc = JSON.parse(r.stdout) as { ok: boolean; broken: { run: string; invariant: string; vector?: string }[] };
    const edge = doc.broken.find((b) => b.run === 'tPSTransition=min');
    expect(edge?.vector).toMatch(/^out\/.+\.vector\.json$/);
    const vector = JSON.parse(readFileSync(join(dir, edge!.vector!), 'utf8')) as Record<string, unknown>;
    expect(vector).toMatchObject({ kind: 'negotiation', tags: ['sweep'], expect: { invariants: [edge!.invariant] }, input: { scenario: { timers: { tPSTransition: 'min' }, faults: [] } } });
    expect(readdirSync(join(dir, 'out')).length).toBe(doc.broken.filter((b) => b.vector).length);
    // The saved vector fails for the same reason the run broke.
    const rerun = await cli('run', edge!.vector!);
    expect(rerun.code).toBe(1);
  }, 60_000);
});
