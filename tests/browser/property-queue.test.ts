/**
 * The server's property queue on the Properties page, in Debian's chromium: a QA engineer starts a
 * library run of two endless property vectors and sees one running and one waiting, with the
 * sandbox's mode and limits; an admin sees which sandbox is active and how it isolates the child.
 * Screenshots `tmp/screenshots/property-queue-*.png`.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

const endless = (id: string) => ({
  vector: 1,
  id,
  title: `Endless ${id}`,
  tags: ['queue'],
  ref: 'common practice',
  kind: 'property',
  input: { code: 'export default ({ fc }) => fc.property(fc.constant(0), () => { for (;;) {} });\n', runs: 1, seed: 1 },
  expect: { holds: true },
});

describe.skipIf(!hasChromium)('the server property queue on the Properties page', () => {
  const suite = useBrowserSuite();

  const openProperties = async (page: Page) => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Properties' }).click();
    await page.getByRole('heading', { level: 1, name: 'Properties' }).waitFor();
    return page.getByTestId('server-queue');
  };

  it('shows a user where their properties stand, and an admin which sandbox is active', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'qa');
    const headers = { Origin: suite.url };
    for (const id of ['property/queue/endless-1', 'property/queue/endless-2']) {
      const created = await page.request.post(`${suite.url}/api/vectors`, { data: endless(id), headers });
      expect(created.status(), await created.text()).toBe(201);
    }
    const started = await page.request.post(`${suite.url}/api/runs/start`, { data: { ids: ['property/queue/endless-1', 'property/queue/endless-2'] }, headers });
    expect(started.status(), await started.text()).toBe(202);

    const panel = await openProperties(page);
    await expect.poll(() => panel.textContent(), { timeout: 30_000 }).toContain('Yours: 1 property running, 1 waiting.');
    const text = (await panel.textContent()) ?? '';
    expect(text).toContain('Your next one is number 1 in the queue: it starts when one of yours ends.');
    expect(text).toContain('On the server: 1 property running and 1 waiting, from 1 user.');
    expect(text).toMatch(/Each property may take 30 s and 512 MB of heap \(1536 MB of memory in all\); 2 run at once, 1 per user\./);
    expect(text).toMatch(/Sandbox: (bubblewrap|fallback launcher)/);
    expect(await panel.getByTestId('sandbox-isolation').count()).toBe(0);
    // From the top: a full-page shot of a scrolled page paints the sticky top bar mid-page.
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, 'property-queue-qa');
    watch.assertClean();

    await suite.context.clearCookies();
    const { page: adminPage, watch: adminWatch } = await suite.newPage();
    await signIn(adminPage, suite.url, 'admin');
    const adminPanel = await openProperties(adminPage);
    await adminPanel.getByTestId('sandbox-isolation').waitFor();
    const adminText = (await adminPanel.textContent()) ?? '';
    expect(adminText).toContain('None of your properties is running or waiting on the server.');
    expect(adminText).toContain('On the server: 1 property running and 1 waiting, from 1 user.');
    expect(adminText).toMatch(/For admins: (bubblewrap is active|the fallback launcher is active: .+)/);
    expect(adminText).toContain('dies with the server');
    await screenshot(adminPage, 'property-queue-admin');
    adminWatch.assertClean();
  }, 120_000);
});
