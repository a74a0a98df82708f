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
});
