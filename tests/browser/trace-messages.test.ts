/**
 * The trace page's message list covers the whole trace, not the window the chart reads nor the
 * timeline's first 20,000 messages: a capture of 120,000 messages, each known by its place
 * (tests/support/numbered-trace.ts), lists every one of them, a page at a time from the server;
 * End shows the last message's row, ↑ ↓ walk it and Home goes back, each moving the chart.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { numberedMessageAt, writeNumberedTrace, type NumberedMessage } from '../support/numbered-trace.ts';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();
const MESSAGES = 120_000;

describe.skipIf(!hasChromium)('the message list on the trace page', () => {
  const suite = useBrowserSuite();
  const folder = mkdtempSync(join(tmpdir(), 'parley-trace-messages-'));
  afterAll(() => rmSync(folder, { recursive: true, force: true }));

  it('lists every message of a 120,000-message trace and walks it by keyboard, moving the chart', async () => {
    const { page, watch } = await suite.newPage({ width: 1600, height: 1000 });
    await signIn(page, suite.url, 'support');
    const path = join(folder, 'numbered.jsonl');
    writeNumberedTrace(path, MESSAGES, 'Kestrel K65 numbered soak for the message list');
    const upload = await page.request.post(`${suite.url}/api/traces`, {
      multipart: { file: { name: 'numbered.jsonl', mimeType: 'application/x-ndjson', buffer: readFileSync(path) } },
      timeout: 120_000,
    });
    expect(upload.status()).toBe(201);
    const id = ((await upload.json()) as { trace: { id: number } }).trace.id;
    const rows: NumberedMessage[] = [];
    for (let index = 0; index < MESSAGES; index++) {
      const m = numberedMessageAt(index);
      if (m.messageType !== 'GoodCRC') rows.push(m);
    }

    await page.goto(`${suite.url}/traces/${id}`);
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
    // The chart's window carries at most 5,000 messages; the list has every row of the trace.
    expect(await page.getByText(/the first 5,000 messages of this window/).count()).toBe(1);
    const list = page.getByRole('listbox', { name: 'Messages' });
    await expect.poll(() => list.getAttribute('data-rows')).toBe(String(rows.length));
    const selected = () => list.locator('[role="option"][aria-selected="true"]').getAttribute('aria-label');
    const label = (m: NumberedMessage) => `${m.messageType} #${m.messageId} from the ${m.from} at `;
    const windowOf = async () => ((await page.getByTestId('trace-timeline').getAttribute('data-window')) ?? '').split('-').map(Number) as [number, number];

    await list.focus();
    await page.keyboard.press('End');
    const last = rows[rows.length - 1]!;
    await expect.poll(selected, { timeout: 20_000 }).toContain(label(last));
    // The last message's row is on screen, with its time.
    const lastRow = list.locator('[role="option"][aria-selected="true"]');
    expect(await lastRow.isVisible()).toBe(true);
    expect(await lastRow.textContent()).toContain(last.messageType);
    await expect.poll(async () => (await windowOf())[0] <= last.t && last.t <= (await windowOf())[1], { timeout: 20_000 }).toBe(true);
    await page.getByRole('complementary', { name: 'Message details' }).getByRole('heading', { name: last.messageType }).waitFor();
    const [startUs, endUs] = await windowOf();
    expect(endUs - startUs).toBeLessThanOrEqual(50_000);
    await screenshot(page, 'trace-message-list-end');
    // Up three rows and down one, far past the timeline's first 20,000 messages.
    for (const [key, row] of [
      ['ArrowUp', rows.length - 2],
      ['ArrowUp', rows.length - 3],
      ['ArrowUp', rows.length - 4],
      ['ArrowDown', rows.length - 3],
    ] as const) {
      await page.keyboard.press(key);
      await expect.poll(selected).toContain(label(rows[row]!));
    }
    const walked = rows[rows.length - 3]!;
    await expect.poll(async () => (await windowOf())[0] <= walked.t && walked.t <= (await windowOf())[1], { timeout: 20_000 }).toBe(true);
    // VBUS is read once a second, so this narrow window holds no reading: the value held since the
    // reading before it is still drawn across it, up to the next one (the server sends both).
    const chart = page.getByTestId('vbus-chart');
    await expect.poll(() => chart.getAttribute('data-readings'), { timeout: 20_000 }).toBe('0');
    await expect.poll(async () => (await chart.locator('path.parley-vbus-line').getAttribute('d')) ?? '', { timeout: 20_000 }).toMatch(/^M[\d.]+ [\d.]+L/);
    expect(await page.getByTestId('vbus-chart-empty').count()).toBe(0);
    // Only the rows in view are in the page.
    expect(await list.locator('[role="option"]').count()).toBeLessThan(60);

    await page.keyboard.press('Home');
    await expect.poll(selected, { timeout: 20_000 }).toContain(label(rows[0]!));
    await expect.poll(async () => (await windowOf())[0]).toBeLessThanOrEqual(rows[0]!.t);

    // Unfolded, GoodCRCs are rows too.
    await page.getByLabel('Fold GoodCRC away').uncheck();
    await expect.poll(() => list.getAttribute('data-rows')).toBe(String(MESSAGES));
    watch.assertClean();
  }, 180_000);
});
