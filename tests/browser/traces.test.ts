/**
 * The Traces product in Debian's chromium: a support engineer uploads a customer's log through the
 * file input, watches the upload and analysis progress, reads the summary (and the broken line
 * the log had), opens the trace, jumps to a finding on the timeline, opens its rule page, shares
 * the diagnosis by e-mail; the admin then finds that mail in the Outbox. A file that is no trace
 * dropped on the panel gets a clear error.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { demoTraceFolder } from '../../server/db/demo-traces/manifest.ts';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

/** The late-Request demo log with one line a customer's terminal garbled: a new file, not a seeded one. */
function customerLog(): Buffer {
  const lines = readFileSync(join(demoTraceFolder, 'wren14-late-request.txt'), 'utf8').split('\n');
  lines.splice(6, 0, '0.1xx0  SNK  ?? 41 ~~');
  return Buffer.from(lines.join('\n'));
}

/** Records whether a progress bar with that label was ever on the page (uploads of small files are quick). */
async function recordProgressBars(page: Page): Promise<void> {
  await page.evaluate(() => {
    const seen: string[] = [];
    (window as unknown as { __progressSeen: string[] }).__progressSeen = seen;
    new MutationObserver(() => {
      for (const bar of document.querySelectorAll('[role="progressbar"]')) {
        const label = bar.getAttribute('aria-label') ?? '';
        if (!seen.includes(label)) seen.push(label);
      }
    }).observe(document.body, { childList: true, subtree: true });
  });
}

describe.skipIf(!hasChromium)('the Traces pages', () => {
  const suite = useBrowserSuite();
  let page: Page;

  it('lets support upload a log, read the diagnosis, open a rule and share it; the admin sees the mail', async () => {
    const { page: opened, watch } = await suite.newPage();
    page = opened;
    await signIn(page, suite.url, 'support');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Traces' }).click();
    await page.getByRole('heading', { level: 1, name: 'Traces' }).waitFor();
    const table = page.getByRole('table', { name: 'Traces' });
    // The six demo traces, analysed at seed time.
    await expect.poll(() => table.locator('tbody tr').count()).toBe(6);
    await expect.poll(() => table.textContent()).toContain('D100 output sags under load');
    await screenshot(page, 'traces-list');

    // Filters go to the server: errors only leaves the five faulty demo traces.
    await page.getByLabel('Findings').selectOption('error');
    await expect.poll(() => table.locator('tbody tr').count()).toBe(5);
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await expect.poll(() => table.locator('tbody tr').count()).toBe(6);

    const panel = page.getByRole('region', { name: 'Upload a trace' });
    await panel.getByTestId('trace-file-input').setInputFiles({ name: 'customer-console.log', mimeType: 'text/plain', buffer: customerLog() });
    await panel.getByLabel('Device under test').selectOption({ label: 'Kestrel Wren 14 laptop' });
    await panel.getByLabel('Customer reference').fill('KD-CASE-9001');
    await panel.getByLabel('Notes').fill('Slow charging after sleep, desk charger.');
    await recordProgressBars(page);
    await panel.getByRole('button', { name: 'Upload and analyse' }).click();
    const summary = panel.getByTestId('upload-summary');
    await summary.waitFor();
    expect(await summary.textContent()).toMatch(/^Contract 20 V 3.25 A at 0.454 s; 1 error/);
    expect(await panel.textContent()).toContain('1 line could not be read');
    expect(await panel.textContent()).toContain('Line 7 could not be read');
    const seen = await page.evaluate(() => (window as unknown as { __progressSeen: string[] }).__progressSeen);
    expect(seen).toContain('Upload');
    await screenshot(page, 'traces-uploaded');

    // Opening the trace draws the shared timeline (its main-thread tasks are measured by `npm run bench:ui`).
    await panel.getByRole('link', { name: 'Open the trace' }).click();
    await page.getByRole('heading', { level: 1, name: 'customer-console.log' }).waitFor();
    expect(await page.getByTestId('trace-summary').textContent()).toMatch(/^Contract 20 V 3.25 A/);
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
    await page.getByTestId('message-lanes').waitFor();
    expect(
      await page
        .getByRole('listbox', { name: 'Messages' })
        .getByRole('option', { name: /^Source_Capabilities #/ })
        .count(),
    ).toBe(1);
    await screenshot(page, 'trace-page');

    // A finding's time zooms the timeline to it.
    const timeline = page.getByTestId('trace-timeline');
    const whole = await timeline.getAttribute('data-window');
    const findings = page.getByRole('table', { name: 'Findings' });
    await findings.getByRole('button', { name: /Show timing.sender-response at/ }).click();
    await expect.poll(() => timeline.getAttribute('data-window')).not.toBe(whole);
    expect(
      await page
        .getByTestId('finding-pins')
        .getByRole('button', { name: /timing.sender-response/ })
        .count(),
    ).toBe(1);
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
    await screenshot(page, 'trace-finding-focused');

    // The rule's explanation page, and back.
    await findings.getByRole('link', { name: 'timing.sender-response' }).click();
    await page.waitForURL(/\/rules\/timing\.sender-response$/);
    await page.getByRole('heading', { level: 1, name: 'Response came too late' }).waitFor();
    await page.goBack();
    await page.getByTestId('trace-summary').waitFor();

    await page.getByRole('button', { name: 'Share diagnosis' }).click();
    const dialog = page.getByRole('dialog', { name: 'Share diagnosis' });
    await dialog.getByLabel('E-mail address').fill('firmware@kestrel.example');
    await dialog.getByLabel('Note (optional)').fill('Request comes 38 ms after the offer; please check the sink timer.');
    await dialog.getByRole('button', { name: 'Send' }).click();
    await expect.poll(() => dialog.getByRole('status').textContent()).toBe('Sent to firmware@kestrel.example. The mail carries a read-only report link.');
    await screenshot(page, 'trace-shared');
    await dialog.getByRole('button', { name: 'Close' }).click();

    // The printable report stands on its own.
    const traceUrl = page.url();
    await page.goto(`${traceUrl.replace(/\?.*$/, '')}/report`);
    await page.getByTestId('trace-report').waitFor();
    expect(await page.getByTestId('trace-report').textContent()).toContain('timing.sender-response');
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false);
    await screenshot(page, 'trace-report-print');
    await page.emulateMedia({ media: 'screen' });

    // A file that is no trace, dropped on the panel.
    await page.goto(`${suite.url}/traces`);
    const dropzone = page.getByTestId('trace-dropzone');
    const dataTransfer = await page.evaluateHandle(() => {
      const transfer = new DataTransfer();
      transfer.items.add(new File(['Hello,\nthe laptop charges slowly.\nThanks\n'], 'mail.txt', { type: 'text/plain' }));
      return transfer;
    });
    await dropzone.dispatchEvent('drop', { dataTransfer });
    await page.getByRole('button', { name: 'Upload and analyse' }).click();
    const alert = page.getByRole('region', { name: 'Upload a trace' }).getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain('This file is not a trace');
    await screenshot(page, 'traces-not-a-trace');

    watch.assertClean({ allow: [/status of 400/] });

    // The admin reads the mail in the Outbox.
    await page.request.post(`${suite.url}/api/auth/logout`);
    await signIn(page, suite.url, 'admin');
    await page.goto(`${suite.url}/admin/outbox`);
    await expect.poll(() => page.getByText('Parley diagnosis: customer-console.log').count()).toBeGreaterThan(0);
    await page.getByText('Parley diagnosis: customer-console.log').first().click();
    await page.getByRole('tab', { name: 'Plain text' }).click();
    await expect.poll(() => page.getByRole('tabpanel').textContent()).toContain('timing.sender-response');
    expect(await page.getByRole('tabpanel').textContent()).toContain('Request comes 38 ms after the offer');
    await screenshot(page, 'traces-outbox');
  }, 240_000);

  it('brings the upload panel into view from the page header, with the file chooser focused', async () => {
    const { page: current, watch } = await suite.newPage({ width: 1280, height: 800 });
    await signIn(current, suite.url, 'support');
    await current.goto(`${suite.url}/traces`);
    await current.getByRole('heading', { level: 1, name: 'Traces' }).waitFor();
    // Below 1536 px the panel sits under the list, out of sight at first.
    const panel = current.getByRole('region', { name: 'Upload a trace' });
    expect(await panel.evaluate((element) => element.getBoundingClientRect().top)).toBeGreaterThan(800);
    await current.getByRole('button', { name: 'Upload a trace' }).click();
    await expect.poll(() => current.getByTestId('trace-file-input').evaluate((input) => input === document.activeElement)).toBe(true);
    await expect.poll(() => panel.evaluate((element) => element.getBoundingClientRect().top)).toBeLessThan(400);

    // A role that may not upload gets no button.
    await current.request.post(`${suite.url}/api/auth/logout`);
    await signIn(current, suite.url, 'viewer');
    await current.goto(`${suite.url}/traces`);
    await current.getByRole('heading', { level: 1, name: 'Traces' }).waitFor();
    expect(await current.getByRole('button', { name: 'Upload a trace' }).count()).toBe(0);
    watch.assertClean();
  });
});
