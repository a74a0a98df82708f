/**
 * The trace page's message list covers the whole trace, not the window the chart reads: a capture
 * with more messages than one window of the timeline carries (5,000) lists every one of them, a
 * page at a time from the server; End, ↑ and Home walk it and move the chart to the message.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeSyntheticTrace } from '../support/synthetic-trace.ts';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

type Message = { t: number; messageType: string; messageId: number; from: string };

describe.skipIf(!hasChromium)('the message list on the trace page', () => {
  const suite = useBrowserSuite();
  const folder = mkdtempSync(join(tmpdir(), 'parley-trace-messages-'));
  afterAll(() => rmSync(folder, { recursive: true, force: true }));

  it('lists every message of a long trace and walks it by keyboard, moving the chart', async () => {
    const { page, watch } = await suite.newPage({ width: 1600, height: 1000 });
    await signIn(page, suite.url, 'support');
    const path = join(folder, 'soak.jsonl');
    writeSyntheticTrace(path, 5 * 1024 * 1024, 'Kestrel K65 soak for the message list');
    const upload = await page.request.post(`${suite.url}/api/traces`, { multipart: { file: { name: 'soak.jsonl', mimeType: 'application/x-ndjson', buffer: readFileSync(path) } }, timeout: 120_000 });
    expect(upload.status()).toBe(201);
    const id = ((await upload.json()) as { trace: { id: number } }).trace.id;
    const all = ((await (await page.request.get(`${suite.url}/api/traces/${id}`)).json()) as { analysis: { timeline: { messages: Message[] } } }).analysis.timeline.messages;
    const rows = all.filter((m) => m.messageType !== 'GoodCRC');
    expect(all.length).toBeGreaterThan(10_000);

    await page.goto(`${suite.url}/traces/${id}`);
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
    // The chart's window carries at most 5,000 messages; the list has every row of the trace.
    expect(await page.getByText(/the first 5,000 messages of this window/).count()).toBe(1);
    const list = page.getByRole('listbox', { name: 'Messages' });
    await expect.poll(() => list.getAttribute('data-rows')).toBe(String(rows.length));
    const selected = () => list.locator('[role="option"][aria-selected="true"]').getAttribute('aria-label');
    const label = (m: Message) => `${m.messageType} #${m.messageId} from the ${m.from} at `;
    const windowOf = async () => ((await page.getByTestId('trace-timeline').getAttribute('data-window')) ?? '').split('-').map(Number) as [number, number];

    await list.focus();
    await page.keyboard.press('End');
    const last = rows[rows.length - 1]!;
    await expect.poll(selected, { timeout: 20_000 }).toContain(label(last));
    await expect.poll(async () => (await windowOf())[0] <= last.t && last.t <= (await windowOf())[1], { timeout: 20_000 }).toBe(true);
    await page.getByRole('complementary', { name: 'Message details' }).getByRole('heading', { name: last.messageType }).waitFor();
    const [startUs, endUs] = await windowOf();
    expect(endUs - startUs).toBeLessThanOrEqual(50_000);
    await page.keyboard.press('ArrowUp');
    await expect.poll(selected).toContain(label(rows[rows.length - 2]!));
    await screenshot(page, 'trace-message-list-end');
    // Only the rows in view are in the page.
    expect(await list.locator('[role="option"]').count()).toBeLessThan(60);

    await page.keyboard.press('Home');
    await expect.poll(selected, { timeout: 20_000 }).toContain(label(rows[0]!));
    await expect.poll(async () => (await windowOf())[0]).toBeLessThanOrEqual(rows[0]!.t);

    // Unfolded, GoodCRCs are rows too.
    await page.getByLabel('Fold GoodCRC away').uncheck();
    await expect.poll(() => list.getAttribute('data-rows')).toBe(String(all.length));
    watch.assertClean();
  }, 180_000);
});
