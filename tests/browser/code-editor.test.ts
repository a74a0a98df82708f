import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  launchBrowser,
  requireChromium,
  requireDist,
  screenshot,
  signIn,
  startTestServer,
  watchPage,
  type TestBrowser,
  type TestServer,
} from './support.ts';

const hasChromium = requireChromium();

// The audit log is the first page with the code editor: Monaco and its JSON worker must load
// from the bundle under the server's CSP, with no request leaving the machine.
describe.skipIf(!hasChromium)('the code editor, offline', () => {
  let server: TestServer;
  let browser: TestBrowser;

  beforeAll(async () => {
    requireDist();
    server = await startTestServer();
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('shows an audit event in read-only Monaco with its JSON worker running', async () => {
    const page = await browser.context.newPage();
    const watch = watchPage(page);
    const workers: string[] = [];
    page.on('worker', (worker) => workers.push(worker.url()));

    await signIn(page, server.url, 'admin');
    await page.goto(`${server.url}/admin/audit`);
    await page.getByRole('heading', { level: 1, name: 'Audit log' }).waitFor();
    const firstEvent = page.getByRole('table', { name: 'Audit log' }).getByRole('row').nth(1);
    await firstEvent.getByText('auth.sign_in').waitFor();
    await firstEvent.click();

    const editor = page.getByTestId('code-editor').locator('.monaco-editor');
    await editor.waitFor({ timeout: 20_000 });
    await expect.poll(() => editor.locator('.view-lines').innerText(), { timeout: 10_000 }).toContain('{');
    // Monaco starts the JSON language worker for a json model; it must come from our own origin.
    await expect.poll(() => workers.some((url) => url.includes('json.worker')), { timeout: 10_000 }).toBe(true);
    for (const url of workers) expect(url.startsWith(server.url) || url.startsWith('blob:')).toBe(true);

    // Read-only: typing changes nothing.
    const before = await editor.locator('.view-lines').innerText();
    await editor.click();
    await page.keyboard.type('x');
    expect(await editor.locator('.view-lines').innerText()).toBe(before);

    await screenshot(page, 'audit-light');
    await page.emulateMedia({ colorScheme: 'dark' });
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await screenshot(page, 'audit-dark');
    watch.assertClean();
    await page.close();
  });
});
