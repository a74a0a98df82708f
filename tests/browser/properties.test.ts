/**
 * The Properties page in Debian's chromium, as QA uses it: a shipped property holds over 200 runs;
 * the planted-bug example fails, shrinks to a 28 W source at 15 V and shows that scenario's
 * timeline; its counterexample is saved as a negotiation vector; a long run is cancelled; the
 * editor completes the engine's API. The property worker evaluates code with `new Function`, so
 * this also proves the server's worker-only 'unsafe-eval' is enough and the page sees no CSP
 * violation.
 */
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

describe.skipIf(!hasChromium)('the Properties page', () => {
  const suite = useBrowserSuite();
  let page: Page;

  const pick = async (title: RegExp) => {
    const picker = page.getByLabel('Example', { exact: true });
    const labels = await picker.locator('option').allInnerTexts();
    const label = labels.find((text) => title.test(text));
    expect(label, `an example matching ${title}`).toBeDefined();
    await picker.selectOption({ label: label! });
  };
  const result = () => page.getByRole('region', { name: 'Result' });
  // From the top: a full-page shot of a scrolled page paints the sticky top bar mid-page.
  const shoot = async (name: string) => {
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, name);
  };
  const runButton = () => page.getByRole('button', { name: /Run property|Running/ });

  it('runs a shipped property, finds and shrinks the planted bug, saves it, cancels a long run', async () => {
    const { page: opened, watch } = await suite.newPage();
    page = opened;
    const workers: string[] = [];
    page.on('worker', (worker) => workers.push(worker.url()));
    await signIn(page, suite.url, 'qa');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Properties' }).click();
    await page.getByRole('heading', { level: 1, name: 'Properties' }).waitFor();

    // A shipped property over every sink policy: 200 runs, holds.
    await pick(/^No sink policy ever requests more than is offered/);
    await page.getByLabel('Runs').fill('200');
    await runButton().click();
    await expect.poll(() => result().getByTestId('verdict').textContent(), { timeout: 30_000 }).toBe('Holds');
    expect(await result().textContent()).toContain('as the vector expects');
    expect(await result().locator('dd').first().textContent()).toBe('200');
    expect(workers.some((url) => /\/assets\/property\.worker-[\w-]+\.js$/.test(url))).toBe(true);

    // The save panel's id and title follow the code: the example's while unchanged, a new name once edited,
    // and what the user types wins.
    const savePanel = page.getByRole('region', { name: 'Save as property vector' });
    const shippedId = await savePanel.getByLabel('Vector id').inputValue();
    const shippedTitle = await savePanel.getByLabel('Title').inputValue();
    expect(shippedId).toMatch(/^property\//);
    await page.getByTestId('code-editor').locator('.monaco-editor .view-lines').click();
    await page.keyboard.press('Control+End');
    await page.keyboard.insertText('\n// tried with a second policy');
    await expect.poll(() => savePanel.getByLabel('Vector id').inputValue()).toBe(`${shippedId}-edited`);
    expect(await savePanel.getByLabel('Title').inputValue()).toBe(`${shippedTitle} (edited)`);
    await savePanel.getByLabel('Vector id').fill('property/rules/second-policy');
    await page.getByTestId('code-editor').locator('.monaco-editor .view-lines').click();
    await page.keyboard.press('Control+End');
    await page.keyboard.insertText('\n// and a third');
    await page.waitForTimeout(200);
    expect(await savePanel.getByLabel('Vector id').inputValue()).toBe('property/rules/second-policy');
    expect(await savePanel.getByLabel('Title').inputValue()).toBe(`${shippedTitle} (edited)`);
    await shoot('properties-save-follows-code');

    // The editor knows the engine and fast-check: completion offers the codec's functions, and a
    // misspelt one is a type problem (the template itself type-checks clean: exactly one problem).
    await pick(/^A new property/);
    await expect.poll(() => page.getByTestId('type-problems').count(), { timeout: 30_000 }).toBe(1);
    const editor = page.getByTestId('code-editor').locator('.monaco-editor');
    await editor.locator('.view-lines').click();
    await page.keyboard.press('Control+End');
    await page.keyboard.press('Enter');
    // insertText, not type: Monaco's suggestions would take some keystrokes of a fast typist.
    await page.keyboard.insertText('declare const probe: PropertyContext;');
    await page.keyboard.press('Enter');
    await page.keyboard.insertText('probe.engine.codec.');
    await page.keyboard.type('decodeM', { delay: 60 });
    const suggestions = page.locator('.suggest-widget .monaco-list-row');
    await expect
      .poll(
        async () => {
          const texts = (await suggestions.allInnerTexts()).join(' ');
          if (!texts) await page.keyboard.press('Control+Space');
          return texts;
        },
        { timeout: 20_000, interval: 1_000 },
      )
      .toContain('decodeMessage');
    await shoot('properties-completion');
    await page.keyboard.press('Escape');
    await page.keyboard.insertText('esage;');
    await page.keyboard.press('Escape');
    const problems = page.getByTestId('type-problems');
    await expect.poll(() => problems.textContent(), { timeout: 20_000 }).toContain("Property 'decodeMesage' does not exist");
    expect(await problems.textContent()).toContain('Type check: 1 problem');

    // The planted bug fails and shrinks to the smallest source with a 15 V offer (28 W: Power Rules,
    // USB PD R3.1 V1.8 §10.2.3.2, Table 10-2, from memory) and a max-power sink.
    await pick(/^Planted bug/);
    expect(await page.getByLabel('Runs').inputValue()).toBe('100');
    await runButton().click();
    await expect.poll(() => result().getByTestId('verdict').textContent(), { timeout: 30_000 }).toBe('Fails');
    expect(await result().getByTestId('failure').textContent()).toBe('a contract of 1920 mA on an offer of 1870 mA at 15000 mV');
    const json = JSON.parse((await result().getByTestId('counterexample-json').textContent()) ?? 'null') as [{ source: { caps: { pdos: string[] } } }];
    expect(json[0].source.caps.pdos).toEqual(['0x0001912c', '0x0002d12c', '0x0004b0bb']);
    const scenario = page.getByRole('region', { name: 'Counterexample scenario' });
    // Simulated by the real engine: 15 V at the offer's 1.87 A (PDO 0x0004b0bb: 300 × 50 mV, 187 × 10 mA; Table 6-9).
    expect(await scenario.getByTestId('counterexample-contract').textContent()).toBe('fixed 15.00 V · 1.87 A · 28.1 W (object 3)');
    const timeline = scenario.getByRole('figure', { name: 'Counterexample timeline' });
    // The same timeline as the trace page and the Bench: held VBUS steps, the messages on their lanes.
    await timeline.locator('[data-testid="vbus-chart"][data-drawn] path.parley-vbus-line').waitFor();
    expect(await timeline.getByTestId('timeline-legend').textContent()).toContain('held until the next reading');
    // The messages as the trace page lists them, decoded: the offers and the request in words, not hex.
    const list = scenario.getByRole('listbox', { name: 'Messages' });
    const labels = await list.getByRole('option').evaluateAll((rows) => rows.map((row) => row.getAttribute('aria-label') ?? ''));
    expect(labels.map((label) => label.split(' ')[0]).filter((type) => type !== 'GoodCRC')).toEqual(['Source_Capabilities', 'Request', 'Accept', 'PS_RDY']);
    const caps = list.getByRole('option', { name: /^Source_Capabilities/ });
    expect(await caps.textContent()).toContain('#3');
    expect(await caps.textContent()).toMatch(/15(\.0+)? V/);
    expect(await caps.textContent()).not.toContain('0x0004b0bb');
    expect(await caps.textContent()).toContain('GoodCRC');
    await list.getByRole('option', { name: /^Request/ }).click();
    const details = scenario.getByRole('complementary', { name: 'Message details' });
    await details.getByRole('heading', { name: 'Request' }).waitFor();
    expect(await details.textContent()).toContain('Object 1');
    // On the lanes too: the source's offer, drawn and named as on the trace page.
    expect(await scenario.getByTestId('message-lanes').locator('[data-message-type="Source_Capabilities"]').count()).toBeGreaterThan(0);
    await shoot('properties-planted-bug');

    // One click saves the counterexample: to the team library when the server has it, else as a download.
    const download = page.waitForEvent('download', { timeout: 15_000 }).catch(() => null);
    await scenario.getByRole('button', { name: 'Save as negotiation vector' }).click();
    const status = await scenario.getByTestId('save-status').textContent({ timeout: 15_000 });
    if (status?.includes('downloaded')) {
      const file = await download;
      expect(file?.suggestedFilename()).toBe('property-demo-planted-bug-contract-above-offer-counterexample.vector.json');
      const saved = JSON.parse(await readFile((await file!.path())!, 'utf8')) as { kind: string; input: { scenario: { source: { caps: { pdos: string[] } } } } };
      expect(saved.kind).toBe('negotiation');
      expect(saved.input.scenario.source.caps.pdos).toEqual(['0x0001912c', '0x0002d12c', '0x0004b0bb']);
    } else {
      expect(status).toContain('Saved to the team library as property/demo/planted-bug-contract-above-offer/counterexample (revision 1)');
      const stored = await page.evaluate(async () => (await fetch(`/api/vectors/${encodeURIComponent('property/demo/planted-bug-contract-above-offer/counterexample')}`)).json());
      expect(stored).toMatchObject({ kind: 'negotiation', revision: 1, input: { scenario: { source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b0bb'] } } } } });
    }
    // A download is offered in any case.
    const offered = page.waitForEvent('download', { timeout: 15_000 });
    await scenario.getByRole('button', { name: 'Download vector' }).click();
    expect((await offered).suggestedFilename()).toBe('property-demo-planted-bug-contract-above-offer-counterexample.vector.json');

    // The property itself saves as a property vector (library or download), with the page's runs and seed.
    const saveProperty = page.getByRole('region', { name: 'Save as property vector' });
    expect(await saveProperty.getByLabel('Vector id').inputValue()).toBe('property/demo/planted-bug-contract-above-offer');
    const propertyDownload = page.waitForEvent('download', { timeout: 15_000 }).catch(() => null);
    await saveProperty.getByRole('button', { name: 'Save to library' }).click();
    const propertyStatus = await saveProperty.getByTestId('save-status').textContent({ timeout: 15_000 });
    if (propertyStatus?.includes('downloaded')) expect((await propertyDownload)?.suggestedFilename()).toBe('property-demo-planted-bug-contract-above-offer.vector.json');
    else expect(propertyStatus).toContain('Saved to the team library as property/demo/planted-bug-contract-above-offer (revision 1)');

    // A long run can be cancelled, and the next run starts a fresh worker.
    await pick(/^One lost GoodCRC never prevents a contract/);
    await page.getByLabel('Runs').fill('1000000');
    await runButton().click();
    await expect.poll(async () => Number(((await page.getByTestId('run-progress').textContent()) ?? '').replace(/[, ].*$/, '').replace(/\D/g, '')), { timeout: 20_000 }).toBeGreaterThan(0);
    await shoot('properties-running');
    await page.getByRole('button', { name: 'Cancel' }).click();
    await expect.poll(() => result().textContent()).toContain('Cancelled after');
    await page.getByLabel('Runs').fill('40');
    await runButton().click();
    await expect.poll(() => result().getByTestId('verdict').textContent(), { timeout: 30_000 }).toBe('Holds');

    await page.emulateMedia({ colorScheme: 'dark' });
    await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await pick(/^Planted bug/);
    await runButton().click();
    await expect.poll(() => result().getByTestId('verdict').textContent(), { timeout: 30_000 }).toBe('Fails');
    await page.getByRole('region', { name: 'Counterexample scenario' }).locator('[data-testid="vbus-chart"][data-drawn] path.parley-vbus-line').waitFor();
    await shoot('properties-planted-bug-dark');
    watch.assertClean();
  }, 240_000);
});
