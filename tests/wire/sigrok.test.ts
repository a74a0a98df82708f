/**
 * Outside check of the wire encoder against Debian's sigrok-cli and its usb_power_delivery
 * decoder: `parley wire encode` (the real CLI, as a process) writes VCDs, sigrok decodes them, and
 * the headers, data objects and CRCs must be those we sent, with no warning. CRCs are also checked
 * against the npm crc-32 package.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import CRC32 from 'crc-32';
import { WIRE_FIXTURES } from './fixtures.ts';

const ROOT = resolve(import.meta.dirname, '../..');
const hasSigrok = spawnSync('sigrok-cli', ['--version'], { encoding: 'utf8' }).status === 0;
const mustRun = process.env.CI === 'true';
if (!hasSigrok && !mustRun) console.log('sigrok cross-check skipped: sigrok-cli is missing; install with: apt-get install sigrok-cli');
const check = hasSigrok || mustRun ? it : it.skip;

const dir = mkdtempSync(join(tmpdir(), 'parley-wire-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function parley(args: string[]) {
  return spawnSync(process.execPath, [join(ROOT, 'cli/parley.js'), ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
}

interface SigrokPacket {
  sop: string;
  header?: string;
  data: string[];
  crc?: string;
  warnings: string[];
  text: string[];
}

/** `usb_power_delivery-1: <annotation>` lines → packets (a SOP annotation opens each). */
function sigrok(vcdPath: string): { packets: SigrokPacket[]; resets: string[]; stderr: string } {
  if (!hasSigrok) throw new Error('sigrok-cli is missing (CI=true requires it); install with: apt-get install sigrok-cli');
  const run = spawnSync('sigrok-cli', ['-i', vcdPath, '-I', 'vcd', '-P', 'usb_power_delivery', '-A', 'usb_power_delivery=sop:header:data:crc:warnings:text'], { encoding: 'utf8', timeout: 60_000 });
  expect(run.status, run.stderr).toBe(0);
  const packets: SigrokPacket[] = [];
  const resets: string[] = [];
  for (const line of run.stdout.split('\n')) {
    const text = line.replace(/^usb_power_delivery-\d+:\s*/, '').trim();
    if (!text) continue;
    const current = packets[packets.length - 1];
    if (/^SOP/.test(text)) packets.push({ sop: text, data: [], warnings: [], text: [] });
    else if (/\b(HRST|CRST)$/.test(text)) resets.push(text.slice(-4));
    else if (!current) throw new Error(`sigrok line outside a packet: ${text}`);
    else if (text.startsWith('H:')) current.header = text.slice(2);
    else if (/^\[\d+\][0-9a-f]{8}$/.test(text)) current.data.push(text.replace(/^\[\d+\]/, ''));
    else if (text.startsWith('CRC:')) current.crc = text.slice(4);
    else current.warnings.push(text);
  }
  return { packets, resets, stderr: run.stderr };
}

const crcOf = (hex: string) => (CRC32.buf(Buffer.from(hex, 'hex')) >>> 0).toString(16).padStart(8, '0');
const hex32 = (v: number) => (v >>> 0).toString(16).padStart(8, '0');
const hex16 = (v: number) => v.toString(16).padStart(4, '0');

describe('wire encode, cross-checked with sigrok-cli (usb_power_delivery)', () => {
  const cases = [
    { bitrate: 300_000, timescale: '1ns' },
    { bitrate: 270_000, timescale: '10ns' },
    { bitrate: 330_000, timescale: '100ns' },
  ];
  for (const { bitrate, timescale } of cases) {
    check(`decodes our SPR messages and a Hard Reset at ${bitrate} bit/s, timescale ${timescale}`, () => {
      const vcd = join(dir, `spr-${bitrate}.vcd`);
      const args = WIRE_FIXTURES.map((f) => (f.sop === 'SOP' ? f.hex : `${f.sop}:${f.hex}`));
      const encoded = parley(['wire', 'encode', ...args, 'hard_reset', '--vcd', vcd, '--bitrate', String(bitrate), '--timescale', timescale, '--json']);
      expect(encoded.status, encoded.stderr).toBe(0);
      expect(JSON.parse(encoded.stdout)).toMatchObject({ ok: true, messages: WIRE_FIXTURES.length + 1 });
      expect(existsSync(vcd)).toBe(true);

      const { packets, resets } = sigrok(vcd);
      expect(packets).toHaveLength(WIRE_FIXTURES.length);
      WIRE_FIXTURES.forEach((f, i) => {
        const p = packets[i]!;
        expect(p.sop, f.name).toBe(f.sop);
        expect(p.header, f.name).toBe(hex16(f.header));
        expect(p.data, f.name).toEqual(f.objects.map(hex32));
        expect(p.crc, f.name).toBe(crcOf(f.hex));
        expect(p.warnings, f.name).toEqual([]);
      });
      expect(resets).toEqual(['HRST']);

      // And our own decoder, through the CLI as a process, reads the same file back.
      const decoded = parley(['wire', 'decode', vcd, '--json']);
      expect(decoded.status, decoded.stderr).toBe(0);
      const out = JSON.parse(decoded.stdout) as {
        messages: { sop: string; hex: string; crc: string; crcOk: boolean; message: { header: { messageType: string } } | null }[];
        events: { event: string }[];
      };
      expect(out.messages.map((m) => [m.sop, m.hex, m.crc, m.crcOk])).toEqual(WIRE_FIXTURES.map((f) => [f.sop, f.hex, crcOf(f.hex), true]));
      expect(out.messages.map((m) => m.message?.header.messageType)).toEqual(WIRE_FIXTURES.map((f) => f.name.split(' ')[0]));
      expect(out.events.map((e) => e.event)).toEqual(['hard_reset']);
      expect(readFileSync(vcd, 'utf8')).toContain(`$timescale ${timescale.replace('ns', ' ns')} $end`);
    });
  }

  check('the 4b5b table agrees with the one sigrok ships', () => {
    const source = '/usr/share/libsigrokdecode/decoders/usb_power_delivery/pd.py';
    if (!existsSync(source)) throw new Error(`${source} is missing; install with: apt-get install sigrok-cli`);
    // Each data row of sigrok's DEC4B5B reads "0xN, # N = bbbb  sssss": symbol sssss decodes to nibble N.
    const rows = [...readFileSync(source, 'utf8').matchAll(/0x0([0-9A-F]),\s+#\s+[0-9A-F] = [01]{4}\s+([01]{5})/g)];
    expect(rows).toHaveLength(16);
    const symbols = rows
      .map(([, n, s]) => [parseInt(n!, 16), parseInt(s!, 2)] as const)
      .sort((a, b) => a[0] - b[0])
      .map(([, s]) => s);
    return import('../../shared/wire/4b5b.ts').then(({ DATA_SYMBOLS }) => expect(symbols).toEqual(DATA_SYMBOLS));
  });
});
