/** `parley request` in-process through runCli with a fake io (docs/cli.md). */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCaptured } from '../test-io.ts';

const dir = mkdtempSync(join(tmpdir(), 'parley-request-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (...argv: string[]) => runCaptured(argv, { cwd: dir });

const le = (word: string) => word.match(/../g)!.reverse().join('');
// As in caps.test.ts: 5 V 3 A, 9 V 3 A, 15 V 3 A, 20 V 3.25 A, PPS 3.3–11 V 3 A, PPS 3.3–21 V 3 A.
const HEX = 'a161' + ['0001912c', '0002d12c', '0004b12c', '00064145', 'c0dc213c', 'c1a4213c'].map(le).join('');

describe('parley request', () => {
  it('max-power over the default 3 A cable: 20 V at 3 A', async () => {
    const r = await cli('request', '--caps', HEX, '--sink', '{"kind":"max-power"}', '--json');
    expect(r.code).toBe(0);
    // RDO: position 4 << 28 | 300 << 10 | 300 (USB PD R3.1 V1.8 §6.4.2 fixed RDO, 10 mA units, from memory);
    // message: header 0x1082 (Request, 1 object, R3.0, sink/ufp), then the RDO little-endian.
    expect(r.json()).toEqual({
      ok: true,
      request: {
        hex: '82102cb10440',
        rdo: '0x4004b12c',
        objectPosition: 4,
        capabilityMismatch: false,
        contract: { kind: 'fixed', objectPosition: 4, voltageMv: 20_000, currentMa: 3_000, powerMw: 60_000 },
      },
      findings: [],
    });
  });

  it('a pps policy from a file, over a 5 A cable', async () => {
    writeFileSync(join(dir, 'sink.json'), JSON.stringify({ kind: 'pps', voltageMv: 9_010, currentMa: 2_990 }));
    const r = await cli('request', '--caps', HEX, '--sink', 'sink.json', '--cable', '5000', '--json');
    // 9010 mV down to 9000 (20 mV steps), 2990 mA down to 2950 (50 mA): 5 << 28 | 450 << 9 | 59 (PPS RDO, from memory)
    expect(r.json()).toMatchObject({ ok: true, request: { rdo: '0x5003843b', objectPosition: 5, capabilityMismatch: false, contract: { kind: 'pps', voltageMv: 9_000, currentMa: 2_950 } } });
  });

  it('prints a table for people', async () => {
    const r = await cli('request', '--caps', HEX, '--sink', '{"kind":"fixed","voltageMv":12000,"currentMa":1000}');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^object +1 \(fixed 5 V 3 A\)$/m);
    expect(r.stdout).toMatch(/^Capability Mismatch +set$/m);
  });

  it.each([
    [['request', '--sink', '{"kind":"max-power"}', '--json'], 'usage'],
    [['request', '--caps', HEX, '--json'], 'usage'],
    [['request', '--caps', HEX, '--sink', '{"kind":"cheap"}', '--json'], 'input.sink'],
    [['request', '--caps', HEX, '--sink', '{"kind":"range","minVoltageMv":9000,"maxVoltageMv":5000,"powerMw":1}', '--json'], 'input.sink'],
    [['request', '--caps', HEX, '--sink', '{kind', '--json'], 'input.sink'],
    [['request', '--caps', HEX, '--sink', 'missing.json', '--json'], 'input.sink'],
    [['request', '--caps', 'a1', '--sink', '{"kind":"max-power"}', '--json'], 'input.caps'],
    [['request', '--caps', HEX, '--sink', '{"kind":"max-power"}', '--cable', '1', '--json'], 'input.cable'],
  ])('exit 2 with a JSON error for bad input: %j', async (argv, code) => {
    const r = await cli(...argv);
    expect(r.code).toBe(2);
    expect(r.json()).toMatchObject({ ok: false, error: { code } });
    expect(r.stderr).toMatch(/^parley request: .+\n$/);
  });

  it('names the field in a policy error', async () => {
    const r = await cli('request', '--caps', HEX, '--sink', '{"kind":"fixed","voltageMv":9000}', '--json');
    expect((r.json() as { error: { message: string } }).error.message).toMatch(/^--sink: currentMa: /);
  });
});
