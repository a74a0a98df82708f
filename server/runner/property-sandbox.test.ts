import { chmodSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkProperty, engine, runVectorText, toJsonSafe } from '../../shared/vectors/index.ts';
import { createPropertySandbox, type PropertySandbox } from './property-sandbox.ts';

/**
 * The property sandbox: shipped property vectors give the same verdict and counterexample as the
 * in-process checker the CLI and the browser use, and code that reaches for the server's files,
 * processes, workers, signals or network is stopped with a clear message. Each attack runs three
 * times: with every layer (bubblewrap where this machine has it), with the fallback launcher, and
 * with the permission model alone (so the test does not pass only because a root server's child
 * runs as `nobody` or sees no host files). ./sandbox-escape.test.ts holds what escaped before.
 */

const repo = resolve(import.meta.dirname, '../..');
const shipped = readdirSync(join(repo, 'vectors/property'), { recursive: true, encoding: 'utf8' })
  .filter((name) => name.endsWith('.vector.json'))
  .sort()
  .map((name) => readFileSync(join(repo, 'vectors/property', name), 'utf8'));

let dataDir: string;
let secretPath: string;
let full: PropertySandbox;
let permissionOnly: PropertySandbox;
let fallback: PropertySandbox;

beforeAll(async () => {
  // A stand-in for PARLEY_DATA: the session secret (0600, as the server writes it) and the database.
  dataDir = mkdtempSync(join(tmpdir(), 'parley-data-'));
  secretPath = join(dataDir, 'secret');
  writeFileSync(secretPath, 'secret-for-the-sandbox-test', { mode: 0o600 });
  writeFileSync(join(dataDir, 'parley.sqlite'), 'not really a database');
  chmodSync(dataDir, 0o755);
  full = createPropertySandbox({ timeoutMs: 20_000, maxConcurrent: 2 });
  permissionOnly = createPropertySandbox({ timeoutMs: 20_000, maxConcurrent: 2, layers: 'permission-only' });
  fallback = createPropertySandbox({ timeoutMs: 20_000, maxConcurrent: 2, mode: 'fallback' });
}, 60_000);

afterAll(async () => {
  await full.close();
  await permissionOnly.close();
  await fallback.close();
  rmSync(dataDir, { recursive: true, force: true });
});

const property = (body: string, atLoad = ''): string => `${atLoad}\nexport default ({ fc }) => fc.property(fc.constant(0), () => { ${body}; return true; });`;
const without = ({ durationMs: _durationMs, ...rest }: { durationMs?: number }) => rest;

describe("the sandbox gives the checker's own results", () => {
  it('every shipped property vector: same verdict, counterexample and shrink path as in process', async () => {
    expect(shipped.length).toBeGreaterThanOrEqual(6);
    for (const text of shipped) {
      const inline = toJsonSafe(await runVectorText(text, 'x')) as Record<string, unknown>;
      const boxed = toJsonSafe(await runVectorText(text, 'x', { checkProperty: (code, job) => full.check(code, job) })) as Record<string, unknown>;
      const { durationMs: _a, property: inlineProperty, ...inlineRest } = inline;
      const { durationMs: _b, property: boxedProperty, ...boxedRest } = boxed;
      expect(boxedRest, String(inline.id)).toEqual(inlineRest);
      expect(without(boxedProperty as { durationMs?: number })).toEqual(without(inlineProperty as { durationMs?: number }));
      expect(boxed.ok, `${String(boxed.id)}: ${String(boxed.message)}`).toBe(true);
    }
  }, 120_000);

  it('a failing property shrinks to the same counterexample (seed 42)', async () => {
    const code = 'export default ({ fc }) => fc.property(fc.integer(), (n) => n < 1000);';
    const inline = await checkProperty(code, { runs: 100, seed: 42 }, engine);
    const boxed = await full.check(code, { runs: 100, seed: 42 });
    expect(without(boxed)).toEqual(without(inline));
    expect(boxed).toMatchObject({ holds: false, counterexample: [1000] });
  });
});

describe.each([
  ['every layer', () => full],
  ['the fallback launcher (PARLEY_SANDBOX=fallback)', () => fallback],
  ['the permission model alone', () => permissionOnly],
])('code that reaches out, with %s', (_name, sandbox) => {
  const denied = /Access to this API has been restricted \(property code runs in a sandbox/;

  it("cannot read the data folder's secret or database, nor the repository", async () => {
    for (const path of [secretPath, join(dataDir, 'parley.sqlite'), join(repo, 'package.json')]) {
      const atLoad = await sandbox().check(property('', `process.getBuiltinModule('node:fs').readFileSync(${JSON.stringify(path)}, 'utf8');`), { runs: 1, seed: 1 });
      expect(atLoad.error?.code).toBe('property.load');
      expect(atLoad.error?.message).toMatch(denied);
      const inPredicate = await sandbox().check(property(`process.getBuiltinModule('node:fs').readdirSync(${JSON.stringify(dataDir)})`), { runs: 1, seed: 1 });
      expect(inPredicate).toMatchObject({ holds: false });
      expect(inPredicate.failure).toMatch(denied);
    }
  });

  it('cannot write a file', async () => {
    const target = join(dataDir, 'planted.txt');
    const outcome = await sandbox().check(property(`process.getBuiltinModule('node:fs').writeFileSync(${JSON.stringify(target)}, 'x')`), { runs: 1, seed: 1 });
    expect(outcome.failure).toMatch(denied);
    expect(existsSync(target)).toBe(false);
  });

  it('cannot start a process or a worker', async () => {
    const marker = join(dataDir, 'spawned.txt');
    const spawned = await sandbox().check(property(`process.getBuiltinModule('node:child_process').execFileSync('/bin/sh', ['-c', 'echo x > ${marker}'])`), { runs: 1, seed: 1 });
    expect(spawned.failure).toMatch(denied);
    expect(existsSync(marker)).toBe(false);
    const worker = await sandbox().check(property(`new (process.getBuiltinModule('node:worker_threads').Worker)('1', { eval: true })`), { runs: 1, seed: 1 });
    expect(worker.failure).toMatch(denied);
  });

  it('cannot signal the server', async () => {
    const outcome = await sandbox().check(property(`process.kill(process.ppid, 'SIGTERM')`), { runs: 1, seed: 1 });
    expect(outcome.failure).toBe('process.kill is not available to a property (property code runs in a sandbox without access to files, processes, workers, signals or the network)');
    expect(process.pid).toBeGreaterThan(0);
  });

  it('sees an empty environment', async () => {
    const outcome = await sandbox().check(property(`if (Object.keys(process.env).length > 0) throw new Error('env: ' + Object.keys(process.env).join(','))`), { runs: 1, seed: 1 });
    expect(outcome, JSON.stringify(outcome)).toMatchObject({ holds: true });
  });
});

describe('limits', () => {
  it('a property stuck in a loop is killed at the timeout', async () => {
    const quick = createPropertySandbox({ timeoutMs: 1_500, maxConcurrent: 1 });
    const outcome = await quick.check(property('for (;;) {}'), { runs: 1, seed: 1 });
    await quick.close();
    expect(outcome.error).toEqual({ code: 'property.timeout', message: 'property timed out after 1.5 s' });
  });

  it('a property that eats memory stops at the heap limit', async () => {
    const small = createPropertySandbox({ timeoutMs: 20_000, maxConcurrent: 1, heapMb: 48 });
    const outcome = await small.check(property('const kept = []; for (;;) kept.push(new Array(100_000).fill(1))'), { runs: 1, seed: 1 });
    await small.close();
    expect(outcome.error).toEqual({ code: 'property.memory', message: 'the property went over its memory limit (48 MB of heap, 1072 MB of address space in all)' });
  });

  it('the bundle is the only readable file, and it is removed on close', async () => {
    const own = createPropertySandbox({ timeoutMs: 20_000, maxConcurrent: 1 });
    const { bundlePath } = await own.info();
    expect(existsSync(bundlePath)).toBe(true);
    expect(bundlePath.startsWith(tmpdir())).toBe(true);
    await own.close();
    expect(existsSync(bundlePath)).toBe(false);
  });

  // Node 20's permission model does not cover sockets: the child refuses them itself, and a network
  // namespace (bubblewrap, or `unshare` in the fallback) leaves it no network to reach anyway
  // (./sandbox-escape.test.ts tries that layer alone).
  it('has no network', async () => {
    let connections = 0;
    const server: Server = createServer((socket) => {
      connections += 1;
      socket.end();
    });
    await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
    const port = (server.address() as { port: number }).port;
    const code = `export default ({ fc }) => fc.asyncProperty(fc.constant(0), () => new Promise((ok, fail) => {
      const socket = process.getBuiltinModule('node:net').connect(${port}, '127.0.0.1', () => ok(true));
      socket.on('error', fail);
    }));`;
    const outcome = await full.check(code, { runs: 1, seed: 1 });
    await new Promise((done) => server.close(done));
    expect(outcome.holds).toBe(false);
    expect(outcome.failure).toMatch(/^sockets are not available to a property/);
    expect(connections).toBe(0);
  });
});
