/** `parley caps` in-process through runCli with a fake io (docs/cli.md). */
import { describe, expect, it } from 'vitest';
import { runCaptured } from '../test-io.ts';

const cli = (...argv: string[]) => runCaptured<Json>(argv);

const le = (word: string) => word.match(/../g)!.reverse().join('');
// Source_Capabilities, header 0x61a1 (6 objects, R3.0, source/dfp): 5 V 3 A, 9 V 3 A, 15 V 3 A,
// 20 V 3.25 A, PPS 3.3–11 V 3 A, PPS 3.3–21 V 3 A (USB PD R3.1 V1.8 Tables 6-9 and 6-13, from memory).
const WORDS = ['0001912c', '0002d12c', '0004b12c', '00064145', 'c0dc213c', 'c1a4213c'];
const HEX = 'a161' + WORDS.map(le).join('');
type Json = {
  ok: boolean;
  pdpW: number;
  pdpInferred: boolean;
  objects: { kind: string }[];
  findings: { rule: string; severity: string; object?: number }[];
  error?: { code: string; message: string };
};

describe('parley caps', () => {
  it('checks a message, infers the PDP and says so (--json)', async () => {
    const r = await cli('caps', HEX, '--json');
    expect(r.code).toBe(0);
    const out = r.json() as Json;
    expect(out).toMatchObject({ ok: true, pdpW: 65, pdpInferred: true });
    expect(out.objects.map((o) => o.kind)).toEqual(['fixed', 'fixed', 'fixed', 'fixed', 'pps', 'pps']);
    expect(out.findings.map((f) => f.rule)).toEqual(['caps.cable-current', 'caps.pdp-inferred']);
    expect(r.stderr).toBe('');
  });

  it('takes the hex split over several arguments, with 0x and colons', async () => {
    const r = await cli('caps', `0x${HEX.slice(0, 10)}`, HEX.slice(10).match(/../g)!.join(':'), '--json');
    expect((r.json() as Json).objects).toHaveLength(6);
  });

  it('--pdos, --pdp, --cable and --label', async () => {
    const r = await cli('caps', '--pdos', '0x0001912c,0x0004b12c', '--pdp', '45', '--cable', '5000', '--label', '5V⎓3A 15V⎓3A 45W', '--json');
    const out = r.json() as Json;
    expect(out).toMatchObject({ ok: true, pdpW: 45, pdpInferred: false });
    // 45 W requires 9 V (USB PD R3.1 V1.8 §10.2.3, Table 10-2, from memory).
    expect(out.findings.map((f) => f.rule)).toEqual(['caps.power-rules-missing']);
    const mismatch = await cli('caps', HEX, '--pdp=65', '--cable=5000', '--label', '20V⎓3A 65W', '--json');
    expect((mismatch.json() as Json).findings).toMatchObject([{ rule: 'caps.label-mismatch', object: 4 }]);
  });

  it('prints aligned tables for people', async () => {
    const r = await cli('caps', HEX);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Source_Capabilities: 6 objects, PDP 65 W (inferred), cable not given');
    expect(r.stdout).toMatch(/^4 +fixed +20 V +3\.25 A +65 W +0x00064145$/m);
    expect(r.stdout).toMatch(/^info +caps\.cable-current +#4 +Object 4/m);
    expect(r.stdout).toContain('2 findings: 0 errors, 0 warnings, 2 info');
  });

  it.each([
    [['caps', 'zz', '--json'], 'input.caps'],
    [['caps', '4100', '--json'], 'input.caps'],
    [['caps', '--pdos', '0x1,nine', '--json'], 'input.pdos'],
    [['caps', HEX, '--pdp', '0', '--json'], 'input.pdp'],
    [['caps', HEX, '--cable', '4000', '--json'], 'input.cable'],
    [['caps', HEX, '--label', 'fast', '--json'], 'input.label'],
    [['caps', '--json'], 'usage'],
    [['caps', HEX, '--pdos', '0x0001912c', '--json'], 'usage'],
    [['caps', HEX, '--frobnicate', '--json'], 'usage'],
  ])('exit 2 with a JSON error for bad input: %j', async (argv, code) => {
    const r = await cli(...argv);
    expect(r.code).toBe(2);
    expect(r.json()).toMatchObject({ ok: false, error: { code, message: expect.any(String) } });
    expect(r.stderr).toMatch(/^parley caps: .+\n$/);
    expect(r.stderr).not.toMatch(/\bat .+:\d+:\d+/); // no stack trace
  });
});
