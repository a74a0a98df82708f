/** Zip import (issue 14, item 3): streamed with a byte budget, a background job, batched writes. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { strToU8, zipSync } from 'fflate';
import { createTestApp, type TestApp } from '../support/test-app.ts';
import { TeamVector } from '../../server/db/library-entities.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const vectorFile = (i: number) => ({
  vector: 1,
  id: `caps/import/v${String(i).padStart(5, '0')}`,
  title: `Imported ${i}`,
  tags: ['import', i % 2 === 0 ? 'even' : 'odd'],
  ref: 'USB PD R3.1 V1.8 §10.2.3.2 (from memory)',
  kind: 'caps',
  input: { pdos: ['0x0001912c'], pdpW: 15 },
  expect: { findings: { exclude: ['*error'] } },
});

function zipOf(count: number, from = 0): Buffer {
  const entries: Record<string, Uint8Array> = {};
  for (let i = from; i < from + count; i++) entries[`vectors/caps/import/v${i}.vector.json`] = strToU8(JSON.stringify(vectorFile(i)));
  return Buffer.from(zipSync(entries, { level: 6 }));
}

/** A zip whose one entry says it holds 1,000 bytes but inflates to 24 MiB of spaces. */
function lyingZip(): Buffer {
  const bytes = Buffer.from(zipSync({ 'vectors/bomb.vector.json': new Uint8Array(24 * 1024 * 1024).fill(0x20) }, { level: 6 }));
  for (let at = 0; at < bytes.length - 4; at++) {
    const signature = bytes.readUInt32LE(at);
    if (signature === 0x04034b50) bytes.writeUInt32LE(1_000, at + 22);
    if (signature === 0x02014b50) bytes.writeUInt32LE(1_000, at + 24);
  }
  return bytes;
}

describe('POST /api/vectors/import', () => {
  it('refuses a zip whose entries understate their sizes once the inflated bytes pass the budget', async () => {
    const qa = await t.signInAs('qa');
    const bomb = lyingZip();
    expect(bomb.length).toBeLessThan(200_000);
    const res = await qa.post('/api/vectors/import').attach('file', bomb, 'bomb.zip');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'vector.bad-zip', message: expect.stringContaining('20 MB') });
  });

  it('imports 2,000 vectors in batches, keeps answering /api/health meanwhile, and re-imports as unchanged or new revisions', async () => {
    const qa = await t.signInAs('qa');
    const pending = qa.post('/api/vectors/import').attach('file', zipOf(2_000), 'many.zip');
    const started = pending.then((r) => r);
    const health = await t.request().get('/api/health');
    expect(health.status).toBe(200);
    const res = await started;
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    expect(res.body).toEqual({ created: 2_000, updated: 0, unchanged: 0, total: 2_000 });
    expect(await t.orm.em.fork().count(TeamVector, { vectorId: { $like: 'caps/import/%' } })).toBe(2_000);
    const list = await qa.get('/api/vectors?q=import&pageSize=5&sort=-id');
    expect(list.body.total).toBe(2_000);
    expect(list.body.items[0].id).toBe('caps/import/v01999');
    expect(list.body.tags).toEqual(
      expect.arrayContaining([
        { tag: 'even', count: 1_000 },
        { tag: 'odd', count: 1_000 },
      ]),
    );

    const changed = { ...vectorFile(7), title: 'Imported 7, retitled' };
    const again = zipSync({ 'a/v7.vector.json': strToU8(JSON.stringify(changed)), 'a/v8.vector.json': strToU8(JSON.stringify(vectorFile(8))) });
    const second = await qa.post('/api/vectors/import').attach('file', Buffer.from(again), 'again.zip');
    expect(second.body).toEqual({ created: 0, updated: 1, unchanged: 1, total: 2 });
    expect((await qa.get(`/api/vectors/${encodeURIComponent('caps/import/v00007')}`)).body).toMatchObject({ title: 'Imported 7, retitled', revision: 2 });
  });

  it('answers 202 with wait=false and streams the outcome', async () => {
    const qa = await t.signInAs('qa');
    const res = await qa.post('/api/vectors/import?wait=false').attach('file', zipOf(3, 50_000), 'three.zip');
    expect(res.status).toBe(202);
    const events = await qa
      .get(res.body.events)
      .buffer(true)
      .parse((stream, done) => {
        let text = '';
        stream.on('data', (chunk: Buffer) => (text += chunk.toString('utf8')));
        stream.on('end', () => done(null, text));
      });
    expect(String(events.body)).toContain('"created":3');
  });
});
