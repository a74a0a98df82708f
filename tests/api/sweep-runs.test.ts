import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app.ts';
import { MAX_SERVER_SWEEP_RUNS } from '../../shared/api/index.ts';
import { INVARIANT_IDS } from '../../shared/sweep/index.ts';

/**
 * Fault sweeps run on the server for the team (`POST /api/runs/sweep`): a run of kind `sweep`
 * beside vector runs, with the same progress stream and results. The 9 V SPR scenario (Kestrel
 * Devices K27: 5 V 3 A, 9 V 3 A; a sink asking 9 V 2 A) holds every invariant; a 45 W source with
 * no 9 V offer breaks `analyser.explained` in every run, since the Power Rules require 9 V of it
 * (USB PD R3.2 V1.1 §10.2.3, Table 10.2; from memory) and no wire fault explains an offer.
 */

const nineVolt = { source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 2_000, seed: 3 };
const noNineVolt = { source: { caps: { pdos: ['0x0001912c', '0x0004b12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 15_000, currentMa: 3_000 } }, durationMs: 2_000, seed: 5 };

// The 140 W EPR library vector's scenario (Kestrel Devices K140 and a 28 V 5 A sink), ten seconds of keep-alives.
const eprTenSeconds = (JSON.parse(readFileSync(new URL('../../vectors/negotiation/epr/140w-keepalive-ten-seconds.vector.json', import.meta.url), 'utf8')) as { input: { scenario: unknown } }).input
  .scenario;

let t: TestApp;

interface SseEvent {
  event: string;
  data: Record<string, unknown>;
}

function parseSse(text: string): SseEvent[] {
  return text
    .split('\n\n')
    .map((block) => block.split('\n'))
    .filter((lines) => lines.some((l) => l.startsWith('data: ')))
    .map((lines) => ({ event: lines.find((l) => l.startsWith('event: '))!.slice(7), data: JSON.parse(lines.find((l) => l.startsWith('data: '))!.slice(6)) as Record<string, unknown> }));
}

beforeAll(async () => {
  t = await createTestApp();
}, 30_000);
afterAll(async () => {
  await t.close();
});

describe('a fault sweep run on the server', () => {
  it('runs the 9 V SPR campaign off the request thread, streams progress and holds every invariant', async () => {
    const engineer = await t.signInAs('engineer');
    const started = await engineer.post('/api/runs/sweep').send({ scenario: nineVolt, timerEdges: true, project: 'k27-firmware' });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    const run = started.body.run as Record<string, unknown>;
    // 8 messages: 1 fault-free + 8 drop + 8 corrupt + 2 × 4 delays = 25, plus the timer edges.
    expect(run).toMatchObject({ kind: 'sweep', status: 'running', project: 'k27-firmware', source: 'ui', selection: 'fault sweep: drop, corrupt, delay; timer edges' });
    expect(run.total as number).toBeGreaterThan(25);
    expect((run.sweep as { messages: number }).messages).toBe(8);

    const stream = await engineer
      .get(`/api/runs/${run.id}/events`)
      .buffer(true)
      .parse((res, done) => {
        let text = '';
        res.on('data', (c: Buffer) => (text += c.toString('utf8')));
        res.on('end', () => done(null, text));
      });
    const events = parseSse(stream.body as string);
    expect(events.at(-1)).toMatchObject({ event: 'done', data: { status: 'done', done: run.total, total: run.total, passed: run.total, failed: 0 } });

    const detail = await engineer.get(`/api/runs/${run.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.results).toEqual([]);
    const sweep = detail.body.run.sweep as { outcomes: { outcome: string; runs: number; example: { run: string } }[]; invariants: { id: string; explanation: string }[]; broken: number };
    expect(sweep.broken).toBe(0);
    expect(sweep.invariants.map((i) => i.id)).toEqual(INVARIANT_IDS);
    expect(sweep.invariants.every((i) => i.explanation.length > 20)).toBe(true);
    expect(sweep.outcomes.reduce((sum, o) => sum + o.runs, 0)).toBe(run.total);
    expect(sweep.outcomes.find((o) => o.outcome === 'same-power')?.example.run).toBe('fault-free');

    const list = await engineer.get('/api/runs?project=k27-firmware');
    expect(list.body.items[0]).toMatchObject({ id: run.id, kind: 'sweep', status: 'done' });
  });

  it('stores each broken run with its evidence and a shrunk negotiation vector', async () => {
    const qa = await t.signInAs('qa');
    const res = await qa.post('/api/runs/sweep').send({ scenario: noNineVolt, kinds: ['drop'], wait: true });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // 8 messages × drop + the fault-free run; every one reports the missing 9 V offer.
    expect(res.body.run).toMatchObject({ kind: 'sweep', status: 'done', total: 9, done: 9, passed: 0, failed: 9, newFailures: 0 });
    const results = res.body.results as Record<string, unknown>[];
    expect(results).toHaveLength(9);
    const faultFree = results.find((r) => r.vectorId === 'sweep/fault-free')!;
    expect(faultFree).toMatchObject({ ok: false, kind: 'sweep', title: 'no fault', inLibrary: false, expected: { invariants: ['analyser.explained'] } });
    expect(String(faultFree.message)).toMatch(/^analyser\.explained: the analyser reports caps\.power-rules-missing/);
    expect(faultFree.counterexampleVector).toMatchObject({ kind: 'negotiation', tags: ['sweep'], expect: { invariants: ['analyser.explained'] } });
    const vectors = results.filter((r) => r.counterexampleVector !== undefined);
    expect(vectors.length).toBeGreaterThan(0);
  });

  it('checks roles and refuses bad input with a clear message', async () => {
    for (const role of ['viewer', 'support'] as const) {
      const agent = await t.signInAs(role);
      const res = await agent.post('/api/runs/sweep').send({ scenario: nineVolt });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('role.forbidden');
    }
    expect((await t.request().post('/api/runs/sweep').send({ scenario: nineVolt })).status).toBe(401);

    const engineer = await t.signInAs('engineer');
    const cases: [unknown, number, string, RegExp][] = [
      [{}, 400, 'input.invalid', /scenario/],
      [{ scenario: nineVolt, kinds: ['melt'] }, 400, 'input.invalid', /kinds/],
      [{ scenario: nineVolt, kinds: ['drop', 'drop'] }, 400, 'input.invalid', /once/],
      [{ scenario: nineVolt, max: MAX_SERVER_SWEEP_RUNS + 1 }, 400, 'input.invalid', /max/],
      [{ scenario: nineVolt, runAs: 'admin' }, 400, 'input.invalid', /runAs/],
      [{ scenario: { source: { caps: { pdos: ['zz'] } } } }, 400, 'input.invalid', /^scenario/],
      [{ scenario: { ...nineVolt, durationMs: 1 } }, 400, 'sweep.unplannable', /no messages/],
      // Every pair of an 8-message run is a few hundred runs; of ten seconds of EPR keep-alives, tens of thousands.
      [{ scenario: eprTenSeconds, pairs: true }, 400, 'sweep.too-many-runs', /^max: this campaign has [\d,]+ runs .*at most 20,000/],
    ];
    for (const [body, status, code, message] of cases) {
      const res = await engineer.post('/api/runs/sweep').send(body as object);
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body.error.code).toBe(code);
      expect(res.body.error.message).toMatch(message);
      expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
    }
  });
});
