/**
 * The whole client, page by page: each demo role opens every page its nav shows (heading, no error
 * boundary, nothing on the console), is turned away politely from the rest, and the admin's pages
 * are photographed at 1280×800 in light and dark for a human look (tmp/screenshots/walkthrough/).
 * The shell is checked at 1024 px (every nav entry fully visible) and in a narrow window (the menu
 * opens, takes the focus, closes on Escape).
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { navEntries, navFor } from '../../src/app/nav.ts';
import { roles, type Role } from '../../src/lib/roles.ts';
import { requireChromium, screenshot, screenshotDir, signIn, useBrowserSuite, type PageWatch } from './support.ts';

const hasChromium = requireChromium();
const shotFolder = 'walkthrough';
// Pages limited to some roles that are not in the nav of their own (the route guards them the same way).
const guardedExtras = [{ to: '/library/new', roles: ['admin', 'engineer', 'qa'] as readonly Role[] }];
const crashHeadings = /^(Something went wrong|Parley stopped unexpectedly|The server could not answer|Parley was updated|Page not found)$/;

function slugOf(path: string): string {
  return path === '/'
    ? 'home'
    : path
        .replace(/^\//, '')
        .replace(/[^a-z0-9]+/gi, '-')
        .toLowerCase();
}

/** Waits until no request has been in flight for a moment (event streams excepted), at most `timeoutMs`. */
async function settle(page: Page, timeoutMs = 10_000): Promise<void> {
  const inFlight = new Set<unknown>();
  const onStart = (request: { resourceType(): string }) => {
    if (request.resourceType() !== 'eventsource') inFlight.add(request);
  };
  const onEnd = (request: unknown) => inFlight.delete(request);
  page.on('request', onStart);
  page.on('requestfinished', onEnd);
  page.on('requestfailed', onEnd);
  try {
    const started = Date.now();
    let quietSince = Date.now();
    while (Date.now() - started < timeoutMs) {
      await page.waitForTimeout(100);
      if (inFlight.size > 0) quietSince = Date.now();
      else if (Date.now() - quietSince >= 400) break;
    }
  } finally {
    page.off('request', onStart);
    page.off('requestfinished', onEnd);
    page.off('requestfailed', onEnd);
  }
}

async function expectPage(page: Page, heading: string | RegExp): Promise<void> {
  await page.getByRole('heading', { level: 1, name: heading }).first().waitFor({ timeout: 20_000 });
  await settle(page);
  expect(await page.getByRole('heading', { level: 1, name: crashHeadings }).count()).toBe(0);
  expect(await page.getByText(/^(undefined|null|NaN|\[object Object\])$/).count()).toBe(0);
}

async function photograph(page: Page, name: string): Promise<void> {
  await screenshot(page, `${shotFolder}/${name}-light`);
  await page.emulateMedia({ colorScheme: 'dark' });
  await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
  await page.waitForTimeout(150);
  await screenshot(page, `${shotFolder}/${name}-dark`);
  await page.emulateMedia({ colorScheme: 'light' });
  await expect.poll(() => page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(false);
}

describe.skipIf(!hasChromium)('walking through every page as every role', () => {
  const suite = useBrowserSuite();
  let page: Page;
  let watch: PageWatch;

  beforeAll(async () => {
    mkdirSync(join(screenshotDir, shotFolder), { recursive: true });
    // A first visit warms the server and the sign-in chunk, so the first role is not judged on a cold start.
    const warm = await suite.context.newPage();
    await warm.goto(`${suite.url}/sign-in`);
    await warm.getByLabel('E-mail').waitFor({ timeout: 60_000 });
    await warm.close();
  }, 120_000);

  async function openPage(width = 1280, height = 800): Promise<Page> {
    ({ page, watch } = await suite.newPage({ width, height }));
    return page;
  }

  const mainNav = (current: Page) => current.getByRole('navigation', { name: 'Main' });

  for (const role of roles) {
    it(`${role}: every page in the nav opens cleanly, the others say they are not available`, async () => {
      const current = await openPage();
      await signIn(current, suite.url, role);
      const entries = navFor(role);
      expect(await mainNav(current).getByRole('link').allInnerTexts()).toEqual(entries.map((entry) => entry.label));

      // Home offers cards for exactly the role's pages (Home itself aside).
      const cards = current.getByRole('navigation', { name: 'Your pages' }).getByRole('link');
      const cardHrefs = await cards.evaluateAll((links) => links.map((link) => link.getAttribute('href')));
      expect(cardHrefs).toEqual(entries.filter((entry) => entry.to !== '/').map((entry) => entry.to));
      await current.getByRole('table', { name: 'Devices under test' }).getByRole('row').nth(1).waitFor();

      for (const entry of entries) {
        await mainNav(current).getByRole('link', { name: entry.label, exact: true }).click();
        await expectPage(current, entry.to === '/' ? /^Welcome,/ : entry.label);
        expect(new URL(current.url()).pathname).toBe(entry.to);
        // The active page is marked for assistive technology as well as by colour.
        await expect.poll(() => mainNav(current).locator('[aria-current="page"]').allInnerTexts()).toEqual([entry.label]);
        if (role === 'admin') await photograph(current, slugOf(entry.to));
      }

      const refused = [...navEntries, ...guardedExtras].filter((entry) => !entry.roles.includes(role));
      if (role === 'admin') expect(refused).toEqual([]);
      for (const entry of refused) {
        await current.goto(`${suite.url}${entry.to}`);
        await current.getByRole('heading', { level: 1, name: 'Not available to your role' }).waitFor();
        // The shell stays around the refusal, so the way on is right there.
        await mainNav(current).getByRole('link', { name: 'Home', exact: true }).waitFor();
      }
      if (role === 'viewer') await photograph(current, 'not-available-viewer');
      watch.assertClean();
    }, 240_000);
  }

  it('admin: the detail pages open cleanly too', async () => {
    const current = await openPage();
    await signIn(current, suite.url, 'admin');
    const details: { name: string; to: string }[] = [];
    await current.goto(`${suite.url}/rules`);
    await expectPage(current, 'Rules');
    const ruleHref = await current.locator('main a[href^="/rules/"]').first().getAttribute('href');
    if (ruleHref) details.push({ name: 'rule-detail', to: ruleHref });
    const firstId = async (api: string): Promise<string | undefined> => {
      const response = await current.request.get(`${suite.url}${api}`);
      expect(response.status()).toBe(200);
      const body = (await response.json()) as { items: { id: string | number }[] };
      return body.items[0] === undefined ? undefined : String(body.items[0].id);
    };
    const traceId = await firstId('/api/traces');
    if (traceId) details.push({ name: 'trace-detail', to: `/traces/${encodeURIComponent(traceId)}` });
    const vectorId = await firstId('/api/vectors');
    if (vectorId) details.push({ name: 'vector-detail', to: `/library/${encodeURIComponent(vectorId)}` });
    const runId = await firstId('/api/runs');
    if (runId) details.push({ name: 'run-detail', to: `/runs/${encodeURIComponent(runId)}` });
    details.push({ name: 'library-new', to: '/library/new' });
    expect(details.map((detail) => detail.name)).toEqual(expect.arrayContaining(['rule-detail', 'trace-detail', 'vector-detail']));

    for (const detail of details) {
      await current.goto(`${suite.url}${detail.to}`);
      await expectPage(current, /./);
      await photograph(current, detail.name);
    }
    await current.goto(`${suite.url}/no-such-page`);
    await current.getByRole('heading', { level: 1, name: 'Page not found' }).waitFor();
    watch.assertClean();
  }, 180_000);

  it('fits the whole nav at 1024 px wide', async () => {
    const current = await openPage(1024, 768);
    await signIn(current, suite.url, 'admin');
    const links = mainNav(current).getByRole('link');
    expect(await links.count()).toBe(navFor('admin').length);
    for (const link of await links.all()) {
      await expect.poll(() => link.isVisible()).toBe(true);
      // Neither cut off at the window's edge nor clipped inside the link.
      const fits = await link.evaluate((element) => {
        const box = element.getBoundingClientRect();
        return box.left >= 0 && box.right <= window.innerWidth && element.scrollWidth <= element.clientWidth;
      });
      expect(fits, await link.innerText()).toBe(true);
    }
    // The page beside the nav does not scroll sideways.
    expect(await current.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
    await screenshot(current, `${shotFolder}/home-1024`);
    watch.assertClean();
  });

  it('opens the nav as a menu in a narrow window, by keyboard', async () => {
    const current = await openPage(480, 800);
    await signIn(current, suite.url, 'admin');
    const menu = current.getByRole('button', { name: 'Menu' });
    expect(await mainNav(current).isVisible()).toBe(false);
    await menu.focus();
    await current.keyboard.press('Enter');
    expect(await menu.getAttribute('aria-expanded')).toBe('true');
    // The first entry takes the focus; every entry is reachable.
    await expect.poll(() => current.evaluate(() => document.activeElement?.textContent)).toBe('Home');
    await mainNav(current).getByRole('link', { name: 'API tokens' }).waitFor();
    await screenshot(current, `${shotFolder}/menu-narrow`);
    await current.keyboard.press('Escape');
    expect(await menu.getAttribute('aria-expanded')).toBe('false');
    await expect.poll(() => current.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Menu');

    // Choosing a page closes the menu.
    await menu.click();
    await mainNav(current).getByRole('link', { name: 'Audit log' }).click();
    await current.getByRole('heading', { level: 1, name: 'Audit log' }).waitFor();
    expect(await mainNav(current).isVisible()).toBe(false);
    expect(await current.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(480);
    watch.assertClean();
  });
});
