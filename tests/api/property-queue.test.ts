import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRunPool } from '../../server/runner/pool.ts';
import { loadEnv } from '../../server/config/env.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/**
 * The property sandbox's fair queue through the API: a QA engineer's two endless property vectors
 * and an engineer's short one. The short run finishes while the first run is still going (one
 * running property per user), `GET /api/properties/queue` shows each caller where their
 * properties stand without naming anyone else, and only an admin sees how the child is isolated
 * (there and in `GET /api/health`).
 */

let t: TestApp;
const TIMEOUT_MS = 4_000;

function propertyVector(id: string, code: string) {
  return { vector: 1, id, title: `Queue check ${id}`, tags: ['queue'], ref: 'common practice', kind: 'property', input: { code, runs: 50, seed: 1 }, expect: { holds: true } };
}

const endless = 'export default ({ fc }) => fc.property(fc.constant(0), () => { for (;;) {} });\n';
const short = 'export default ({ fc }) => fc.property(fc.integer(), (n) => n === n);\n';

beforeAll(async () => {
  // One worker thread, as on a 2-core machine; the sandbox still checks two properties at once.
  t = await createTestApp({ runPool: createRunPool({ maxThreads: 1, timeoutMs: TIMEOUT_MS }) });
  const qa = await t.signInAs('qa');
  for (const vector of [propertyVector('property/queue/endless-1', endless), propertyVector('property/queue/endless-2', endless), propertyVector('property/queue/short', short)]) {
    const created = await qa.post('/api/vectors').send(vector);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
  }
}, 60_000);

afterAll(() => t.close());

describe('the property queue', () => {
  it("a second user's short run finishes while the first user's endless properties wait their turn", async () => {
    const qa = await t.signInAs('qa');
    const engineer = await t.signInAs('engineer');
    const admin = await t.signInAs('admin');

    const started = await qa.post('/api/runs/start').send({ ids: ['property/queue/endless-1', 'property/queue/endless-2'] });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    const runId = started.body.run.id as number;

    let mine = await qa.get('/api/properties/queue');
    for (let tries = 0; mine.body.yours?.running !== 1 && tries < 200; tries++) mine = await qa.get('/api/properties/queue');
    expect(mine.status).toBe(200);
    expect(mine.body).toMatchObject({
      mode: expect.stringMatching(/^(bubblewrap|fallback)$/),
      limits: { timeoutMs: TIMEOUT_MS, heapMb: 512, addressSpaceMb: 1536, cpuSeconds: 7, atOnce: 2, perUser: 1 },
      running: 1,
      waiting: 1,
      users: 1,
      yours: { running: 1, waiting: [{ position: 1, ahead: 0, aheadYours: 0 }] },
    });
    expect(mine.body.isolation).toBeUndefined();

    const quick = await engineer.post('/api/runs/start').send({ ids: ['property/queue/short'], wait: true });
    expect(quick.status, JSON.stringify(quick.body)).toBe(201);
    expect(quick.body.run).toMatchObject({ status: 'done', passed: 1, failed: 0 });
    // The first user's run has not finished: the short one did not wait behind it.
    expect((await qa.get(`/api/runs/${runId}`)).body.run.status).toBe('running');

    const asAdmin = await admin.get('/api/properties/queue');
    expect(asAdmin.body.yours).toEqual({ running: 0, waiting: [] });
    expect(asAdmin.body.isolation).toMatchObject({ mode: asAdmin.body.mode, diesWithParent: true });
    if (asAdmin.body.mode === 'bubblewrap') expect(asAdmin.body.isolation).toMatchObject({ fallbackReason: null, network: 'isolated', pidNamespace: true, files: 'minimal' });

    const health = await admin.get('/api/health');
    expect(health.body.sandbox).toEqual({ ok: true, kind: asAdmin.body.mode, ...(asAdmin.body.isolation.fallbackReason ? { message: asAdmin.body.isolation.fallbackReason } : {}) });
    expect((await t.request().get('/api/health')).body.sandbox).toBeUndefined();
    expect((await engineer.get('/api/health')).body.sandbox).toBeUndefined();

    let run = (await qa.get(`/api/runs/${runId}`)).body;
    for (let tries = 0; run.run.status === 'running' && tries < 400; tries++) {
      await new Promise((resolve) => setTimeout(resolve, 50));
      run = (await qa.get(`/api/runs/${runId}`)).body;
    }
    expect(run.run).toMatchObject({ status: 'done', failed: 2 });
    for (const result of run.results) expect(result.message).toContain(`property timed out after ${TIMEOUT_MS / 1_000} s`);
  }, 60_000);

  it('support and viewer do not see the queue', async () => {
    for (const role of ['support', 'viewer'] as const) expect((await (await t.signInAs(role)).get('/api/properties/queue')).status).toBe(403);
  });
});

describe('PARLEY_SANDBOX', () => {
  it('forces the fallback launcher, and the mode says why', async () => {
    const env = loadEnv({ PARLEY_SANDBOX: 'fallback' });
    const pool = createRunPool({ maxThreads: 1, sandboxMode: env.PARLEY_SANDBOX });
    const status = await pool.sandboxStatus!('user:1');
    await pool.close();
    expect(status.info).toMatchObject({ mode: 'fallback', fallbackReason: 'PARLEY_SANDBOX=fallback' });
    expect(() => loadEnv({ PARLEY_SANDBOX: 'docker' })).toThrow(/PARLEY_SANDBOX/);
  }, 60_000);
});
