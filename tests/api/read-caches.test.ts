/**
 * What the read paths keep in memory never outlives the data it was read from, and never crosses
 * from one database to another: the library's answers (search matches, totals, tag counts) are kept
 * per database while its version stands, whole list and trace answers are kept serialised under
 * keys that change with their data and are answered only after the same checks as the route's own
 * path, and a session cookie's checked signature never outlives its expiry or a sign-out.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createTestApp, createTestClock, type TestApp } from '../support/test-app.ts';
import { RunResult, TeamVector } from '../../server/db/library-entities.ts';
import { DeviceUnderTest, User } from '../../server/db/entities.ts';
import { Trace } from '../../server/db/trace-entities.ts';
import { route } from '../../server/route-def.ts';
import { routeTable } from '../../server/routes.ts';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';

// vector.md's example shape: a 45 W source must offer 9 V (USB PD R3.1, §10.2.3).
const vectorOf = (id: string, title: string, tags: string[]) => ({
  vector: 1,
  id,
  title,
  tags,
  ref: 'USB PD R3.1, §10.2.3',
  kind: 'caps',
  input: { pdos: ['0x0001912c', '0x0004b12c', '0x000640e1'], pdpW: 45 },
  expect: { findings: { include: ['caps.power-rules-missing'], exclude: [] } },
});

const clock = createTestClock();
let first: TestApp;
let second: TestApp;
const dataDir = mkdtempSync(join(tmpdir(), 'parley-read-caches-'));
beforeAll(async () => {
  [first, second] = await Promise.all([createTestApp({ clock, dataDir: join(dataDir, 'first') }), createTestApp({ dataDir: join(dataDir, 'second') })]);
});
afterAll(async () => {
  await Promise.all([first.close(), second.close()]);
  rmSync(dataDir, { recursive: true, force: true });
});

const ids = (body: { items: { id: string }[] }) => body.items.map((v) => v.id);

describe('the library answers kept in memory', () => {
  it('are kept per database: two servers in one process at the same library version each answer their own', async () => {
    const [a, b] = await Promise.all([first.signInAs('qa'), second.signInAs('qa')]);
    expect((await a.post('/api/vectors').send(vectorOf('caps/kept/first-only', 'First database source', ['first-team']))).status).toBe(201);
    expect((await b.post('/api/vectors').send(vectorOf('caps/kept/second-only', 'Second database source', ['second-team']))).status).toBe(201);
    for (let round = 0; round < 2; round++) {
      // The same search, total and tag menu asked of both, twice (the second time from memory).
      const [listA, listB] = await Promise.all([a.get('/api/vectors?q=database%20source'), b.get('/api/vectors?q=database%20source')]);
      expect([ids(listA.body), listA.body.total]).toEqual([['caps/kept/first-only'], 1]);
      expect([ids(listB.body), listB.body.total]).toEqual([['caps/kept/second-only'], 1]);
      expect(listA.body.tags).toEqual([{ tag: 'first-team', count: 1 }]);
      expect(listB.body.tags).toEqual([{ tag: 'second-team', count: 1 }]);
      expect((await a.get('/api/vectors')).body.total).toBe(1);
      expect((await b.get('/api/vectors')).body.total).toBe(1);
    }
  });

  it('are stale at once when another instance changes the library (a write this process never saw)', async () => {
    const qa = await first.signInAs('qa');
    expect((await qa.get('/api/vectors?q=renamed')).body.total).toBe(0);
    expect((await qa.get('/api/vectors?tag=first-team')).body.total).toBe(1);
    // Another instance's write: straight to the database, past every route of this app.
    await first.orm.em.fork().nativeUpdate(TeamVector, { vectorId: 'caps/kept/first-only' }, { title: 'Renamed source', tags: ' renamed ' });
    const found = await qa.get('/api/vectors?q=renamed');
    expect([ids(found.body), found.body.total]).toEqual([['caps/kept/first-only'], 1]);
    expect(found.body.items[0].title).toBe('Renamed source');
    expect(found.body.tags).toEqual([{ tag: 'renamed', count: 1 }]);
    expect((await qa.get('/api/vectors?tag=first-team')).body.total).toBe(0);
    await first.orm.em.fork().nativeDelete(TeamVector, { vectorId: 'caps/kept/first-only' });
    const gone = await qa.get('/api/vectors?q=renamed');
    expect([ids(gone.body), gone.body.total, gone.body.tags]).toEqual([[], 0, []]);
    expect((await qa.get('/api/vectors')).body.total).toBe(0);
  });
});

describe('the parsed timeline chunks kept in memory', () => {
  it('are kept per database: the same trace and chunk ids in two servers answer each its own trace', async () => {
    const files = ['k65-pps-stops.trace.jsonl', 'd100-vbus-sag.trace.jsonl'];
    const heads: string[][] = [];
    for (const [i, app] of [first, second].entries()) {
      const support = await app.signInAs('support');
      const upload = await support.post('/api/traces').attach('file', readFileSync(join(demoTraceFolder, files[i]!)), files[i]!);
      expect(upload.status).toBe(201);
      expect(upload.body.trace.id).toBe(1);
      heads.push((upload.body.analysis.timeline.messages as { hex: string }[]).slice(0, 8).map((m) => m.hex));
    }
    expect(heads[0]).not.toEqual(heads[1]);
    for (let round = 0; round < 2; round++) {
      for (const [i, app] of [first, second].entries()) {
        const window = await (await app.signInAs('viewer')).get('/api/traces/1/timeline?limit=8');
        expect(window.status).toBe(200);
        expect(window.body.messages.map((m: { hex: string }) => m.hex)).toEqual(heads[i]);
      }
    }
  });
});

describe('the trace page answers kept serialised', () => {
  it('carry an ETag (304 for a client holding it), are the same gzipped, and end with the trace', async () => {
    const support = await second.signInAs('support');
    const upload = await support.post('/api/traces').attach('file', readFileSync(join(demoTraceFolder, 'k65-late-ps-rdy.trace.jsonl')), 'late.jsonl');
    expect(upload.status).toBe(201);
    const path = `/api/traces/${upload.body.trace.id}/timeline?limit=20`;
    const plain = await support.get(path).set('Accept-Encoding', 'identity');
    expect(plain.status).toBe(200);
    expect(plain.body.messages.length).toBeGreaterThan(0);
    const again = await support.get(path).set('Accept-Encoding', 'identity');
    expect(again.body).toEqual(plain.body);
    expect(again.headers.etag).toBe(plain.headers.etag);
    expect((await support.get(path).set('Accept-Encoding', 'identity').set('If-None-Match', String(plain.headers.etag))).status).toBe(304);
    const gzipped = await support.get(path).set('Accept-Encoding', 'gzip');
    expect(gzipped.headers['content-encoding']).toBe('gzip');
    expect(gzipped.headers.etag).not.toBe(plain.headers.etag);
    expect(gzipped.body).toEqual(plain.body);
    // Signed out: 401 before anything kept is looked at; deleted: 404.
    expect((await second.request().get(path)).status).toBe(401);
    expect((await (await second.signInAs('admin')).delete(`/api/traces/${upload.body.trace.id}`)).status).toBe(204);
    expect((await support.get(path)).status).toBe(404);
  });
});

describe('a session cookie checked once', () => {
  it('still ends at its expiry and at sign-out', async () => {
    const cookie = await first.cookieFor('viewer');
    expect((await first.request().get('/api/me').set('Cookie', cookie)).status).toBe(200);
    expect((await first.request().get('/api/me').set('Cookie', cookie)).status).toBe(200);
    clock.advance(12 * 3_600_000 + 1_000);
    expect((await first.request().get('/api/me').set('Cookie', cookie)).status).toBe(401);

    const fresh = await first.cookieFor('viewer');
    expect((await first.request().get('/api/vectors').set('Cookie', fresh)).status).toBe(200);
    expect((await first.request().post('/api/auth/logout').set('Cookie', fresh)).status).toBe(204);
    expect((await first.request().get('/api/vectors').set('Cookie', fresh)).status).toBe(401);
  });
});

describe('list and trace answers kept serialised (and answered before the rest of the middleware)', () => {
  it('are stale at once when a run result, a device or a trace row changes (writes this process never saw)', async () => {
    const qa = await second.signInAs('qa');
    const device = (await qa.get('/api/devices')).body.items[0] as { id: number; name: string };
    const vectorId = 'caps/kept/with-result';
    expect((await qa.post('/api/vectors').send({ ...vectorOf(vectorId, 'Kept result source', ['kept-result']), deviceId: device.id })).status).toBe(201);
    const path = '/api/vectors?q=kept%20result';
    const before = await qa.get(path);
    expect(before.body.items[0]).toMatchObject({ id: vectorId, lastResult: null, device: { id: device.id, name: device.name } });
    // Asked again: the same representation (kept), with the same tag.
    expect((await qa.get(path)).headers.etag).toBe(before.headers.etag);

    const em = () => second.orm.em.fork();
    await em().insert(RunResult, { runId: 9_999, vectorId, ok: false, message: 'kept-answer test failure', durationMs: 1, newFailure: false, createdAt: new Date() });
    const withResult = await qa.get(path);
    expect(withResult.body.items[0].lastResult).toMatchObject({ runId: 9_999, ok: false, message: 'kept-answer test failure' });
    await em().nativeUpdate(DeviceUnderTest, { id: device.id }, { name: 'Kestrel renamed bench supply' });
    expect((await qa.get(path)).body.items[0].device).toEqual({ id: device.id, name: 'Kestrel renamed bench supply' });

    const traces = await qa.get('/api/traces');
    const trace = traces.body.items[0] as { id: number; title: string };
    const summaryPath = `/api/traces/${trace.id}/summary`;
    expect((await qa.get(summaryPath)).body.trace.title).toBe(trace.title);
    await em().nativeUpdate(Trace, { id: trace.id }, { title: 'Retitled elsewhere' });
    expect((await qa.get('/api/traces')).body.items.find((t: { id: number }) => t.id === trace.id).title).toBe('Retitled elsewhere');
    expect((await qa.get(summaryPath)).body.trace.title).toBe('Retitled elsewhere');
  });

  it('answer only what the route itself would: bad input, a bearer token, sign-out, deactivation and roles still decide first', async () => {
    const cookie = await second.cookieFor('support');
    const get = (path: string) => second.request().get(path).set('Cookie', cookie);
    const kept = await get('/api/vectors?pageSize=5');
    expect(kept.status).toBe(200);
    expect((await get('/api/vectors?pageSize=5')).body).toEqual(kept.body);
    expect((await get('/api/vectors?pageSize=5').set('If-None-Match', String(kept.headers.etag))).status).toBe(304);
    // Input the route refuses is refused even with an answer kept for the same filter.
    expect((await get('/api/vectors?pageSize=5&page=0')).status).toBe(400);
    expect((await get('/api/vectors?pageSize=5&note=%00')).status).toBe(400);
    // A bearer token is the normal path's to check (this app accepts none).
    const bearer = await get('/api/vectors?pageSize=5').set('Authorization', 'Bearer not-a-token');
    expect([bearer.status, bearer.body.error.code]).toEqual([401, 'token.not-accepted']);
    // A deactivated account and a signed-out session are refused at once.
    await second.orm.em.fork().nativeUpdate(User, { email: 'support@kestrel.example' }, { active: false });
    expect((await get('/api/vectors?pageSize=5')).status).toBe(401);
    await second.orm.em.fork().nativeUpdate(User, { email: 'support@kestrel.example' }, { active: true });
    expect((await get('/api/vectors?pageSize=5')).status).toBe(200);
    expect((await second.request().post('/api/auth/logout').set('Cookie', cookie)).status).toBe(204);
    expect((await get('/api/vectors?pageSize=5')).status).toBe(401);
  });

  it('check the role before anything kept is looked at', async () => {
    const adminsOnly = route({ method: 'get', path: '/api/kept-for-admins', access: ['admin'], keep: async () => 'always', handler: async () => ({ secret: 'admins only' }) });
    const app = await createTestApp({ routes: [...routeTable, adminsOnly] });
    try {
      const admin = await app.signInAs('admin');
      expect((await admin.get('/api/kept-for-admins')).body).toEqual({ secret: 'admins only' });
      expect((await admin.get('/api/kept-for-admins')).body).toEqual({ secret: 'admins only' });
      expect((await (await app.signInAs('engineer')).get('/api/kept-for-admins')).status).toBe(403);
      expect((await app.request().get('/api/kept-for-admins')).status).toBe(401);
    } finally {
      await app.close();
    }
  });
});
