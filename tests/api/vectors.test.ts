import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { unzipSync, strFromU8, zipSync, strToU8 } from 'fflate';
import { createTestApp, createTestClock, type TestApp } from '../support/test-app.ts';
import { formatVector } from '../../shared/vectors/index.ts';
import { builtInVectorsDir, seedTeamLibrary } from '../../server/features/vectors/seed.ts';
import { TeamVector } from '../../server/db/library-entities.ts';

/**
 * The team library API (api.md): create, read, revise with the 409 rule, history, diff,
 * restore, zip export and import (byte for byte), roles. The expected values of the vectors
 * themselves do not matter here; the caps vector below is the one of vector.md.
 */

// vector.md's example: a 45 W source must offer 9 V (USB PD R3.1, §10.2.3).
const example = {
  vector: 1,
  id: 'caps/power-rules/45w-without-9v-team',
  title: 'A 45 W source must offer 9 V',
  tags: ['power-rules', 'team'],
  ref: 'USB PD R3.1, §10.2.3',
  kind: 'caps',
  input: { pdos: ['0x0001912c', '0x0004b12c', '0x000640e1'], pdpW: 45 },
  expect: { findings: { include: ['caps.power-rules-missing'], exclude: [] } },
};
const encodedId = encodeURIComponent(example.id);

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ clock: createTestClock() });
});
afterAll(() => t.close());

describe('a vector and its revisions', () => {
  it('is created at revision 1 and read back by its URL-encoded id', async () => {
    const qa = await t.signInAs('qa');
    const created = await qa.post('/api/vectors').send({ ...example, message: 'First version' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.revision).toBe(1);
    expect(created.body.id).toBe(example.id);
    expect(created.body.meta.author.name).toBe('Quinn Tester');

    expect(encodedId).toContain('%2F');
    const read = await (await t.signInAs('viewer')).get(`/api/vectors/${encodedId}`);
    expect(read.status).toBe(200);
    expect(read.body).toMatchObject({ ...example, revision: 1, deviceId: null });

    const again = await qa.post('/api/vectors').send(example);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('vector.exists');
  });

  it('rejects a file the engine schema does not accept with "field: message"', async () => {
    const qa = await t.signInAs('qa');
    const { ref: _ref, ...noRef } = example;
    void _ref;
    const missing = await qa.post('/api/vectors').send({ ...noRef, id: 'caps/x/no-ref' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/^ref: /);
    const badId = await qa.post('/api/vectors').send({ ...example, id: 'Caps/Upper Case' });
    expect(badId.body.error.message).toMatch(/^id: /);
    const extra = await qa.post('/api/vectors').send({ ...example, id: 'caps/x/extra', colour: 'red' });
    expect(extra.status).toBe(400);
    const device = await qa.post('/api/vectors').send({ ...example, id: 'caps/x/device', deviceId: 999 });
    expect(device.body.error.message).toBe('deviceId: no device under test has that id');
  });

  it('saves a new revision on top of the one edited, and answers a stale save with 409 and the stored version', async () => {
    const engineer = await t.signInAs('engineer');
    const qa = await t.signInAs('qa');
    const mine = await engineer.put(`/api/vectors/${encodedId}`).send({ ...example, title: 'A 45 W source offers 9 V', revision: 1, message: 'Shorter title' });
    expect(mine.status, JSON.stringify(mine.body)).toBe(200);
    expect(mine.body.revision).toBe(2);
    expect(mine.body.meta.updatedBy.name).toBe('Emery Engineer');
    expect(mine.body.meta.author.name).toBe('Quinn Tester');

    // QA still holds revision 1.
    const stale = await qa.put(`/api/vectors/${encodedId}`).send({ ...example, tags: ['power-rules'], revision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('vector.stale');
    expect(stale.body.error.details.revision).toBe(2);
    expect(stale.body.error.details.vector.title).toBe('A 45 W source offers 9 V');
    expect(stale.body.error.details.updatedBy).toBe('Emery Engineer');
    expect(stale.body.error.details.text).toBe(formatVector({ ...example, title: 'A 45 W source offers 9 V' }));

    // Merged on top of the latest, it goes through.
    const merged = await qa.put(`/api/vectors/${encodedId}`).send({ ...stale.body.error.details.vector, tags: ['power-rules'], revision: 2, message: 'Merged' });
    expect(merged.status).toBe(200);
    expect(merged.body.revision).toBe(3);
    expect(merged.body.tags).toEqual(['power-rules']);
  });

  it('lets only one of two concurrent saves of the same revision win', async () => {
    const [a, b] = [await t.signInAs('qa'), await t.signInAs('engineer')];
    const results = await Promise.all([
      a.put(`/api/vectors/${encodedId}`).send({ ...example, tags: ['power-rules'], title: 'Concurrent A', revision: 3 }),
      b.put(`/api/vectors/${encodedId}`).send({ ...example, tags: ['power-rules'], title: 'Concurrent B', revision: 3 }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
  });

  it('keeps every revision with author, time, message and the formatted file', async () => {
    const viewer = await t.signInAs('viewer');
    const list = await viewer.get(`/api/vectors/${encodedId}/revisions`);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(4);
    expect(list.body.items.map((r: { revision: number }) => r.revision)).toEqual([4, 3, 2, 1]);
    expect(list.body.items[3]).toMatchObject({ revision: 1, message: 'First version', author: { name: 'Quinn Tester' }, createdAt: '2026-03-02T09:00:00.000Z' });
    const first = await viewer.get(`/api/vectors/${encodedId}/revisions/1`);
    expect(first.body.text).toBe(formatVector(example));
    expect(first.body.text.endsWith('}\n')).toBe(true);
    expect((await viewer.get(`/api/vectors/${encodedId}/revisions/99`)).status).toBe(404);
  });

  it('diffs any two revisions line by line', async () => {
    const res = await (await t.signInAs('support')).get(`/api/vectors/${encodedId}/diff?from=1&to=2`);
    expect(res.status).toBe(200);
    expect(res.body.patch).toContain('--- caps/power-rules/45w-without-9v-team.vector.json\trevision 1');
    expect(res.body.patch).toContain('-  "title": "A 45 W source must offer 9 V",');
    expect(res.body.patch).toContain('+  "title": "A 45 W source offers 9 V",');
    const removed = res.body.changes.filter((c: { removed: boolean }) => c.removed);
    expect(removed).toEqual([{ value: '  "title": "A 45 W source must offer 9 V",\n', added: false, removed: true, count: 1 }]);
  });

  it('restores an old revision as a new one', async () => {
    const qa = await t.signInAs('qa');
    const restored = await qa.post(`/api/vectors/${encodedId}/restore`).send({ revision: 1 });
    expect(restored.status).toBe(200);
    expect(restored.body.revision).toBe(5);
    const latest = await qa.get(`/api/vectors/${encodedId}/revisions/5`);
    expect(latest.body.text).toBe(formatVector(example));
    expect(latest.body.message).toBe('Restored revision 1');
  });

  it('lists with search, kind, tag and device filters, sorted and paged', async () => {
    const qa = await t.signInAs('qa');
    const second = {
      ...example,
      id: 'decode/team/accept',
      title: 'Accept from the source',
      kind: 'decode',
      tags: ['control'],
      input: { hex: '4301' },
      expect: { message: { header: { messageType: 'Accept' } } },
    };
    expect((await qa.post('/api/vectors').send({ ...second, deviceId: 1 })).status).toBe(201);
    const all = await qa.get('/api/vectors?sort=-id');
    expect(all.body.total).toBe(2);
    expect(all.body.items.map((v: { id: string }) => v.id)).toEqual(['decode/team/accept', example.id]);
    expect(all.body.tags).toEqual([
      { tag: 'control', count: 1 },
      { tag: 'power-rules', count: 1 },
      { tag: 'team', count: 1 },
    ]);
    expect((await qa.get('/api/vectors?kind=decode')).body.items.map((v: { id: string }) => v.id)).toEqual(['decode/team/accept']);
    expect((await qa.get('/api/vectors?tag=power-rules')).body.total).toBe(1);
    expect((await qa.get('/api/vectors?tag=power')).body.total).toBe(0);
    expect((await qa.get('/api/vectors?q=source%20accept')).body.items[0].id).toBe('decode/team/accept');
    const byDevice = await qa.get('/api/vectors?deviceId=1');
    expect(byDevice.body.items).toHaveLength(1);
    expect(byDevice.body.items[0].device.name).toBe('Kestrel K65 travel adapter');
    const paged = await qa.get('/api/vectors?pageSize=1&page=2&sort=id');
    expect(paged.body.items.map((v: { id: string }) => v.id)).toEqual(['decode/team/accept']);
    expect((await qa.get('/api/vectors?kind=nope')).status).toBe(400);
  });

  it('checks roles: viewers and support read, admin/engineer/qa write, admin and qa delete', async () => {
    const support = await t.signInAs('support');
    expect((await support.get(`/api/vectors/${encodedId}`)).status).toBe(200);
    expect((await support.put(`/api/vectors/${encodedId}`).send({ ...example, revision: 5 })).status).toBe(403);
    expect((await (await t.signInAs('viewer')).post('/api/vectors').send(example)).status).toBe(403);
    expect((await t.request().get('/api/vectors')).status).toBe(401);
    expect((await (await t.signInAs('engineer')).delete('/api/vectors/decode%2Fteam%2Faccept')).status).toBe(403);
    const qa = await t.signInAs('qa');
    expect((await qa.delete('/api/vectors/decode%2Fteam%2Faccept')).status).toBe(204);
    expect((await qa.get('/api/vectors/decode%2Fteam%2Faccept')).status).toBe(404);
  });
});

describe('zip export and import', () => {
  let library: TestApp;
  let firstZip: Buffer;

  beforeAll(async () => {
    library = await createTestApp();
    await seedTeamLibrary(library.orm.em.fork(), createTestClock());
  });
  afterAll(() => library.close());

  const download = async (app: TestApp, query = '') => {
    const res = await (await app.signInAs('viewer'))
      .get(`/api/vectors/export${query}`)
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    return res.body as Buffer;
  };

  it('exports the built-in library as a folder of <id>.vector.json files, each the repository file byte for byte', async () => {
    firstZip = await download(library);
    const files = unzipSync(new Uint8Array(firstZip));
    const names = Object.keys(files);
    const count = await library.orm.em.fork().count(TeamVector);
    expect(count).toBeGreaterThan(50);
    expect(names).toHaveLength(count);
    for (const name of names) {
      expect(name).toMatch(/^vectors\/[a-z0-9/._-]+\.vector\.json$/);
      const original = await readFile(join(builtInVectorsDir, name.slice('vectors/'.length)), 'utf8');
      expect(strFromU8(files[name]!), name).toBe(original);
    }
  });

  it('filters the export like the list', async () => {
    const zip = unzipSync(new Uint8Array(await download(library, '?kind=encode')));
    expect(Object.keys(zip).length).toBeGreaterThan(0);
    expect(Object.keys(zip).every((name) => name.startsWith('vectors/encode/'))).toBe(true);
  });

  it('imports into an empty library and exports the same zip again, byte for byte', async () => {
    const other = await createTestApp();
    try {
      const qa = await other.signInAs('qa');
      const imported = await qa.post('/api/vectors/import').attach('file', firstZip, 'library.zip');
      expect(imported.status, JSON.stringify(imported.body)).toBe(200);
      const total = Object.keys(unzipSync(new Uint8Array(firstZip))).length;
      expect(imported.body).toEqual({ created: total, updated: 0, unchanged: 0, total });
      const again = await download(other);
      expect(Buffer.compare(again, firstZip)).toBe(0);

      // Importing it once more changes nothing; one edited file becomes one new revision.
      expect((await qa.post('/api/vectors/import').attach('file', firstZip, 'library.zip')).body).toEqual({ created: 0, updated: 0, unchanged: total, total });
      const files = unzipSync(new Uint8Array(firstZip));
      const name = Object.keys(files)[0]!;
      const edited = JSON.parse(strFromU8(files[name]!)) as Record<string, unknown>;
      files[name] = strToU8(formatVector({ ...edited, title: `${String(edited.title)} (edited)` }));
      const res = await qa.post('/api/vectors/import').attach('file', Buffer.from(zipSync(files)), 'edited.zip');
      expect(res.body).toEqual({ created: 0, updated: 1, unchanged: total - 1, total });
      const id = name.slice('vectors/'.length, -'.vector.json'.length);
      const history = await qa.get(`/api/vectors/${encodeURIComponent(id)}/revisions`);
      expect(history.body.items[0]).toMatchObject({ revision: 2, message: 'Imported from edited.zip', author: { name: 'Quinn Tester' } });
    } finally {
      await other.close();
    }
  });

  it('imports nothing when one file is not a valid vector, and says which', async () => {
    const qa = await library.signInAs('qa');
    const zip = zipSync({ 'vectors/good/one.vector.json': strToU8(formatVector({ ...example, id: 'good/one' })), 'vectors/bad.vector.json': strToU8('{"vector": 1, "id": "bad"}') });
    const res = await qa.post('/api/vectors/import').attach('file', Buffer.from(zip), 'mixed.zip');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('vector.import-invalid');
    expect(res.body.error.details[0].file).toBe('vectors/bad.vector.json');
    expect((await qa.get('/api/vectors/good%2Fone')).status).toBe(404);
    const notZip = await qa.post('/api/vectors/import').attach('file', Buffer.from('hello'), 'x.zip');
    expect(notZip.status).toBe(400);
    expect(notZip.body.error.message).toMatch(/^file: not a readable zip/);
    expect((await (await library.signInAs('support')).post('/api/vectors/import').attach('file', Buffer.from(zip), 'x.zip')).status).toBe(403);
  });
});
