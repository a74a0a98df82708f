import { describe, expect, it } from 'vitest';
import { runCli } from '../main.ts';
import { captureIo } from '../test-io.ts';

const fakeIo = (stdin = '', cwd = process.cwd()) => captureIo({ stdin, cwd });

// Header 0x61a1 and the six PDOs worked out by hand from USB PD R3.2 V1.1 Table 6.1 and the
// source PDO tables (see shared/pd/header.test.ts, source-pdo.test.ts).
const CAPS = 'a1612c9101082cd102002cc103002cb10400454106003c21dcc0';

describe('parley decode', () => {
  it('prints an aligned listing for people', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', CAPS], io)).toBe(0);
    expect(out.stdout).toContain('Source_Capabilities  SOP');
    expect(out.stdout).toMatch(/1 +fixed +0x0801912c +voltage 5 V, max current 3 A, unconstrained power/);
    expect(out.stdout).toMatch(/6 +pps +0xc0dc213c +min voltage 3.3 V, max voltage 11 V, max current 3 A/);
  });

  it('joins several hex arguments and prints JSON with --json', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', '81', '00', '--json'], io)).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc).toMatchObject({ ok: true, message: { sop: 'SOP', header: { raw: '0x0081', messageType: 'GoodCRC', category: 'control' }, objects: [] }, warnings: [] });
  });

  it('--words reads a 16-bit header and 32-bit objects; --caps types the RDO', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', '--words', '0x1082', '0x60038428', '--caps', CAPS, '--json'], io)).toBe(0);
    // RDO 0x6003_8428 → position 6 (the PPS offer): 450 × 20 mV = 9 V, 40 × 50 mA = 2 A (R3.1 Table 6.25).
    expect(JSON.parse(out.stdout).message.objects[0]).toMatchObject({ kind: 'rdo-pps', objectPosition: 6, outputVoltageMv: 9000, operatingCurrentMa: 2000 });
  });

  it('without --caps the RDO is kind rdo with a decode.rdo-unknown-type warning', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', '--words', '0x1082', '0x1304b12c', '--json'], io)).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc.message.objects[0].kind).toBe('rdo');
    expect(doc.warnings[0]).toMatchObject({ rule: 'decode.rdo-unknown-type', severity: 'warning' });
  });

  it('--crc checks the last 4 bytes', async () => {
    const { io, out } = fakeIo();
    // GoodCRC 0x0081 then a wrong CRC: decodes, with a decode.crc error finding.
    expect(await runCli(['decode', '8100', '00000000', '--crc', '--json'], io)).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc.message.crc).toEqual({ value: '0x00000000', ok: false });
    expect(doc.warnings[0]).toMatchObject({ rule: 'decode.crc', severity: 'error' });
  });

  it("--sop SOP' gives a cable plug header", async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', '8f11', '01a800ff', '--sop', "SOP'", '--json'], io)).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc.message.header).toMatchObject({ messageType: 'Vendor_Defined', cablePlug: true });
    // VDM header 0xff00a801: SVID 0xff00, structured, version 2.1, REQ, Discover Identity (R3.1 Table 6.29).
    expect(doc.message.objects[0]).toMatchObject({ kind: 'vdm-header', svid: 0xff00, structured: true, versionMajor: 1, versionMinor: 1, commandType: 'REQ', command: 'Discover Identity' });
  });

  it('exits 2 with a JSON error on bad input, and one line on stderr', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', 'a161zz', '--json'], io)).toBe(2);
    expect(JSON.parse(out.stdout)).toEqual({ ok: false, error: { code: 'input.hex', message: expect.any(String), offset: 4 } });
    expect(out.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('exits 2 on a length mismatch with the offset', async () => {
    const { io, out } = fakeIo();
    expect(await runCli(['decode', CAPS.slice(0, -8), '--json'], io)).toBe(2);
    expect(JSON.parse(out.stdout).error).toMatchObject({ code: 'decode.length', offset: 22 });
  });

  it('exits 2 on an unknown option or SOP', async () => {
    const a = fakeIo();
    expect(await runCli(['decode', '8100', '--bogus'], a.io)).toBe(2);
    const b = fakeIo();
    expect(await runCli(['decode', '8100', '--sop', 'SOP3', '--json'], b.io)).toBe(2);
    expect(JSON.parse(b.out.stdout).error.code).toBe('input.sop');
  });
});
