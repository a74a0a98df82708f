import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createTestApp, type TestApp } from '../support/test-app.ts';

let t: TestApp;
let apiOnly: TestApp;
const dist = mkdtempSync(join(tmpdir(), 'parley-dist-'));

beforeAll(async () => {
  mkdirSync(join(dist, 'assets'));
  writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Parley</title><div id="root"></div>');
  writeFileSync(join(dist, 'assets', 'index-abc123.js'), `console.log(${JSON.stringify('x'.repeat(4000))});`);
  writeFileSync(join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  t = await createTestApp({ distDir: dist });
  apiOnly = await createTestApp({ distDir: join(dist, 'missing') });
});
afterAll(async () => {
  await t.close();
  await apiOnly.close();
  rmSync(dist, { recursive: true, force: true });
});

describe('security headers', () => {
  it('sends a CSP that allows only our own origin', async () => {
    const res = await t.request().get('/api/health');
    expect(res.body).toMatchObject({ ok: true });
    const csp = res.headers['content-security-policy'] as string;
    expect(csp.split(';').sort()).toEqual(
      [
        "default-src 'self'",
        "script-src 'self'",
        "style-src 'self' 'unsafe-inline'",
        "img-src 'self' data: blob:",
        "font-src 'self' data:",
        "worker-src 'self' blob:",
        "connect-src 'self'",
        "object-src 'none'",
        "base-uri 'self'",
        "form-action 'self'",
        "frame-ancestors 'none'",
      ].sort(),
    );
    expect(csp).not.toMatch(/https?:|\*/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('serving the built client', () => {
  it('caches hashed assets for a year and compresses them', async () => {
    const res = await t.request().get('/assets/index-abc123.js').set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['content-encoding']).toBe('gzip');
  });

  it('revalidates index.html and falls back to it for client routes', async () => {
    for (const path of ['/', '/invite/some-token', '/vectors/a/b']) {
      const res = await t.request().get(path);
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(res.text).toContain('<div id="root">');
    }
    expect((await t.request().get('/favicon.svg')).headers['cache-control']).toBe('no-cache');
  });

  it('answers a missing asset and unknown /api paths with 404, never index.html', async () => {
    const asset = await t.request().get('/assets/missing-000.js');
    expect(asset.status).toBe(404);
    const api = await t.request().get('/api/vectors-not-yet');
    expect(api.status).toBe(404);
    expect(api.body.error.code).toBe('route.not-found');
  });

  it('serves the API alone when dist/ is missing', async () => {
    expect((await apiOnly.request().get('/api/health')).body).toMatchObject({ ok: true });
    const page = await apiOnly.request().get('/');
    expect(page.status).toBe(404);
    expect(page.text).toContain('client is not built');
  });
});
