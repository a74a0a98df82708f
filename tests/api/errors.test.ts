import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ rateLimits: { login: { windowMs: 60_000, limit: 3 } } });
});
afterAll(() => t.close());

const expectErrorShape = (body: unknown) => {
  expect(body).toEqual({ error: expect.objectContaining({ code: expect.any(String), message: expect.any(String) }) });
  expect(JSON.stringify(body)).not.toMatch(/at .*\.ts:\d+|node_modules/);
};

describe('error replies', () => {
  it('answers malformed JSON with 400 malformed_json', async () => {
    const res = await t.request().post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body.error).toEqual({ code: 'input.malformed-json', message: 'body: malformed JSON' });
  });

  it('answers wrong types with 400 and "field: message"', async () => {
    const res = await t.request().post('/api/auth/login').send({ email: 42, password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('input.invalid');
    expect(res.body.error.message).toMatch(/^email: /);
    expect(res.body.error.details).toEqual([{ path: 'email', message: expect.any(String) }]);
  });

  it('names nested fields with dots and the location for a missing body', async () => {
    const admin = await t.signInAs('admin');
    const nested = await admin.post('/api/devices').send({ name: 'X', role: 'source', pdpW: 10, pdos: ['0001912c', 'zz'] });
    expect(nested.status).toBe(400);
    expect(nested.body.error.message).toBe('pdos.1: must be 8 hex digits, e.g. 0001912c');
    const query = await admin.get('/api/audit?page=0');
    expect(query.status).toBe(400);
    expect(query.body.error.message).toMatch(/^page: /);
    const params = await admin.get('/api/outbox/abc');
    expect(params.status).toBe(400);
    expect(params.body.error.message).toMatch(/^id: /);
  });

  it('answers an unknown API route with 404 JSON', async () => {
    const res = await t.request().get('/api/no/such/thing?x=1');
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: 'route.not-found', message: 'No API route GET /api/no/such/thing' });
  });

  it('answers an oversized body with 413 JSON', async () => {
    const res = await t
      .request()
      .post('/api/auth/login')
      .send({ email: 'a@b.example', password: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('request.too-large');
    expectErrorShape(res.body);
  });

  it('rate-limits failed sign-ins per address and e-mail with 429 JSON', async () => {
    const attempt = (email: string) => t.request().post('/api/auth/login').send({ email, password: 'wrong-password' });
    for (let i = 0; i < 3; i += 1) expect((await attempt('viewer@kestrel.example')).status).toBe(401);
    const limited = await attempt('viewer@kestrel.example');
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('request.rate-limited');
    expect(limited.headers['ratelimit-policy']).toBeDefined();
    // Another account from the same address is not locked out.
    expect((await attempt('qa@kestrel.example')).status).toBe(401);
  });

  it('turns an unexpected exception into 500 without a stack', async () => {
    const broken = await createTestApp({
      routes: [{ method: 'get', path: '/api/boom', access: 'anyone', handler: async () => Promise.reject(new Error('secret detail at /srv/x.ts:1')) }],
    });
    const res = await broken.request().get('/api/boom');
    await broken.close();
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('server.internal');
    expect(res.text).not.toContain('secret detail');
  });
});
