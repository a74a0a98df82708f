import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRunPool, type RunPool } from '../../server/runner/pool.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/**
 * Property vectors run by the server (`POST /api/runs/start`) go to the property sandbox, a child
 * process under Node's permission model: a shipped property still passes with the CLI's verdict,
 * one that reaches for the data folder, writes a file or starts a process fails with a clear
 * message while the server keeps serving, and one stuck in a loop fails at the timeout.
 */

const repo = resolve(import.meta.dirname, '../..');
const shippedText = readFileSync(join(repo, 'vectors/property/rules/max-power-above-60w-draws-over-3a.vector.json'), 'utf8');
const shippedHolds = readFileSync(join(repo, 'vectors/property/sink-policy/never-requests-more-than-offered.vector.json'), 'utf8');

let t: TestApp;
let dataDir: string;
let secretPath: string;
const secret = 'secret-of-the-sandbox-api-test';

function propertyVector(id: string, predicateBody: string, extra: { runs?: number } = {}) {
  return {
    vector: 1,
    id,
    title: `Sandbox check ${id}`,
    tags: ['sandbox'],
    ref: 'common practice',
    kind: 'property',
    input: { code: `export default ({ fc }) => fc.property(fc.constant(0), () => { ${predicateBody}; return true; });\n`, runs: extra.runs ?? 1, seed: 1 },
    expect: { holds: true },
  };
}

/** The app's run pool, whose limits a test may change by swapping the pool behind it. */
let current: RunPool | undefined;
const switchable: RunPool = {
  run: (task) => current!.run(task),
  runBatch: (tasks) => current!.runBatch!(tasks),
  close: async () => current?.close(),
};
async function replaceRunPool(pool: RunPool): Promise<void> {
  const old = current;
  current = pool;
  await old?.close();
}

beforeAll(async () => {
  // A data folder like PARLEY_DATA: the session secret (0600) next to the database.
  dataDir = mkdtempSync(join(tmpdir(), 'parley-data-'));
  secretPath = join(dataDir, 'secret');
  writeFileSync(secretPath, secret, { mode: 0o600 });
  chmodSync(dataDir, 0o755);
  // Generous for a shared machine; the timeout test below switches to a pool of its own.
  t = await createTestApp({ runPool: switchable });
  await replaceRunPool(createRunPool({ maxThreads: 1, timeoutMs: 30_000 }));
  const engineer = await t.signInAs('engineer');
  const fs = "process.getBuiltinModule('node:fs')";
  const hostile = [
    propertyVector('property/sandbox/read-secret', `const text = ${fs}.readFileSync(${JSON.stringify(secretPath)}, 'utf8'); throw new Error('read: ' + text)`),
    propertyVector('property/sandbox/write-file', `${fs}.writeFileSync(${JSON.stringify(join(dataDir, 'planted.txt'))}, 'x')`),
    propertyVector('property/sandbox/spawn', `process.getBuiltinModule('node:child_process').execFileSync('/bin/sh', ['-c', 'echo x > ${join(dataDir, 'spawned.txt')}'])`),
    propertyVector('property/sandbox/loop', 'for (;;) {}'),
    // Holds only outside this process: proof that the server did not evaluate the code itself.
    propertyVector('property/sandbox/elsewhere', `if (process.pid === ${process.pid}) throw new Error('ran in the server process')`),
  ];
  for (const vector of [JSON.parse(shippedText), JSON.parse(shippedHolds), ...hostile]) {
    const created = await engineer.post('/api/vectors').send(vector);
    expect(created.status, JSON.stringify(created.body)).toBe(201);
  }
}, 60_000);

afterAll(async () => {
  await t.close();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('property vectors in a server run', () => {
  it('shipped property vectors pass (one expects a counterexample), in another process', async () => {
    const qa = await t.signInAs('qa');
    const ids = ['property/rules/max-power-above-60w-draws-over-3a', 'property/sink-policy/never-requests-more-than-offered', 'property/sandbox/elsewhere'];
    const run = await qa.post('/api/runs/start').send({ ids, wait: true });
    expect(run.status, JSON.stringify(run.body)).toBe(201);
    expect(run.body.run, JSON.stringify(run.body.results)).toMatchObject({ status: 'done', total: 3, passed: 3, failed: 0 });
  }, 60_000);

  it('code that reads the data folder, writes a file or starts a process fails clearly; the server is unharmed', async () => {
    const qa = await t.signInAs('qa');
    const ids = ['property/sandbox/read-secret', 'property/sandbox/write-file', 'property/sandbox/spawn'];
    const run = await qa.post('/api/runs/start').send({ ids, wait: true });
    expect(run.status, JSON.stringify(run.body)).toBe(201);
    expect(run.body.run).toMatchObject({ status: 'done', total: 3, passed: 0, failed: 3 });
    const results = run.body.results as { vectorId: string; ok: boolean; message: string }[];
    expect(results.map((r) => r.vectorId).sort()).toEqual([...ids].sort());
    for (const result of results) {
      expect(result.message).toContain('Access to this API has been restricted (property code runs in a sandbox without access to files, processes, workers, signals or the network)');
      expect(result.message).not.toContain(secret);
    }
    expect(JSON.stringify(run.body)).not.toContain(secret);
    expect(readFileSync(secretPath, 'utf8')).toBe(secret);
    expect(existsSync(join(dataDir, 'planted.txt'))).toBe(false);
    expect(existsSync(join(dataDir, 'spawned.txt'))).toBe(false);
    // Still serving, and the stored results read back.
    const detail = await qa.get(`/api/runs/${run.body.run.id as number}`);
    expect(detail.status).toBe(200);
    expect(detail.body.run).toMatchObject({ failed: 3 });
  }, 60_000);

  it('a property stuck in a loop fails at the timeout, and the next run works', async () => {
    await replaceRunPool(createRunPool({ maxThreads: 1, timeoutMs: 2_000 }));
    const qa = await t.signInAs('qa');
    const stuck = await qa.post('/api/runs/start').send({ ids: ['property/sandbox/loop'], wait: true });
    expect(stuck.status).toBe(201);
    expect(stuck.body.run).toMatchObject({ status: 'done', failed: 1 });
    expect(stuck.body.results[0].message).toBe('input.code: property timed out after 2 s');
    await replaceRunPool(createRunPool({ maxThreads: 1, timeoutMs: 30_000 }));
    const next = await qa.post('/api/runs/start').send({ ids: ['property/sink-policy/never-requests-more-than-offered'], wait: true });
    expect(next.body.run).toMatchObject({ status: 'done', passed: 1 });
  }, 60_000);
});
