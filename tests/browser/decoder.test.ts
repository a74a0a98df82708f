import { describe, expect, it } from 'vitest';
import { parseHex } from '../../shared/pd/index.ts';
import { encodeWaveform } from '../../shared/wire/index.ts';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

// Header 0x61a1 and the six PDOs worked out by hand from USB PD R3.2 V1.1 Table 6.1 and the
// source PDO tables (shared/pd/header.test.ts, source-pdo.test.ts): 5 V 3 A first, PPS 3.3–11 V last.
const CAPS = 'a1 61 2c 91 01 08 2c d1 02 00 2c c1 03 00 2c b1 04 00 45 41 06 00 3c 21 dc c0';

describe.skipIf(!hasChromium)('Decoder page', () => {
  const suite = useBrowserSuite();

  it('decodes a pasted Source_Capabilities, and the shared link reproduces it', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'support');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Decoder' }).click();
    await page.getByRole('heading', { level: 1, name: 'Decoder' }).waitFor();
    await page.getByLabel('Message', { exact: true }).fill(CAPS);

    const objects = page.getByRole('table', { name: 'Data objects' });
    await objects.getByRole('row').nth(6).waitFor();
    expect(await page.getByTestId('message-type').innerText()).toBe('Source_Capabilities');
    const first = await objects.getByRole('row').nth(1).innerText();
    expect(first).toContain('voltage 5 V');
    expect(first).toContain('max current 3 A');
    expect(await objects.getByRole('row').nth(6).innerText()).toContain('min voltage 3.3 V, max voltage 11 V, max current 3 A');

    // Bit-field view: focusing a field names it, its bits, its value with unit and its table.
    const object1 = page.getByRole('figure', { name: /^Object 1: Fixed Supply PDO – Source/ });
    await object1.locator('[data-field="voltageMv"]').focus();
    const detail = await object1.locator('[aria-live="polite"]').innerText();
    expect(detail).toContain('Voltage');
    expect(detail).toContain('B19…10');
    expect(detail).toContain('5 V (100 × 50 mV)');
    expect(detail).toContain('Table 6.9');
    await screenshot(page, 'decoder-source-caps');

    // The input is in the URL: a new page with the same address shows the same decode.
    await page.waitForURL(/in=/);
    const shared = page.url();
    const second = await suite.context.newPage();
    await second.goto(shared);
    await second.getByRole('table', { name: 'Data objects' }).getByRole('row').nth(6).waitFor();
    expect(await second.getByTestId('message-type').innerText()).toBe('Source_Capabilities');
    expect(await second.getByLabel('Message', { exact: true }).inputValue()).toBe(CAPS);
    await second.close();
    watch.assertClean();
    await page.close();
  });

  it('shows a length error with its byte offset highlighted', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'engineer');
    // One byte more than the header's 6 objects (26 bytes) allow: the error points at byte 26.
    await page.goto(`${suite.url}/decoder?in=${encodeURIComponent(`${CAPS} 00`)}`);
    const alert = page.getByRole('alert').filter({ hasText: 'decode.length' });
    await alert.waitFor();
    expect(await alert.innerText()).toContain('byte 26');
    expect(await page.getByTestId('error-offset').innerText()).toBe('00');
    await screenshot(page, 'decoder-length-error');
    watch.assertClean();
    await page.close();
  });

  it('lists the messages of a dropped VCD capture and opens one', async () => {
    const { page, watch } = await suite.newPage();
    await signIn(page, suite.url, 'support');
    await page.goto(`${suite.url}/decoder`);
    const caps = parseHex(CAPS);
    const goodCrc = parseHex('4100'); // GoodCRC (0x01, no objects) from a sink UFP, rev 2.0: Table 6.1 by hand
    if (!caps.ok || !goodCrc.ok) throw new Error('hex');
    const { vcd } = encodeWaveform([{ sop: 'SOP', bytes: caps.bytes }, { sop: 'SOP', bytes: goodCrc.bytes }, { orderedSet: 'Hard_Reset' }]);
    await page.getByLabel('VCD capture').setInputFiles({ name: 'kestrel-charger.vcd', mimeType: 'text/plain', buffer: Buffer.from(vcd) });
    const list = page.getByRole('list', { name: 'Messages in kestrel-charger.vcd' });
    await list.getByRole('listitem').nth(2).waitFor();
    expect(await list.getByRole('listitem').allInnerTexts()).toEqual([expect.stringContaining('Source_Capabilities'), expect.stringContaining('GoodCRC'), expect.stringContaining('Hard Reset')]);
    await list.getByRole('button', { name: /Source_Capabilities/ }).click();
    await page.getByRole('table', { name: 'Data objects' }).getByRole('row').nth(6).waitFor();
    expect(await page.getByTestId('message-type').innerText()).toBe('Source_Capabilities');
    watch.assertClean();
    await page.close();
  });
});
