/**
 * The Properties page's worker runs property code with `new Function`, so its script (and only its
 * script) is served with 'unsafe-eval' in script-src: a dedicated worker takes its CSP from the
 * response that delivers it. Pages and every other asset keep the strict policy.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createTestApp, type TestApp } from '../support/test-app.ts';

let t: TestApp;
const dist = mkdtempSync(join(tmpdir(), 'parley-dist-'));

const directives = (header: unknown) => String(header).split(';').sort();
const strict = [
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
].sort();

beforeAll(async () => {
  mkdirSync(join(dist, 'assets'));
  writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Parley</title><div id="root"></div>');
  for (const name of ['property.worker-Ab_c1-9Z.js', 'rules.worker-Xy12.js', 'index-abc123.js', 'my-property.worker-Ab1.js']) {
    writeFileSync(join(dist, 'assets', name), 'self.onmessage = () => {};');
  }
  t = await createTestApp({ distDir: dist });
});
afterAll(async () => {
  await t.close();
  rmSync(dist, { recursive: true, force: true });
});

describe('the property worker CSP', () => {
  it("serves the property worker's built script with 'unsafe-eval' and nothing else loosened", async () => {
    const res = await t.request().get('/assets/property.worker-Ab_c1-9Z.js');
    expect(res.status).toBe(200);
    const expected = strict.map((d) => (d === "script-src 'self'" ? "script-src 'self' 'unsafe-eval'" : d)).sort();
    expect(directives(res.headers['content-security-policy'])).toEqual(expected);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('keeps the strict CSP on pages, the API, other workers and look-alike names', async () => {
    for (const path of ['/', '/properties', '/api/health', '/assets/rules.worker-Xy12.js', '/assets/index-abc123.js', '/assets/my-property.worker-Ab1.js', '/assets/property.worker-missing.js.map']) {
      const res = await t.request().get(path);
      const csp = res.headers['content-security-policy'];
      expect(directives(csp), path).toEqual(strict);
      expect(String(csp), path).not.toContain('unsafe-eval');
    }
  });
});
