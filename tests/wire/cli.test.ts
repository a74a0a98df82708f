/** `parley wire encode|decode` in-process through runCli with a fake io (docs/cli.md). */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import CRC32 from 'crc-32';
import { WIRE_FIXTURES } from './fixtures.ts';
import { runCaptured } from '../../cli/test-io.ts';

const dir = mkdtempSync(join(tmpdir(), 'parley-wire-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const cli = (...argv: string[]) => runCaptured(argv, { cwd: dir });

describe('parley wire', () => {
  it('encodes messages to a VCD and decodes them back with their decoded form', async () => {
    const caps = WIRE_FIXTURES.find((f) => f.name === 'Source_Capabilities (6 PDOs)')!;
    const request = WIRE_FIXTURES.find((f) => f.name === 'Request')!;
    const enc = await cli('wire', 'encode', caps.hex, '81:00', request.hex, "SOP':8f1001a000ff", 'cable_reset', '--vcd', 'out.vcd', '--gap-us', '300', '--json');
    expect(enc.code).toBe(0);
    expect(enc.json()).toEqual({ ok: true, messages: 5, durationUs: expect.any(Number) });
    expect(readFileSync(join(dir, 'out.vcd'), 'utf8')).toMatch(/\$timescale 1 ns \$end[\s\S]*\$var wire 1 ! cc \$end/);

    const dec = await cli('wire', 'decode', 'out.vcd', '--json');
    expect(dec.code).toBe(0);
    const out = dec.json() as {
      ok: boolean;
      messages: { t: number; sop: string; hex: string; crc: string; crcOk: boolean; message: { header: { messageType: string }; objects: { kind: string }[]; crc: { ok: boolean } } }[];
      events: unknown[];
    };
    expect(out.ok).toBe(true);
    expect(out.messages.map((m) => m.hex)).toEqual([caps.hex, '8100', request.hex, '8f1001a000ff']);
    expect(out.messages[0]).toMatchObject({ t: 300, sop: 'SOP', crcOk: true, message: { header: { messageType: 'Source_Capabilities' }, crc: { ok: true } } });
    // CRC as the npm crc-32 package computes it over header + objects (USB PD R3.2 V1.1 §5.6.2).
    expect(out.messages[0]!.crc).toBe((CRC32.buf(Buffer.from(caps.hex, 'hex')) >>> 0).toString(16).padStart(8, '0'));
    // The Request is typed by the offers decoded just before it: object 2 is fixed.
    expect(out.messages[2]!.message.objects[0]!.kind).toBe('rdo-fixed');
    expect(out.messages[3]).toMatchObject({ sop: "SOP'", message: { header: { messageType: 'Vendor_Defined' } } });
    expect(out.events).toEqual([{ t: expect.any(Number), event: 'cable_reset' }]);
  });

  it('prints a table for people', async () => {
    await cli('wire', 'encode', '0x8100', 'hard_reset', '--vcd', 'people.vcd', '--bitrate', '280000');
    const dec = await cli('wire', 'decode', 'people.vcd');
    expect(dec.code).toBe(0);
    expect(dec.stdout).toMatch(/GoodCRC\s+ok\s+8100/);
    expect(dec.stdout).toContain('Hard Reset');
    expect(dec.stdout).toContain('1 message(s), 1 reset(s)');
  });

  it('reads a chosen signal of a multi-signal VCD', async () => {
    await cli('wire', 'encode', '8100', '--vcd', 'one.vcd');
    const one = readFileSync(join(dir, 'one.vcd'), 'utf8').replace('$var wire 1 ! cc $end', '$var wire 1 " vbus_ok $end\n$var wire 1 ! cc2 $end');
    writeFileSync(join(dir, 'two.vcd'), one);
    expect((await cli('wire', 'decode', 'two.vcd', '--json')).json()).toMatchObject({ messages: [] });
    expect((await cli('wire', 'decode', 'two.vcd', '--signal', 'cc2', '--json')).json()).toMatchObject({ messages: [{ hex: '8100', crcOk: true }] });
  });

  it('exits 2 with the JSON error on bad input', async () => {
    const missing = await cli('wire', 'decode', 'nope.vcd', '--json');
    expect(missing.code).toBe(2);
    expect(missing.json()).toEqual({ ok: false, error: { code: 'input.file', message: 'no such file: nope.vcd' } });
    expect(missing.stderr).toContain('no such file');

    writeFileSync(join(dir, 'trace.jsonl'), '{"trace": 1}\n');
    const notVcd = await cli('wire', 'decode', 'trace.jsonl', '--json');
    expect(notVcd.code).toBe(2);
    expect(notVcd.json()).toMatchObject({ ok: false, error: { code: 'vcd.format', line: 1 } });

    const badHex = await cli('wire', 'encode', '81g0', '--vcd', 'x.vcd', '--json');
    expect(badHex.code).toBe(2);
    expect(badHex.json()).toMatchObject({ ok: false, error: { code: 'input.hex', offset: 2 } });

    expect((await cli('wire', 'encode', '8100', '--json')).code).toBe(2);
    expect((await cli('wire', 'encode', '8100', '--vcd', 'x.vcd', '--bitrate', 'fast', '--json')).json()).toMatchObject({ error: { code: 'usage' } });
    expect((await cli('wire', 'encode', 'SOP3:8100', '--vcd', 'x.vcd', '--json')).json()).toMatchObject({ error: { code: 'input.sop' } });
    expect((await cli('wire', 'decode', 'nope.vcd', '--frobnicate', '--json')).json()).toMatchObject({ error: { code: 'usage' } });
    expect((await cli('wire', 'decode', 'two.vcd', '--signal', 'vbus', '--json')).json()).toMatchObject({ error: { code: 'vcd.signal' } });
  });
});
