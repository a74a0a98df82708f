/**
 * The Offers page in Debian's chromium: pick the 65 W demo device and see no error finding; remove
 * its 9 V offer and see caps.power-rules-missing (a 65 W source must offer 9 V: USB PD R3.1 V1.8
 * §10.2.3, Table 10-2, from memory), then follow the finding's link to the rule's page.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

describe.skipIf(!hasChromium)('the Offers page', () => {
  const suite = useBrowserSuite();
  let page: Page;

  it('checks the 65 W demo adapter, flags a missing 9 V and links to the rule page', async () => {
    const { page: opened, watch } = await suite.newPage();
    page = opened;
    await signIn(page, suite.url, 'engineer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Offers' }).click();
    await page.getByRole('heading', { level: 1, name: 'Offers' }).waitFor();

    const device = page.getByLabel('Demo device');
    await expect.poll(async () => (await device.locator('option').allInnerTexts()).join('|')).toContain('Kestrel K65 travel adapter');
    await device.selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    await page.getByRole('button', { name: 'Load device' }).click();

    const findings = page.getByRole('region', { name: 'Findings' });
    await expect.poll(() => findings.textContent()).toContain('Checked at a PDP of 65 W (declared)');
    await expect.poll(() => page.locator('[data-rule]').evaluateAll((items) => items.map((i) => i.getAttribute('data-rule')))).toEqual(['caps.cable-current']);
    expect(await findings.textContent()).toContain('0 errors');
    expect(await page.getByLabel('Offer 2').getByLabel('Voltage (mV)').inputValue()).toBe('9000');
    const over5A = page.getByRole('region', { name: 'Contract' }).getByLabel('Over a 5 A cable');
    await expect.poll(() => over5A.textContent()).toContain('fixed 20 V · 3.25 A · 65 W');
    await screenshot(page, 'offers-65w');

    await page.getByRole('button', { name: 'Remove offer 2' }).click();
    const missing = page.locator('[data-rule="caps.power-rules-missing"]');
    await missing.waitFor();
    expect(await missing.textContent()).toContain('9 V');
    await screenshot(page, 'offers-65w-without-9v');

    await missing.getByRole('link', { name: 'caps.power-rules-missing' }).click();
    await page.getByRole('heading', { level: 1, name: 'A voltage the Power Rules require is missing' }).waitFor();
    expect(page.url()).toMatch(/\/rules\/caps\.power-rules-missing$/);
    expect(await page.getByText('Table 10-2', { exact: false }).count()).toBeGreaterThan(0);
    await screenshot(page, 'rule-power-rules-missing');

    await page.getByRole('link', { name: 'All rules' }).click();
    await page.getByRole('heading', { level: 1, name: 'Rules' }).waitFor();
    expect(await page.getByRole('link', { name: 'caps.pps-range' }).count()).toBe(1);
    watch.assertClean();
  });

  it('keeps its offers, cable and policy in the URL: a reload and a copied link open the same page', async () => {
    const { page: opened, watch } = await suite.newPage();
    page = opened;
    await signIn(page, suite.url, 'engineer');
    await page.goto(`${suite.url}/offers`);
    await page.getByRole('heading', { level: 1, name: 'Offers' }).waitFor();
    await page.getByRole('button', { name: 'Remove offer 2' }).click();
    await page.getByLabel('Offer 3').getByLabel('Max current (mA)').fill('3000');
    await page.getByLabel('Cable', { exact: true }).selectOption('5000');
    const contract = page.getByRole('region', { name: 'Contract' });
    await contract.getByLabel('Sink policy').selectOption('fixed');
    await contract.getByLabel('Voltage (mV)').fill('15000');
    await contract.getByLabel('Current (mA)').fill('1500');
    await expect.poll(() => contract.getByLabel('Over a 5 A cable').textContent()).toContain('fixed 15 V · 1.5 A · 22.5 W');
    await expect.poll(() => new URL(page.url()).searchParams.get('page')?.length ?? 0).toBeGreaterThan(10);
    // The URL follows the last change (written a moment after the form settles).
    await page.waitForTimeout(400);
    const link = page.url();

    const sameAsBefore = async (tab: Page) => {
      await tab.getByRole('heading', { level: 1, name: 'Offers' }).waitFor();
      expect(await tab.getByRole('list', { name: 'Power data objects' }).getByRole('listitem').count()).toBe(3);
      expect(await tab.getByLabel('Offer 2').getByLabel('Voltage (mV)').inputValue()).toBe('15000');
      expect(await tab.getByLabel('Offer 3').getByLabel('Max current (mA)').inputValue()).toBe('3000');
      expect(await tab.getByLabel('Cable', { exact: true }).inputValue()).toBe('5000');
      const panel = tab.getByRole('region', { name: 'Contract' });
      expect(await panel.getByLabel('Sink policy').inputValue()).toBe('fixed');
      expect(await panel.getByLabel('Voltage (mV)').inputValue()).toBe('15000');
      await expect.poll(() => panel.getByLabel('Over a 5 A cable').textContent()).toContain('fixed 15 V · 1.5 A · 22.5 W');
    };
    await page.reload();
    await sameAsBefore(page);
    await expect.poll(() => page.locator('.recharts-scatter-symbol').count()).toBeGreaterThan(0);
    await screenshot(page, 'offers-from-url-reloaded');

    const { page: colleague, watch: colleagueWatch } = await suite.newPage();
    await colleague.goto(link);
    await sameAsBefore(colleague);
    await expect.poll(() => colleague.locator('.recharts-scatter-symbol').count()).toBeGreaterThan(0);
    await screenshot(colleague, 'offers-from-url-copied');

    await colleague.goto(`${suite.url}/offers?page=damaged`);
    await expect.poll(() => colleague.getByRole('alert').first().textContent()).toContain('damaged or incomplete');
    expect(await colleague.getByRole('list', { name: 'Power data objects' }).getByRole('listitem').count()).toBe(4);
    watch.assertClean();
    colleagueWatch.assertClean();
  });
  it('draws the DC sign ⎓ in a typed rating with the bundled symbol face, not as a missing glyph', async () => {
    const { page: opened, watch } = await suite.newPage();
    page = opened;
    await signIn(page, suite.url, 'engineer');
    await page.goto(`${suite.url}/offers`);
    await page.getByRole('heading', { level: 1, name: 'Offers' }).waitFor();
    await page.getByLabel('Printed rating').first().fill('20V\u23933.25A 65W max');
    // The face that holds U+2393 is fetched for the field's text and reports the glyph as present.
    const drawn = await page.evaluate(async () => {
      const faces = await document.fonts.load('14px "Noto Sans Symbols"', '\u2393');
      return { faces: faces.map((f) => f.family), check: document.fonts.check('14px "Noto Sans Symbols"', '\u2393') };
    });
    expect(drawn.faces).toContain('Noto Sans Symbols');
    expect(drawn.check).toBe(true);
    await screenshot(page, 'offers-rating-dc-sign');
    watch.assertClean();
  });
});
