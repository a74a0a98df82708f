import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../main.ts';
import { captureIo } from '../test-io.ts';

const fakeIo = (stdin = '', cwd = process.cwd()) => captureIo({ stdin, cwd });

const CAPS = 'a1612c9101082cd102002cc103002cb10400454106003c21dcc0';

describe('parley encode', () => {
  it('inverts decode --json (read from stdin)', async () => {
    const d = fakeIo();
    await runCli(['decode', CAPS, '--json'], d.io);
    const e = fakeIo(d.out.stdout);
    expect(await runCli(['encode', '-', '--json'], e.io)).toBe(0);
    expect(JSON.parse(e.out.stdout)).toEqual({ ok: true, hex: CAPS });
  });

  it('reads a file with raw fields left out', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'parley-encode-'));
    // Request from a sink UFP, MessageID 1, rev 3.x → header 0x1282 (Table 6.1, by hand);
    // RDO position 1, 3 A / 3 A, USB comms, no suspend → 0x1304_b12c (R3.1 Table 6.23, by hand).
    const message = {
      header: { messageType: 'Request', messageId: 1, specRevision: '3.0', powerRole: 'sink', dataRole: 'ufp' },
      objects: [
        {
          kind: 'rdo-fixed',
          objectPosition: 1,
          operatingCurrentMa: 3000,
          maxOperatingCurrentMa: 3000,
          giveBack: false,
          capabilityMismatch: false,
          usbCommunicationsCapable: true,
          noUsbSuspend: true,
          unchunkedExtendedMessages: false,
          eprModeCapable: false,
        },
      ],
    };
    writeFileSync(join(dir, 'request.json'), JSON.stringify(message));
    const { io, out } = fakeIo('', dir);
    expect(await runCli(['encode', 'request.json'], io)).toBe(0);
    expect(out.stdout).toBe('82122cb10413\n');
  });

  it('exits 2 with the field path on an out-of-range value', async () => {
    const message = {
      header: { messageType: 'Source_Capabilities', messageId: 0, specRevision: '3.0', powerRole: 'source', dataRole: 'dfp' },
      objects: [
        {
          kind: 'fixed',
          voltageMv: 5010,
          maxCurrentMa: 3000,
          peakCurrent: 0,
          dualRolePower: false,
          usbSuspendSupported: false,
          unconstrainedPower: false,
          usbCommunicationsCapable: false,
          dualRoleData: false,
          unchunkedExtendedMessages: false,
          eprModeCapable: false,
        },
      ],
    };
    const { io, out } = fakeIo(JSON.stringify(message));
    expect(await runCli(['encode', '-', '--json'], io)).toBe(2);
    expect(JSON.parse(out.stdout).error).toEqual({ code: 'encode.range', message: 'objects[0].voltageMv: 5010 mV is not a multiple of 50 mV' });
  });

  it('exits 2 on input that is not JSON, and on a missing file', async () => {
    const a = fakeIo('{nope');
    expect(await runCli(['encode', '-', '--json'], a.io)).toBe(2);
    expect(JSON.parse(a.out.stdout).error.code).toBe('input.json');
    const b = fakeIo();
    expect(await runCli(['encode', 'no-such-file.json', '--json'], b.io)).toBe(2);
    expect(JSON.parse(b.out.stdout).error.code).toBe('input.file');
  });

  it('prints every chunk of a long extended message', async () => {
    const message = {
      header: { messageType: 'Manufacturer_Info', messageId: 0, specRevision: '3.0', powerRole: 'source', dataRole: 'dfp' },
      extendedHeader: { chunked: true },
      payload: '00'.repeat(30),
    };
    const { io, out } = fakeIo(JSON.stringify(message));
    expect(await runCli(['encode', '-', '--json'], io)).toBe(0);
    const doc = JSON.parse(out.stdout);
    expect(doc.chunks).toHaveLength(2); // 30 bytes = 26 + 4 (MaxExtendedMsgChunkLen 26, §6.2.1.2.1)
    expect(doc.hex).toBe(doc.chunks[0]);
  });
});
