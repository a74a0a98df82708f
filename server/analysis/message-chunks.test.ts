import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { TimelineMessage } from '../../shared/trace/timeline.ts';
import { CHUNK_ITEMS } from '../../shared/trace/views.ts';
import { createMessageChunkWriter, decodeChunkBody, readMessageChunks } from './message-chunks.ts';

const folder = mkdtempSync(join(tmpdir(), 'parley-message-chunks-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const message = (index: number): TimelineMessage => {
  const kind = index % 3;
  return {
    t: 1_000 * index,
    durationUs: 500,
    from: kind === 1 ? 'sink' : 'source',
    sop: 'SOP',
    messageType: kind === 1 ? 'GoodCRC' : index === 701 ? 'Source_Capabilities' : 'Accept',
    messageId: index % 8,
    hex: '6301',
    decoded: { header: {} } as never,
    crcOk: true,
  };
};

describe('message chunks', () => {
  it('cuts every message into compressed chunks with their row counts and offers, and reads them back in order', async () => {
    const path = join(folder, 'spill');
    const writer = createMessageChunkWriter(path);
    const total = 2 * CHUNK_ITEMS + 17;
    for (let index = 0; index < total; index++) writer.add(message(index), index);
    expect(writer.finish()).toMatchObject({ messages: total, chunks: 3, lastEndUs: 1_000 * (total - 1) + 500 });
    const rows = [];
    for await (const row of readMessageChunks(path)) rows.push(row);
    expect(rows.map((r) => [r.seq, r.firstIndex, r.count])).toEqual([
      [0, 0, CHUNK_ITEMS],
      [1, CHUNK_ITEMS, CHUNK_ITEMS],
      [2, 2 * CHUNK_ITEMS, 17],
    ]);
    expect(rows[1]).toMatchObject({ startUs: 500_000, endUs: 999_500, capsIndex: 701 });
    expect(rows[0]!.capsIndex).toBeNull();
    // Indices 1, 4, 7, … are GoodCRCs: 167 of the first 500.
    expect(rows[0]!.foldedRows).toBe(CHUNK_ITEMS - 167);
    const items = decodeChunkBody(rows[2]!.body) as Record<string, unknown>[];
    const { decoded: _decoded, ...first } = message(2 * CHUNK_ITEMS);
    expect(items[0]).toEqual(first);
    expect(items).toHaveLength(17);
    expect(rows[0]!.body.length).toBeLessThan(JSON.stringify(decodeChunkBody(rows[0]!.body)).length / 4);
  });

  it('reads plain JSON bodies of other kinds as they are', () => {
    expect(decodeChunkBody('[{"t":1}]')).toEqual([{ t: 1 }]);
  });

  it('refuses a message out of order rather than shift every later row', () => {
    const writer = createMessageChunkWriter(join(folder, 'gap'));
    writer.add(message(0), 0);
    expect(() => writer.add(message(2), 2)).toThrow(/out of order/);
    writer.abandon();
  });
});
