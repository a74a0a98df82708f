/** `parley simulate` in-process through runCli with a fake io (docs/cli.md). */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCaptured } from '../test-io.ts';

const dir = mkdtempSync(join(tmpdir(), 'parley-simulate-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (argv: string[], stdin = '') => runCaptured(argv, { cwd: dir, stdin });

// vector.md's example scenario (5 V 3 A, 9 V 3 A, PPS 3.3–11 V 3 A; PPS sink; a lost GoodCRC).
const scenario = {
  source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0xc0dc213c'] }, specRevision: '3.0', behaviour: { capsIntervalMs: 150 } },
  sink: { specRevision: '3.0', policy: { kind: 'pps', voltageMv: 8400, currentMa: 2500 }, changes: [{ atMs: 4000, policy: { kind: 'fixed', voltageMv: 5000, currentMa: 1500 } }] },
  cable: { currentRatingMa: 3000, resistanceMohm: 160 },
  faults: [{ kind: 'drop', from: 'sink', messageType: 'GoodCRC', nth: 1 }],
  durationMs: 6000,
  seed: 7,
};
writeFileSync(join(dir, 'example.json'), JSON.stringify(scenario));

describe('parley simulate', () => {
  it('prints the JSON document with the contract, the events and the findings', async () => {
    const r = await cli(['simulate', 'example.json', '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout) as { ok: boolean; contract: unknown; events: { msg?: string; message?: { header: { messageType: string } } }[]; findings: { severity: string }[] };
    expect(json.ok).toBe(true);
    // After the change at 4 s: 5 V at 1.5 A from object 1.
    expect(json.contract).toEqual({ kind: 'fixed', objectPosition: 1, voltageMv: 5_000, currentMa: 1_500, powerMw: 7_500 });
    expect(json.events.filter((e) => e.msg).every((e) => typeof e.message?.header.messageType === 'string')).toBe(true);
    expect(json.findings.filter((f) => f.severity === 'error')).toEqual([]);
    expect(json).not.toHaveProperty('samples');
  });

  it('writes a trace with the header line first and adds samples on request', async () => {
    const r = await cli(['simulate', 'example.json', '--trace', 'out.trace.jsonl', '--samples', '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout) as { events: unknown[]; samples: number[][] };
    expect(json.samples.length).toBe(6_001);
    expect(json.samples[1]![0]).toBe(1_000);
    const lines = readFileSync(join(dir, 'out.trace.jsonl'), 'utf8').trimEnd().split('\n');
    expect(JSON.parse(lines[0]!)).toMatchObject({ trace: 1, seed: 7 });
    expect(lines.length).toBe(json.events.length + 1);
    expect(JSON.parse(lines[1]!)).toEqual({ t: 0, event: 'attach', cc: 'CC1', rp: '3.0A' });
  });

  it('titles the trace with the scenario file name, not the path it was given by', async () => {
    const r = await cli(['simulate', join(dir, 'example.json'), '--trace', 'titled.trace.jsonl']);
    expect(r.code).toBe(0);
    const header = JSON.parse(readFileSync(join(dir, 'titled.trace.jsonl'), 'utf8').split('\n')[0]!) as { title: string };
    expect(header.title).toBe('Simulation of example.json');
  });

  it('prints a timeline for people, reading the scenario from stdin', async () => {
    const r = await cli(['simulate', '-'], JSON.stringify(scenario));
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/SRC→SNK\s+Source_Capabilities #0\s+fixed 5 V 3 A/);
    expect(r.stdout).toMatch(/note: fault: GoodCRC #0 from sink dropped/);
    expect(r.stdout).toMatch(/SNK Ready/);
    expect(r.stdout).toMatch(/Contract\s+fixed 5 V, 1\.5 A, 7\.5 W \(object 1\)/);
  });

  it('exits 2 with "field: message" for a bad scenario', async () => {
    writeFileSync(join(dir, 'bad.json'), JSON.stringify({ ...scenario, durationMs: 'long' }));
    const r = await cli(['simulate', 'bad.json', '--json']);
    expect(r.code).toBe(2);
    expect(JSON.parse(r.stdout)).toEqual({ ok: false, error: { code: 'scenario.invalid', message: 'durationMs: Invalid input: expected number, received string' } });
    expect(r.stderr).toMatch(/^parley simulate: durationMs: /);
  });

  it('exits 2 for a missing file, broken JSON or no argument', async () => {
    expect((await cli(['simulate', 'nope.json'])).code).toBe(2);
    writeFileSync(join(dir, 'broken.json'), '{ "source": ');
    const broken = await cli(['simulate', 'broken.json', '--json']);
    expect(broken.code).toBe(2);
    expect(JSON.parse(broken.stdout).error.code).toBe('input.json');
    expect((await cli(['simulate'])).code).toBe(2);
  });
});
