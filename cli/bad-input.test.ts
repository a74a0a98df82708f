/**
 * A bad-input sweep over every command of `commands` (docs/cli.md): hostile arguments
 * and files must give exit 2 (or 0/1 where the input is in fact valid), one stderr line
 * `parley <command>: …` with no stack trace, and under `--json` one `{"ok": false, "error"}` document.
 * The table is iterated, so a new command is covered without touching this file.
 */
import { execFile } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { commands, runCli } from './main.ts';
import { captureIo } from './test-io.ts';

const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const CASE_TIMEOUT_MS = 15_000;

// The six-offer Source_Capabilities of decode.test.ts (USB PD R3.2 V1.1 Table 6.1 and the source PDO tables).
const CAPS = 'a1612c9101082cd102002cc103002cb10400454106003c21dcc0';
const GOODCRC = '8100';

let dir = '';
const f = (name: string) => join(dir, name);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'parley-bad-input-'));
  mkdirSync(f('folder'));
  mkdirSync(f('vectors'));
  copyFileSync(join(repoRoot, 'vectors/caps/structure/order-fixed.vector.json'), f('vectors/order-fixed.vector.json'));
  // A vector with a long id, for globs that a backtracking matcher takes exponential time on.
  const long = JSON.parse(readFileSync(join(repoRoot, 'vectors/caps/structure/order-fixed.vector.json'), 'utf8')) as { id: string };
  writeFileSync(f('vectors/long-id.vector.json'), JSON.stringify({ ...long, id: `caps/${'a'.repeat(60)}` }));
  writeFileSync(f('empty.txt'), '');
  // A 9 V negotiation (Kestrel Devices K27), one with an unknown key, and one too short to attach.
  writeFileSync(
    f('scenario.json'),
    JSON.stringify({ source: { caps: { pdos: ['0x0001912c', '0x0002d12c'] } }, sink: { policy: { kind: 'fixed', voltageMv: 9_000, currentMa: 2_000 } }, durationMs: 2_000 }),
  );
  writeFileSync(f('bad-scenario.json'), JSON.stringify({ source: { caps: { pdos: ['0x0001912c'] } }, gremlins: 3 }));
  writeFileSync(f('short-scenario.json'), JSON.stringify({ source: { caps: { pdos: ['0x0001912c'] } }, durationMs: 1 }));
  writeFileSync(f('random.bin'), randomBytes(64 * 1024));
  writeFileSync(f('long-line.txt'), 'a'.repeat(5 * 1024 * 1024));
  // 0xc3 0x28 and a lone 0xff: not UTF-8.
  writeFileSync(f('bad-utf8.txt'), Buffer.from([0x7b, 0x22, 0xc3, 0x28, 0xff, 0xfe, 0x22, 0x3a, 0x31, 0x7d, 0x0a]));
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const fakeIo = () => captureIo({ cwd: dir });

async function runBounded(argv: string[]) {
  const { io, out } = fakeIo();
  let timer: ReturnType<typeof setTimeout> | undefined;
  const hang = new Promise<'hang'>((resolveHang) => (timer = setTimeout(() => resolveHang('hang'), CASE_TIMEOUT_MS - 2_000)));
  const code = await Promise.race([runCli(argv, io), hang]).finally(() => clearTimeout(timer));
  return { code, ...out };
}

/** The contract's shape of a failed or a successful run. */
function expectWellFormed(name: string, argv: string[], r: { code: number | 'hang'; stdout: string; stderr: string }, allowed: readonly number[]) {
  const label = `parley ${argv.map((a) => (a.length > 40 ? `${a.slice(0, 20)}…(${a.length})` : a)).join(' ')}`;
  expect(r.code, `${label}: exit code`).not.toBe('hang');
  expect(allowed, `${label}: exit ${r.code}, stderr ${r.stderr.slice(0, 300)}`).toContain(r.code);
  expect(r.stderr, `${label}: stack trace`).not.toMatch(/^\s+at /m);
  expect(r.stderr, `${label}: repository path`).not.toContain(repoRoot);
  const json = argv.includes('--json');
  if (r.code === 2) {
    expect(r.stderr, `${label}: one stderr line`).toMatch(new RegExp(`^parley ${name}: [^\\n]+\\n$`));
    expect(r.stderr.length, `${label}: stderr length`).toBeLessThan(1_000);
    if (json) {
      const doc = JSON.parse(r.stdout) as { ok: boolean; error: { code: unknown; message: unknown } };
      expect(doc.ok, label).toBe(false);
      expect(typeof doc.error.code, label).toBe('string');
      expect(typeof doc.error.message, label).toBe('string');
      // Anything but a CliError is a crash that main.ts caught.
      expect(doc.error.code, `${label}: ${String(doc.error.message)}`).not.toBe('cli.internal');
    } else {
      expect(r.stdout, `${label}: stdout on error`).toBe('');
    }
  } else if (json) {
    expect(() => JSON.parse(r.stdout), `${label}: one JSON document`).not.toThrow();
  }
}

type Case = { argv: string[]; allowed?: readonly number[] };

/** Hostile inputs every command gets (with and without --json). */
function genericCases(): Case[] {
  const files = ['missing.file', 'folder', 'empty.txt', 'random.bin', 'long-line.txt', 'bad-utf8.txt'];
  return [{ argv: [] }, { argv: ['--bogus'] }, { argv: ['--bogus=1'] }, { argv: ['-x'] }, ...files.map((file) => ({ argv: [file] }))];
}

/** Inputs aimed at one command's options. */
const specific: Record<string, Case[]> = {
  decode: [
    { argv: ['abc'] },
    { argv: ['zz00'] },
    { argv: ['0x'] },
    { argv: ['00'.repeat(10_000)] },
    { argv: ['a'.repeat(5 * 1024 * 1024)] },
    { argv: ['\u00ff\ud800'] },
    { argv: ['--words', 'junk'] },
    { argv: ['--words', '0x1234', '0x1ffffffff'] },
    { argv: ['--words', '-1'] },
    { argv: ['--words'] },
    { argv: [GOODCRC, '--sop', 'SOP3'] },
    { argv: [GOODCRC, '--sop'] },
    { argv: [GOODCRC, '--sop', 'SOP\nnext line'] },
    { argv: [GOODCRC, '--caps'] },
    { argv: [GOODCRC, '--caps', 'xyz'] },
    { argv: [GOODCRC, '--caps', GOODCRC] },
    { argv: [GOODCRC, '--crc'] },
    { argv: [GOODCRC], allowed: [0] },
  ],
  encode: [{ argv: ['-'] }, { argv: ['a', 'b'] }],
  wire: [
    { argv: ['nonsense'] },
    { argv: ['encode'] },
    { argv: ['encode', GOODCRC] },
    { argv: ['encode', GOODCRC, '--vcd'] },
    { argv: ['encode', GOODCRC, '--vcd', 'folder'] },
    { argv: ['encode', 'abc', '--vcd', 'out.vcd'] },
    { argv: ['encode', 'zz', '--vcd', 'out.vcd'] },
    { argv: ['encode', '00'.repeat(10_000), '--vcd', 'out.vcd'], allowed: [0, 2] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate', '0'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate', '-300000'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate', '1e400'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate', '99999999999999999999'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--gap-us', 'x'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--sop', 'SOP3'] },
    { argv: ['encode', 'SOP3:8100', '--vcd', 'out.vcd'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd', '--timescale', '3 ms'] },
    { argv: ['encode', GOODCRC, '--vcd', 'out.vcd'], allowed: [0] },
    ...['missing.file', 'folder', 'empty.txt', 'random.bin', 'long-line.txt', 'bad-utf8.txt'].map((file) => ({ argv: ['decode', file], allowed: [0, 2] })),
    { argv: ['decode', 'out.vcd', '--signal', 'nope'] },
    { argv: ['decode', 'a', 'b'] },
  ],
  caps: [
    { argv: ['abc'] },
    { argv: ['00'.repeat(10_000)] },
    { argv: [CAPS, '--cable', '1234'] },
    { argv: [CAPS, '--cable'] },
    { argv: [CAPS, '--pdp', '-5'] },
    { argv: [CAPS, '--pdp', '1e400'] },
    { argv: [CAPS, '--pdp'] },
    { argv: [CAPS, '--label', '%%%'], allowed: [0, 2] },
    { argv: ['--pdos', 'junk'] },
    { argv: ['--pdos', ','] },
    { argv: ['--pdos', '0x1ffffffff'] },
    { argv: ['--pdos', '0x0001912c', CAPS] },
    { argv: [CAPS], allowed: [0] },
  ],
  request: [
    { argv: ['--caps', 'abc', '--sink', '{"kind":"max-power"}'] },
    { argv: ['--caps', CAPS] },
    { argv: ['--caps', CAPS, '--sink'] },
    { argv: ['--caps', CAPS, '--sink', '{'] },
    { argv: ['--caps', CAPS, '--sink', '{"kind":"nonsense"}'] },
    { argv: ['--caps', CAPS, '--sink', 'folder'] },
    { argv: ['--caps', CAPS, '--sink', 'random.bin'] },
    { argv: ['--caps', CAPS, '--sink', 'missing.file'] },
    { argv: ['--caps', CAPS, '--sink', '{"kind":"max-power"}', '--cable', '1234'] },
    { argv: ['--caps', GOODCRC, '--sink', '{"kind":"max-power"}'] },
    { argv: ['--caps', CAPS, '--sink', '{"kind":"max-power"}'], allowed: [0] },
  ],
  simulate: [{ argv: ['-'] }, { argv: ['empty.txt', '--sample-every-us', 'x'] }, { argv: ['empty.txt', '--trace'] }, { argv: ['a', 'b'] }],
  sweep: [
    { argv: ['-'] },
    { argv: ['a', 'b'] },
    { argv: ['scenario.json', '--faults'] },
    { argv: ['scenario.json', '--faults', ''] },
    { argv: ['scenario.json', '--faults', 'drop,explode'] },
    { argv: ['scenario.json', '--faults', ','.repeat(5_000)] },
    { argv: ['scenario.json', '--timers', 'sometimes'] },
    { argv: ['scenario.json', '--max', '0'] },
    { argv: ['scenario.json', '--max', '-5'] },
    { argv: ['scenario.json', '--max', '1e400'] },
    { argv: ['scenario.json', '--max', '99999999999999999999'] },
    { argv: ['scenario.json', '--max'] },
    { argv: ['scenario.json', '--seed', 'x'] },
    { argv: ['scenario.json', '--shard', '0/2'] },
    { argv: ['scenario.json', '--shard', '3/2'] },
    { argv: ['scenario.json', '--shard', '1/0'] },
    { argv: ['scenario.json', '--shard', 'half'] },
    { argv: ['scenario.json', '--shard', '1/2/3'] },
    { argv: ['scenario.json', '--shard'] },
    { argv: ['scenario.json', '--workers', '0'] },
    { argv: ['scenario.json', '--workers', '100000'] },
    { argv: ['scenario.json', '--junit'] },
    { argv: ['scenario.json', '--junit', 'folder', '--max', '2'] },
    { argv: ['scenario.json', '--out', 'empty.txt', '--faults', 'drop', '--max', '2'], allowed: [0, 2] },
    { argv: ['bad-scenario.json'] },
    { argv: ['short-scenario.json'] },
    { argv: ['scenario.json', '--max', '3'], allowed: [0] },
  ],
  analyze: [
    { argv: ['empty.txt', '--format', 'nonsense'] },
    { argv: ['empty.txt', '--format'] },
    { argv: ['empty.txt', '--fail-on', 'never'] },
    ...['jsonl', 'text', 'vcd'].flatMap((format) => ['empty.txt', 'random.bin', 'long-line.txt', 'bad-utf8.txt'].map((file) => ({ argv: [file, '--format', format], allowed: [0, 1, 2] }))),
    { argv: ['a', 'b'] },
  ],
  run: [
    { argv: ['folder'] },
    { argv: ['vectors', '--filter'] },
    { argv: ['vectors', '--junit'] },
    { argv: ['vectors', '--junit', 'folder'] },
    { argv: ['vectors', '--filter', '['] },
    { argv: ['vectors', '--filter', '((('] },
    { argv: ['vectors', '--filter', '{a,b}'] },
    { argv: ['vectors', '--filter', '\\'] },
    { argv: ['vectors', '--filter', ''] },
    { argv: ['vectors', '--filter', '*'.repeat(2_000)] },
    { argv: ['vectors', '--filter', '*'.repeat(500)], allowed: [0, 1] },
    { argv: ['vectors', '--filter', `${'*?'.repeat(30)}x`] },
    { argv: ['vectors', '--filter', `${'**/'.repeat(30)}x`] },
    { argv: ['vectors', '--filter', `caps/${'*a'.repeat(40)}b`] },
    { argv: ['vectors', '--filter', `caps/${'*a'.repeat(40)}`], allowed: [0, 1] },
    { argv: ['vectors', '--filter', '**'], allowed: [0, 1] },
    { argv: ['vectors'], allowed: [0, 1] },
    // Broken files are failing results, not usage errors (run.ts).
    ...['empty.txt', 'random.bin', 'long-line.txt', 'bad-utf8.txt'].map((file) => ({ argv: [file], allowed: [1] })),
  ],
  schema: [{ argv: ['nonsense'] }, { argv: ['toString'] }, { argv: ['__proto__'] }, { argv: ['constructor'] }, { argv: ['vector', 'trace'] }, { argv: ['vector'], allowed: [0] }],
};

/** Generic files are valid or failing input for some commands. */
function allowedFor(name: string, c: Case): readonly number[] {
  if (c.allowed) return c.allowed;
  if (name === 'run' && ['empty.txt', 'random.bin', 'long-line.txt', 'bad-utf8.txt'].includes(c.argv[0] ?? '') && c.argv.length === 1) return [1];
  return [2];
}

describe('bad input, every command', () => {
  it('covers every command of the table', () => {
    for (const name of Object.keys(commands)) expect(genericCases().length + (specific[name]?.length ?? 0)).toBeGreaterThan(5);
  });

  for (const name of Object.keys(commands)) {
    describe(`parley ${name}`, () => {
      const cases = [...genericCases(), ...(specific[name] ?? [])];
      for (const c of cases) {
        for (const json of [false, true]) {
          const argv = json ? [...c.argv, '--json'] : c.argv;
          const shown = argv.map((a) => (a.length > 40 ? `${a.slice(0, 12)}…(${a.length} chars)` : JSON.stringify(a))).join(' ');
          it(shown || '(no arguments)', { timeout: CASE_TIMEOUT_MS }, async () => {
            expectWellFormed(name, [name, ...argv], await runBounded([name, ...argv]), allowedFor(name, c));
          });
        }
      }
    });
  }

  for (const name of ['nonsense', 'toString', 'constructor', '__proto__', '']) {
    it(`an unknown command ${JSON.stringify(name)}`, async () => {
      const r = await runBounded([name, '--json']);
      expectWellFormed(name, [name, '--json'], r, [2]);
    });
  }
});

describe('bad input through the real bin', () => {
  const bin = join(repoRoot, 'cli/parley.js');
  const exec = (args: string[]) =>
    new Promise<{ code: number; stdout: string; stderr: string }>((resolveRun) => {
      execFile(process.execPath, [bin, ...args], { cwd: dir, timeout: 30_000, maxBuffer: 16 << 20 }, (error, stdout, stderr) => {
        resolveRun({ code: error ? (typeof error.code === 'number' ? error.code : -1) : 0, stdout, stderr });
      });
    });

  const cases: { args: string[]; name: string }[] = [
    { name: 'decode', args: ['decode', 'abc', '--json'] },
    { name: 'caps', args: ['caps', CAPS, '--cable', '1234', '--json'] },
    { name: 'analyze', args: ['analyze', 'folder', '--json'] },
    { name: 'wire', args: ['wire', 'encode', GOODCRC, '--vcd', 'out.vcd', '--bitrate', '0', '--json'] },
  ];
  for (const c of cases) {
    it(c.args.join(' '), { timeout: 40_000 }, async () => {
      const r = await exec(c.args);
      expect(r.code).toBe(2);
      const doc = JSON.parse(r.stdout) as { ok: boolean; error: { code: string } };
      expect(doc).toMatchObject({ ok: false, error: { code: expect.any(String) } });
      expect(r.stderr).toMatch(new RegExp(`^parley ${c.name}: [^\\n]+\\n$`));
      expect(r.stderr).not.toMatch(/^\s+at /m);
    });
  }
});
