/**
 * The trace timeline as a support engineer reads it: a Hard Reset finding lands on the reset drawn
 * on the chart; VBUS is held between two readings (no line through values never measured); the
 * message list walks by keyboard and moves the chart; the zoom is in the URL for a colleague.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, requireChromium, screenshot, signIn, useBrowserSuite, watchPage } from './support.ts';

const hasChromium = requireChromium();

/** The demo trace in which the K65 drops a programmable contract with a Hard Reset at 21.1 s. */
async function openPpsTrace(page: Page, url: string): Promise<void> {
  await signIn(page, url, 'support');
  await page.goto(`${url}/traces`);
  await page.getByRole('table', { name: 'Traces' }).getByText('K65 drops a programmable contract').click();
  await page.getByRole('heading', { level: 1, name: 'K65 drops a programmable contract' }).waitFor();
  await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
}

/** The VBUS line's vertices in screen order, from the path the chart drew. */
async function vbusVertices(page: Page): Promise<{ x: number; y: number }[]> {
  const d = (await page.locator('[data-testid="vbus-chart"] path.parley-vbus-line').first().getAttribute('d')) ?? '';
  const numbers = (d.match(/-?\d+(\.\d+)?(e-?\d+)?/g) ?? []).map(Number);
  const out: { x: number; y: number }[] = [];
  for (let i = 0; i + 1 < numbers.length; i += 2) out.push({ x: numbers[i]!, y: numbers[i + 1]! });
  return out;
}

describe.skipIf(!hasChromium)('the trace timeline', () => {
  const suite = useBrowserSuite();

  it('lands a Hard Reset finding on the reset drawn on the chart, with VBUS held between readings', async () => {
    const { page, watch } = await suite.newPage({ width: 1600, height: 1000 });
    await openPpsTrace(page, suite.url);
    expect(await page.title()).toMatch(/^Trace \d+ — K65 drops a programmable contract · Parley$/);

    const findings = page.getByRole('table', { name: 'Findings' });
    await findings
      .getByRole('button', { name: /Show protocol.hard-reset at/ })
      .first()
      .click();
    const timeline = page.getByTestId('trace-timeline');
    await expect.poll(() => timeline.getAttribute('data-window')).toBe('21060000-21140000');
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();

    // The reset is on the chart (a line with its label) and on the events lane.
    const reset = page.getByTestId('vbus-chart').locator('[data-chart-event="Hard Reset (source)"]');
    await expect.poll(() => reset.count()).toBe(1);
    // Polled: labels are placed again as the page settles around the chart; with a CPU-heavy process
    // beside the browser, the first read came before that and still showed the reset folded with a neighbour.
    await expect.poll(() => reset.locator('text').textContent()).toBe('Hard Reset (source)');
    expect(await page.getByTestId('event-lane').locator('[data-event="Hard Reset (source)"]').count()).toBe(1);
    const resetX = Number(await reset.locator('line').getAttribute('x1'));

    // VBUS: 9.03 V read at 20.845 s, next reading 9.00 V at 21.13 s. Between them the line is held
    // flat at the first reading (every segment horizontal or vertical, none slanted through the reset).
    const vertices = await vbusVertices(page);
    expect(vertices.length).toBeGreaterThan(2);
    for (let i = 1; i < vertices.length; i++) {
      const a = vertices[i - 1]!;
      const b = vertices[i]!;
      expect(Math.abs(a.x - b.x) < 0.01 || Math.abs(a.y - b.y) < 0.01, `segment ${i} is slanted: ${JSON.stringify([a, b])}`).toBe(true);
    }
    const across = vertices.findIndex((v, i) => i > 0 && vertices[i - 1]!.x <= resetX && v.x >= resetX && Math.abs(vertices[i - 1]!.y - v.y) < 0.01);
    expect(across, 'a held (flat) segment spans the reset').toBeGreaterThan(0);
    expect(vertices[across]!.y).toBeCloseTo(vertices[0]!.y, 1);
    // The one reading inside the window is marked.
    expect(await page.getByTestId('vbus-chart').getAttribute('data-readings')).toBe('1');
    await screenshot(page, 'timeline-hard-reset');

    // The zoom is in the URL: a colleague's link opens the same window.
    await expect.poll(() => new URL(page.url()).searchParams.get('from')).toBe('21060000');
    const link = page.url();
    const other = await suite.newPage({ width: 1600, height: 1000 });
    // (Same browser context: the colleague here is the same account in a second tab.)
    await other.page.goto(link);
    await expect.poll(() => other.page.getByTestId('trace-timeline').getAttribute('data-window')).toBe('21060000-21140000');
    watch.assertClean();
    other.watch.assertClean();
  }, 90_000);

  it('walks the message list by keyboard; the selected message moves the chart and opens its bit fields', async () => {
    const { page, watch } = await suite.newPage({ width: 1600, height: 1000 });
    await openPpsTrace(page, suite.url);
    const list = page.getByRole('listbox', { name: 'Messages' });
    await list.focus();
    await page.keyboard.press('Home');
    const selected = () => list.locator('[role="option"][aria-selected="true"]').getAttribute('aria-label');
    await expect.poll(selected).toMatch(/^Source_Capabilities #0 from the source at/);
    const details = page.getByRole('complementary', { name: 'Message details' });
    await details.getByRole('heading', { name: 'Source_Capabilities' }).waitFor();
    await page.keyboard.press('ArrowDown');
    await expect.poll(selected).toMatch(/^Request #0 from the sink at/);
    await details.getByRole('heading', { name: 'Request' }).waitFor();
    // The Request is typed by the offer before it: its RDO shows the object position.
    expect(await details.getByText('Object position').count()).toBeGreaterThan(0);
    const window = await page.getByTestId('trace-timeline').getAttribute('data-window');
    const [startUs, endUs] = (window ?? '').split('-').map(Number);
    expect(endUs! - startUs!).toBeLessThanOrEqual(50_000);
    // The message lanes highlight the same Request.
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowUp');
    await expect.poll(selected).toMatch(/^Request #0/);
    // Only the rows in view are in the page.
    expect(await list.locator('[role="option"]').count()).toBeLessThan(60);
    await screenshot(page, 'timeline-message-list');
    watch.assertClean();
  }, 90_000);

  it('opens a report by its read-only link in a fresh browser without signing in', async () => {
    const { page, watch } = await suite.newPage({ width: 1440, height: 900 });
    await openPpsTrace(page, suite.url);
    await page.getByRole('button', { name: 'Share diagnosis' }).click();
    const dialog = page.getByRole('dialog', { name: 'Share diagnosis' });
    await dialog.getByLabel('Valid for').selectOption('7');
    await dialog.getByRole('button', { name: 'Make a link' }).click();
    const field = dialog.getByRole('list', { name: 'Active report links' }).getByRole('textbox').first();
    await field.waitFor();
    const link = await field.inputValue();
    expect(link).toMatch(/\/shared\/reports\/\d+\.\d+\.[A-Za-z0-9_-]+$/);
    await screenshot(page, 'share-link-dialog');
    watch.assertClean();

    // A customer's browser: a fresh profile, no cookies, no account.
    const fresh = await launchBrowser();
    try {
      const customer = await fresh.context.newPage();
      await customer.setViewportSize({ width: 1200, height: 900 });
      const customerWatch = watchPage(customer);
      await customer.goto(link);
      await customer.getByTestId('trace-report').waitFor();
      expect(new URL(customer.url()).pathname).toMatch(/^\/shared\/reports\//);
      expect(await customer.title()).toBe('Report — K65 drops a programmable contract · Parley');
      expect(await customer.getByTestId('report-summary').textContent()).toMatch(/Hard Reset at 21\.1 s/);
      const report = customer.getByTestId('trace-report');
      expect(await report.textContent()).toContain('protocol.hard-reset');
      expect(await report.textContent()).not.toContain('Comments');
      await customer.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
      const aroundReset = customer.getByRole('table', { name: /^Messages around protocol.hard-reset at 21.1 s/ });
      expect(await aroundReset.count()).toBe(1);
      // The reset itself is listed in its place among the messages, and the chart names the finding in plain words.
      expect(await aroundReset.textContent()).toContain('Hard Reset (source)');
      expect(await report.locator('[data-finding-rule="timing.pps-keepalive"]').textContent()).toBe('No PPS keep-alive Request');
      await screenshot(customer, 'shared-report');
      await customer.emulateMedia({ media: 'print' });
      await screenshot(customer, 'shared-report-print');
      customerWatch.assertClean();

      // Withdrawn, the same link says so.
      await dialog
        .getByRole('button', { name: /^Withdraw the link until/ })
        .first()
        .click();
      await expect.poll(() => dialog.getByRole('list', { name: 'Active report links' }).count()).toBe(0);
      const again = await fresh.context.newPage();
      const againWatch = watchPage(again);
      await again.goto(link);
      await again.getByRole('heading', { name: 'This report is not available' }).waitFor();
      expect(await again.getByRole('alert').textContent()).toContain('expired or been withdrawn');
      againWatch.assertClean({ allow: [/status of 404/] });
    } finally {
      await fresh.close();
    }
  }, 120_000);
});
