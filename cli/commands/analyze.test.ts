/** `parley analyze` in-process through runCli with a fake io (docs/cli.md, `analyze`). */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCaptured } from '../test-io.ts';

const FIXTURES = join(import.meta.dirname, '../../tests/fixtures/traces');
const scratch = mkdtempSync(join(tmpdir(), 'parley-analyze-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

const cli = (...argv: string[]) => runCaptured<Json>(argv, { cwd: FIXTURES });

type Json = {
  ok: boolean;
  format: string;
  messages: number;
  summary: string;
  contracts: { kind: string; voltageMv: number; currentMa: number; t: number }[];
  findings: { rule: string; severity: string; line?: number }[];
  timeline?: { messages: unknown[] };
  error?: { code: string; message: string };
};

describe('parley analyze', () => {
  it('prints the JSON document of cli.md for a clean trace', async () => {
    const r = await cli('analyze', 'clean.trace.jsonl', '--json');
    expect(r.code).toBe(0);
    const out = r.json();
    // Object 2 (9 V 3 A) requested at 2 A; PS_RDY at 361 051 µs makes the contract.
    expect(out).toMatchObject({ ok: true, format: 'jsonl', messages: 8, contracts: [{ kind: 'fixed', voltageMv: 9_000, currentMa: 2_000, t: 361_051 }] });
    expect(out.summary).toBe('Contract 9 V 2 A at 0.361 s; no errors or warnings.');
    expect(out.findings.filter((f) => f.severity !== 'info')).toEqual([]);
    expect(out.timeline).toBeUndefined();
    expect(r.stderr).toBe('');
  });

  it('reads plain text by its content and adds the timeline on request', async () => {
    const r = await cli('analyze', 'clean.txt', '--json', '--timeline');
    const out = r.json();
    expect(out.format).toBe('text');
    expect(out.timeline?.messages).toHaveLength(8);
  });

  it('prints a readable report for people', async () => {
    const r = await cli('analyze', 'timing-pps-keepalive.trace.jsonl');
    expect(r.code).toBe(0);
    expect(r.stdout.split('\n')[0]).toBe(
      'Contract PPS 8.4 V 2.5 A at 0.361 s; Hard Reset at 13.5 s; 1 error; likely cause of the Hard Reset: the sink stopped re-requesting its programmable contract, which points at the device (sink).',
    );
    expect(r.stdout).toContain('timing.pps-keepalive');
    expect(r.stdout).toContain('PPS 8.4 V 2.5 A');
  });

  it('exits 1 when --fail-on is met and 0 when it is not', async () => {
    expect((await cli('analyze', 'timing-sender-response.trace.jsonl', '--fail-on', 'error')).code).toBe(1);
    expect((await cli('analyze', 'timing-caps-interval.trace.jsonl', '--fail-on', 'error')).code).toBe(0);
    expect((await cli('analyze', 'timing-caps-interval.trace.jsonl', '--fail-on', 'warning')).code).toBe(1);
  });

  it('reports malformed lines with their numbers and analyses the rest', async () => {
    const out = (await cli('analyze', 'malformed.trace.jsonl', '--json')).json();
    expect(out.findings.filter((f) => f.rule === 'trace.malformed-line').map((f) => f.line)).toEqual([4, 7, 8, 9, 14]);
    expect(out.contracts).toHaveLength(1);
  });

  it('exits 2 with the JSON error for a missing file or nothing readable', async () => {
    const missing = await cli('analyze', 'no-such.trace.jsonl', '--json');
    expect(missing.code).toBe(2);
    expect(missing.json()).toMatchObject({ ok: false, error: { code: 'input.file' } });
    expect(missing.stderr).toContain('no such file');
    const junk = join(scratch, 'junk.txt');
    writeFileSync(junk, 'hello\nworld\n');
    const empty = await cli('analyze', junk, '--json');
    expect(empty.code).toBe(2);
    expect(empty.json()).toMatchObject({ ok: false, error: { code: 'trace.empty' } });
  });

  it('exits 2 on bad usage', async () => {
    expect((await cli('analyze', '--json')).code).toBe(2);
    expect((await cli('analyze', 'clean.txt', '--format', 'csv', '--json')).json()).toMatchObject({ ok: false, error: { code: 'usage' } });
    expect((await cli('analyze', 'clean.txt', '--fail-on', 'info')).code).toBe(2);
  });

  it('forces a format with --format', async () => {
    const r = await cli('analyze', 'clean.trace.jsonl', '--format', 'text', '--json');
    // Read as text, every JSON line is unreadable: nothing valid is left.
    expect(r.code).toBe(2);
    expect(r.json()).toMatchObject({ ok: false, error: { code: 'trace.empty' } });
  });
});
