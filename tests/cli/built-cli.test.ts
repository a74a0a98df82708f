import { execFileSync, spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const repo = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

// The bundle is built into a folder with no node_modules beside it: if it still needed tsx or any
// package at run time, these commands would fail to resolve it.
describe('the built CLI (cli/build.mjs)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'parley-cli-'));
  const bin = join(dir, 'build', 'parley.mjs');
  const run = (...args: string[]) => spawnSync(process.execPath, [bin, ...args], { cwd: repo, encoding: 'utf8', timeout: 60_000 });

  beforeAll(() => {
    execFileSync(process.execPath, [join(repo, 'cli', 'build.mjs'), join(dir, 'build')], { cwd: repo });
    copyFileSync(join(repo, 'package.json'), join(dir, 'package.json'));
  }, 120_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('decodes a message and reports its version', () => {
    const decoded = run('decode', '4100', '--json');
    expect(decoded.status).toBe(0);
    expect(JSON.parse(decoded.stdout)).toMatchObject({ ok: true, message: { header: { messageType: 'GoodCRC' } } });
    expect(run('--version').stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });

  it('answers bad input with exit code 2 and one line, no stack', () => {
    const bad = run('decode', 'zz');
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain('is not a hex digit');
    expect(bad.stderr).not.toContain('    at ');
  });

  it('checks property vectors in its worker threads, with the engine from the bundle', () => {
    const result = run('run', 'vectors/property/codec/decode-never-throws.vector.json', '--json');
    expect(result.stderr).toBe('');
    expect(JSON.parse(result.stdout)).toMatchObject({ ok: true, passed: 1, failed: 0 });
  });
});
