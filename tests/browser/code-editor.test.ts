import { describe, expect, it } from 'vitest';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

// A viewer opens a library vector: the file is shown in read-only Monaco with the vector JSON
// Schema. Monaco and its JSON worker must load from the bundle under the server's CSP, with no
// request leaving the machine.
const vectorId = 'caps/pdp/declared';

describe.skipIf(!hasChromium)('the code editor, offline', () => {
  const suite = useBrowserSuite();

  it('shows a vector file in read-only Monaco with its JSON worker running', async () => {
    const { page, watch } = await suite.newPage();
    const workers: string[] = [];
    page.on('worker', (worker) => workers.push(worker.url()));

    await signIn(page, suite.url, 'viewer');
    await page.goto(`${suite.url}/library/${encodeURIComponent(vectorId)}`);
    await page.getByRole('heading', { level: 1, name: vectorId }).waitFor();

    const editor = page.getByTestId('code-editor').locator('.monaco-editor');
    await editor.waitFor({ timeout: 20_000 });
    await expect.poll(() => editor.locator('.view-lines').innerText(), { timeout: 10_000 }).toContain(vectorId);
    // Monaco starts the JSON language worker for a json model; it must come from our own origin.
    await expect.poll(() => workers.some((url) => url.includes('json.worker')), { timeout: 10_000 }).toBe(true);
    for (const url of workers) expect(url.startsWith(suite.url) || url.startsWith('blob:')).toBe(true);

    // Read-only for a viewer: typing changes nothing.
    const before = await editor.locator('.view-lines').innerText();
    await editor.click();
    await page.keyboard.type('x');
    expect(await editor.locator('.view-lines').innerText()).toBe(before);

    await screenshot(page, 'code-editor-light');
    await page.emulateMedia({ colorScheme: 'dark' });
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await screenshot(page, 'code-editor-dark');
    watch.assertClean();
  });
});
