/**
 * A support engineer saves an import mapping for the team's firmware console log, then uploads
 * such a log through it: the log is read without hand editing and analysed like any trace.
 */
import { describe, expect, it } from 'vitest';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

// A K65 console log as its firmware prints it (invented): the offer, the Request for 9 V (object 2), Accept, PS_RDY,
// each with its GoodCRC. Headers per USB PD R3.2 V1.1 §6.2.1.1 Table 6.1 (revision 3.0: bits 7..6 = 10b).
const consoleLog = [
  '# K65 fw 3.1 console',
  '[    0.150200] pd: SRC 0x21A1 0x0001912C 0x0002D12C',
  '[    0.151100] pd: SNK 0x0081',
  '[    0.155000] pd: SNK 0x1082 0x200320C8',
  '[    0.155700] pd: SRC 0x01A1',
  'usb: enumerated',
  '[    0.158000] pd: SRC 0x03A3',
  '[    0.158600] pd: SNK 0x0281',
  '[    0.195000] pd: SRC 0x05A6',
  '[    0.195600] pd: SNK 0x0481',
].join('\n');

describe.skipIf(!hasChromium)('import mapping', () => {
  const suite = useBrowserSuite();

  it('saves a mapping for the team and reads a console log through it on upload', async () => {
    const { page, watch } = await suite.newPage({ width: 1440, height: 1000 });
    await signIn(page, suite.url, 'support');
    await page.goto(`${suite.url}/traces`);
    const panel = page.getByRole('region', { name: 'Upload a trace' });
    await panel.getByRole('button', { name: 'New import mapping…' }).click();
    const form = panel.getByRole('form', { name: 'New import mapping' });
    await form.getByLabel('Name').fill('K65 console');
    await form.getByLabel('Pattern').fill(String.raw`^\[\s*(?<time>[\d.]+)\]\s+pd:\s+(?<dir>SRC|SNK)\s+(?<data>.+)$`);
    await form.getByLabel('Time unit').selectOption('s');
    await form.getByLabel('Message printed as').selectOption('words');
    await form.getByLabel('Source words').fill('SRC');
    await form.getByLabel('Sink words').fill('SNK');
    await screenshot(page, 'import-mapping-form');
    await form.getByRole('button', { name: 'Save mapping for the team' }).click();
    await expect.poll(() => panel.getByLabel('Read the file as').inputValue()).not.toBe('');
    expect(await panel.getByLabel('Read the file as').locator('option:checked').textContent()).toBe('Console log: K65 console');

    await panel.getByTestId('trace-file-input').setInputFiles({ name: 'k65-console.log', mimeType: 'text/plain', buffer: Buffer.from(consoleLog) });
    await panel.getByRole('button', { name: 'Upload and analyse' }).click();
    await panel.getByTestId('upload-summary').waitFor({ timeout: 60_000 });
    // 9 V at 2 A from the offer's second object (USB PD R3.2 V1.1 Table 6.23 fixed RDO: position 2, 200 × 10 mA).
    expect(await panel.getByTestId('upload-summary').textContent()).toMatch(/^Contract 9 V 2 A at 0\.195 s/);
    expect(await panel.getByTestId('mapped-note').textContent()).toBe('Read with “K65 console”: 8 messages, 1 line without a message left out (first: line 6, the pattern does not match).');
    await screenshot(page, 'import-mapping-uploaded');

    // Another member of the team finds the mapping on their upload panel.
    await page.request.post(`${suite.url}/api/auth/logout`);
    await signIn(page, suite.url, 'engineer');
    await page.goto(`${suite.url}/traces`);
    await expect.poll(() => page.getByRole('region', { name: 'Upload a trace' }).getByLabel('Read the file as').locator('option').allTextContents()).toContain('Console log: K65 console');
    watch.assertClean();
  }, 120_000);
});
