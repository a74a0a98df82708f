import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { textChunks } from './text-chunks.ts';

const dir = mkdtempSync(join(tmpdir(), 'parley-chunks-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function read(text: string | Buffer, chunkBytes: number): Promise<string[]> {
  const path = join(dir, `f-${Math.random().toString(36).slice(2)}`);
  writeFileSync(path, text);
  const out: string[] = [];
  for await (const chunk of textChunks(path, chunkBytes)) out.push(chunk);
  return out;
}

describe('textChunks', () => {
  it('gives an ASCII file back as it is, chunk by chunk', async () => {
    const text = '0.152000 SRC a1 61 2c 91\n0.181 VBUS 5030mV 410mA\n';
    const chunks = await read(text, 16);
    expect(chunks.join('')).toBe(text);
    expect(chunks[0]).toHaveLength(16);
  });

  it('keeps a character split across two chunks whole, and every character after it', async () => {
    // "µs" is two bytes in UTF-8 (0xc2 0xb5): chunks of 5 bytes cut it after its first byte.
    const text = '0.15 µs SRC a1\n1.0 SNK 41\n'.repeat(3);
    for (const size of [1, 2, 3, 4, 5, 7, 64]) expect((await read(text, size)).join('')).toBe(text);
  });

  it('reads bytes that are no UTF-8 as the streaming decoder does (U+FFFD)', async () => {
    const bytes = Buffer.concat([Buffer.from('0.1 SRC a1\n'), Buffer.from([0xff, 0x0a]), Buffer.from('0.2 SNK 41\n')]);
    expect((await read(bytes, 4)).join('')).toBe(bytes.toString('utf8'));
  });
});
