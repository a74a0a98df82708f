/**
 * Cross-site writes (issue 14, item 5) from a real browser: a page on another port of the same
 * host is another origin but the same site, so SameSite=Lax still sends the session cookie with
 * its multipart form posts and no-cors fetches. Signed in as QA, the victim opens that page; it
 * posts a trace upload as a form and a library import (a zip that rewrites a vector) with fetch.
 * Neither may change anything, and the same writes from Parley's own pages still work.
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { libraryZip } from '../../server/features/vectors/zip.ts';
import { requireChromium, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

/** The attacker's page: a multipart form to the trace upload, then a no-cors fetch of a zip to the import. */
function attackerPage(target: string, zipBase64: string): string {
  return `<!doctype html><html><body>
<iframe name="sink" title="sink"></iframe>
<form id="upload" method="post" enctype="multipart/form-data" action="${target}/api/traces" target="sink">
  <input name="title" value="planted by another site"><input type="file" name="file" id="file">
</form>
<script>
  const log = new File(['{"t":0,"msg":"41A1"}\\n'], 'planted.jsonl', { type: 'text/plain' });
  const files = new DataTransfer();
  files.items.add(log);
  document.getElementById('file').files = files.files;
  document.getElementById('upload').submit();
  const zip = Uint8Array.from(atob('${zipBase64}'), (c) => c.charCodeAt(0));
  const body = new FormData();
  body.append('file', new Blob([zip], { type: 'application/zip' }), 'library.zip');
  window.importSent = fetch('${target}/api/vectors/import', { method: 'POST', mode: 'no-cors', credentials: 'include', body })
    .then(() => 'sent', (error) => String(error));
</script></body></html>`;
}

describe.skipIf(!hasChromium)('writes from another origin of the same host', () => {
  const suite = useBrowserSuite();
  let attacker: Server;
  let attackerUrl = '';
  let zipBase64 = '';
  let target = { vectorId: '', title: '' };

  beforeAll(async () => {
    attacker = createServer((_req, res) => {
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
      res.end(attackerPage(suite.url, zipBase64));
    });
    await new Promise<void>((done) => attacker.listen(0, '127.0.0.1', done));
    // The same host name as the server's URL, another port: another origin, the same site.
    attackerUrl = `${new URL(suite.url).protocol}//${new URL(suite.url).hostname}:${(attacker.address() as AddressInfo).port}`;
  });
  afterAll(() => new Promise<void>((done) => attacker.close(() => done())));

  it("refuses the form and the fetch (403 request.cross-site), while Parley's own page still writes", async () => {
    const { page } = await suite.newPage();
    await signIn(page, suite.url, 'qa');
    const api = page.context().request;
    const list = await (await api.get(`${suite.url}/api/vectors?pageSize=1`)).json();
    const first = list.items[0] as { id: string; title: string };
    const original = await (await api.get(`${suite.url}/api/vectors/${encodeURIComponent(first.id)}`)).json();
    target = { vectorId: first.id, title: first.title };
    const { revision: _revision, deviceId: _deviceId, meta: _meta, ...file } = original as Record<string, unknown>;
    const rewritten = `${JSON.stringify({ ...file, title: 'Rewritten by another site' }, null, 2)}\n`;
    zipBase64 = Buffer.from(libraryZip([{ vectorId: first.id, text: rewritten }])).toString('base64');
    const tracesBefore = (await (await api.get(`${suite.url}/api/traces?pageSize=1`)).json()).total as number;

    const refusals: { url: string; status: number; body: string }[] = [];
    page.on('response', async (response) => {
      if (response.request().method() !== 'POST') return;
      refusals.push({ url: response.url(), status: response.status(), body: await response.text().catch(() => '') });
    });
    await page.goto(attackerUrl);
    // The server answers 403 before reading the zip, so the browser may see the upload cut short.
    expect(['sent', 'TypeError: Failed to fetch']).toContain(await page.evaluate(() => (window as unknown as { importSent: Promise<string> }).importSent));
    await expect.poll(() => refusals.some((r) => r.url.endsWith('/api/traces')), { timeout: 15_000 }).toBe(true);

    for (const refusal of refusals) {
      expect(refusal.status, refusal.url).toBe(403);
      // The form's answer is readable in its frame; the no-cors fetch's body is opaque to the page but not to the test.
      if (refusal.body !== '') expect(JSON.parse(refusal.body).error.code).toBe('request.cross-site');
    }
    const after = await (await api.get(`${suite.url}/api/vectors/${encodeURIComponent(target.vectorId)}`)).json();
    expect(after.title).toBe(target.title);
    expect(after.revision).toBe(original.revision);
    expect((await (await api.get(`${suite.url}/api/traces?pageSize=1`)).json()).total).toBe(tracesBefore);

    // The same kind of write from Parley's own origin, in the signed-in page, is taken.
    await page.goto(`${suite.url}/`);
    const status = await page.evaluate(async () => {
      const body = new FormData();
      body.append('file', new File(['{"t":0,"msg":"41A1"}\n'], 'own.jsonl', { type: 'text/plain' }));
      return (await fetch('/api/traces', { method: 'POST', credentials: 'include', body })).status;
    });
    expect([201, 202]).toContain(status);
  });
});
