import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, requireChromium, screenshot, signIn, useBrowserSuite, watchPage } from './support.ts';

const hasChromium = requireChromium();

// The team library end to end: the demo server seeds it from the built-in vectors/ folder.
const vectorId = 'caps/power-rules/45w-without-9v';

async function monacoText(page: Page): Promise<string> {
  // Monaco renders only the visible lines; the model holds the whole file.
  return page.evaluate(() => {
    const w = window as unknown as { monaco?: { editor: { getModels(): { uri: { path: string }; getValue(): string }[] } } };
    const model = w.monaco?.editor.getModels().find((m) => m.uri.path === '/vector.json');
    if (model) return model.getValue();
    // Monaco draws spaces as no-break spaces.
    return Array.from(document.querySelectorAll('[data-testid="code-editor"] .view-lines'))
      .map((el) => (el as HTMLElement).innerText)
      .join('\n')
      .replace(/\u00a0/g, ' ');
  });
}

describe.skipIf(!hasChromium)('the team library', () => {
  const suite = useBrowserSuite();

  it('filters, edits in the form with the JSON following, saves, shows history and a diff, merges a stale edit, runs all', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'qa');

    await page.goto(`${suite.url}/library`);
    await page.getByRole('heading', { level: 1, name: 'Library' }).waitFor();
    const table = page.getByRole('table', { name: 'Vectors' });
    await table.getByRole('row').nth(1).waitFor();
    await page.getByLabel('Kind').selectOption('caps');
    await page.getByLabel('Search').fill('45w-without');
    await expect.poll(() => table.getByRole('row').count(), { timeout: 10_000 }).toBe(2);
    await expect.poll(() => page.url()).toContain('kind=caps');
    await screenshot(page, 'library-filtered');

    await table.getByText(vectorId, { exact: true }).click();
    await page.getByRole('heading', { level: 1, name: vectorId }).waitFor();
    await page.getByTestId('code-editor').first().locator('.monaco-editor').waitFor({ timeout: 20_000 });
    await expect.poll(() => monacoText(page), { timeout: 10_000 }).toContain('"id": "caps/power-rules/45w-without-9v"');

    // Edit in the form; the file follows.
    const title = page.getByLabel('Title');
    await title.fill('A 45 W source must offer 9 V (edited in the form)');
    await expect.poll(() => monacoText(page)).toContain('"title": "A 45 W source must offer 9 V (edited in the form)"');
    await page.getByLabel('Findings that must appear').fill('caps.power-rules-missing, caps.pdp-inferred');
    await expect.poll(() => monacoText(page)).toContain('"include": ["caps.power-rules-missing", "caps.pdp-inferred"]');
    await page.getByLabel('Findings that must appear').fill('caps.power-rules-missing');
    // The input's font has no DC symbol (U+2393): the placeholder goes without it, the hint below draws it.
    expect(await page.getByLabel('Printed rating label').getAttribute('placeholder')).not.toContain('\u2393');
    await page
      .getByText(/^(For example|As printed:)/)
      .filter({ has: page.locator('svg') })
      .first()
      .waitFor();
    await page.getByLabel('Revision message').fill('Clearer title');
    await screenshot(page, 'library-vector-edit');
    await page.getByRole('button', { name: 'Save revision 2' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved revision 2.' }).waitFor();

    // History and a diff between revisions 1 and 2.
    await page.getByRole('tab', { name: 'History' }).click();
    const revisions = page.getByRole('table', { name: 'Revisions' });
    await revisions.getByText('Clearer title').waitFor();
    const diff = page.getByRole('region', { name: 'Diff from revision 1 to 2' });
    await diff.locator('[data-diff="added"]').first().waitFor();
    expect(await diff.locator('[data-diff="removed"]').allInnerTexts()).toEqual([expect.stringContaining('"title": "A 45 W source must offer 9 V (vector.md example)')]);
    expect(await diff.locator('[data-diff="added"]').allInnerTexts()).toEqual([expect.stringContaining('(edited in the form)')]);
    await screenshot(page, 'library-history');
    await page.getByRole('tab', { name: 'Edit' }).click();

    // A second page opens revision 2; the first saves revision 3; the second's save is stale.
    const second = await suite.context.newPage();
    const secondWatch = watchPage(second);
    await second.goto(`${suite.url}/library/${encodeURIComponent(vectorId)}`);
    await second.getByRole('heading', { level: 1, name: vectorId }).waitFor();
    await page.getByLabel('Title').fill('First page wins');
    await page.getByRole('button', { name: 'Save revision 3' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved revision 3.' }).waitFor();
    await second.getByLabel('Title').fill('Second page was late');
    await second.getByRole('button', { name: 'Save revision 3' }).click();
    const merge = second.getByRole('region', { name: 'Merge your change' });
    await merge.waitFor();
    await merge.getByText('Someone saved this vector while you were editing').waitFor();
    await expect.poll(() => merge.getByRole('region', { name: 'Their version', exact: true }).innerText()).toContain('First page wins');
    await expect.poll(() => merge.getByRole('region', { name: 'Your version', exact: true }).innerText()).toContain('Second page was late');
    await screenshot(second, 'library-merge');
    await merge.getByRole('button', { name: 'Keep mine and save' }).click();
    await second.getByRole('status').filter({ hasText: 'Saved revision 4.' }).waitFor();
    secondWatch.assertClean();
    await second.close();

    // Run all from the library; the progress bar fed by the event stream reaches the end.
    await page.goto(`${suite.url}/library`);
    await page.getByRole('button', { name: 'Run all' }).click();
    const bar = page.getByRole('progressbar', { name: 'Vectors run' });
    await bar.waitFor();
    await expect.poll(() => bar.getAttribute('aria-valuenow'), { timeout: 120_000, interval: 500 }).toBe('100');
    await page.getByRole('link', { name: 'Open the results' }).waitFor({ timeout: 15_000 });
    await screenshot(page, 'library-run-done');
    await page.getByRole('link', { name: 'Open the results' }).click();
    await page.getByRole('table', { name: 'Results' }).getByRole('row').nth(1).waitFor();
    await screenshot(page, 'runs-detail');
    await page.emulateMedia({ colorScheme: 'dark' });
    await screenshot(page, 'runs-detail-dark');
    await page.goto(`${suite.url}/library`);
    await page.getByRole('table', { name: 'Vectors' }).getByRole('row').nth(1).waitFor();
    await screenshot(page, 'library-dark');
    watch.assertClean();
  }, 240_000);

  it('lets an admin create an API token and shows it once with the curl command', async () => {
    const adminBrowser = await launchBrowser();
    const page = await adminBrowser.context.newPage();
    const watch = watchPage(page);
    await signIn(page, suite.url, 'admin');
    await page.goto(`${suite.url}/admin/tokens`);
    await page.getByLabel('Project').fill('k65-firmware');
    await page.getByLabel('Name').fill('Firmware CI');
    await page.getByRole('button', { name: 'Create token' }).click();
    const token = await page.getByTestId('new-token').innerText();
    expect(token).toMatch(/^prl_/);
    await page.getByRole('region', { name: 'New token' }).getByText(`-F project=k65-firmware`).waitFor();
    await page.getByRole('table', { name: 'API tokens' }).getByText('Firmware CI').waitFor();
    await screenshot(page, 'tokens');
    // The token posts a result; the Runs page lists it.
    const posted = await page.evaluate(async (bearer) => {
      const res = await fetch('/api/runs?build=fw-2.0.1', {
        method: 'POST',
        headers: { Authorization: `Bearer ${bearer}`, 'Content-Type': 'application/json' },
        body: JSON.stringify({ results: [{ id: 'caps/power-rules/45w-without-9v', ok: true }] }),
      });
      return res.status;
    }, token);
    expect(posted).toBe(201);
    await page.goto(`${suite.url}/runs`);
    await page.getByRole('table', { name: 'Runs' }).getByText('fw-2.0.1').waitFor();
    await screenshot(page, 'runs-list');
    watch.assertClean();
    await adminBrowser.close();
  }, 60_000);

  it('edits the offers of a caps and a request vector with the Offers page editor, writing the PDO words', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'qa');
    // A caps vector given as a whole message (5, 9, 15 V at 3 A): the editor reads its offers.
    await page.goto(`${suite.url}/library/${encodeURIComponent('caps/hex/source-caps-message')}`);
    await page.getByRole('heading', { level: 1, name: 'caps/hex/source-caps-message' }).waitFor();
    const offers = page.getByRole('list', { name: 'Power data objects' });
    await expect.poll(() => offers.getByRole('listitem').count()).toBe(3);
    expect(await offers.getByLabel('Offer 3').getByLabel('Voltage (mV)').inputValue()).toBe('15000');
    await page.getByRole('button', { name: 'Add offer' }).click();
    await offers.getByLabel('Offer 4').getByLabel('Voltage (mV)').fill('20000');
    // 20 V 3 A fixed: 400 × 50 mV in bits 19…10, 300 × 10 mA in bits 9…0 (USB PD R3.2 Table 6-9, from memory).
    const words = page.getByLabel('PDOs (32-bit hex)');
    await expect.poll(() => words.inputValue()).toBe('0x0001912c, 0x0002d12c, 0x0004b12c, 0x0006412c');
    expect(await page.getByLabel('Source_Capabilities message (hex)').inputValue()).toBe('');
    // A value off the PDO's 50 mV step is refused beside the field and writes nothing.
    await offers.getByLabel('Offer 4').getByLabel('Voltage (mV)').fill('20010');
    await offers.getByLabel('Offer 4').getByText('must be a multiple of 50 mV').waitFor();
    expect(await words.inputValue()).toBe('0x0001912c, 0x0002d12c, 0x0004b12c, 0x0006412c');
    await offers.getByLabel('Offer 4').getByLabel('Voltage (mV)').fill('20000');
    await screenshot(page, 'library-caps-offers-editor');
    await page.getByLabel('Revision message').fill('Offer 20 V as well');
    await page.getByRole('button', { name: 'Save revision 2' }).click();
    await page.getByRole('status').filter({ hasText: 'Saved revision 2.' }).waitFor();

    // A request vector: 9 V offered at 2 A; raise it to 3 A and the word follows.
    await page.goto(`${suite.url}/library/${encodeURIComponent('request/fixed/less-current')}`);
    await page.getByRole('heading', { level: 1, name: 'request/fixed/less-current' }).waitFor();
    await expect.poll(() => offers.getByLabel('Offer 2').getByLabel('Max current (mA)').inputValue()).toBe('2000');
    await offers.getByLabel('Offer 2').getByLabel('Max current (mA)').fill('3000');
    await expect.poll(() => page.getByLabel('PDOs (32-bit hex)').inputValue()).toBe('0x0001912c, 0x0002d12c');
    await screenshot(page, 'library-request-offers-editor');
    watch.assertClean();
  });
});
