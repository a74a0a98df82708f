/**
 * The Fault sweep page in Debian's chromium, as a firmware developer uses it: the run count before
 * starting, the sweep in Web Workers, the matrix with its legend, a cell opened on the Bench, and a
 * broken run (a source too slow for tPSTransition's minimum) shrunk and saved to the Library.
 */
import { describe, expect, it } from 'vitest';
import { requireChromium, screenshot, signIn, useBrowserSuite } from './support.ts';

const hasChromium = requireChromium();

// Kestrel Devices K60 whose supply slews 34 mV/ms: 5 → 20 V takes ~470 ms, past tPSTransition's 450 ms minimum.
const SLOW = {
  source: { caps: { pdos: ['0x0001912c', '0x0002d12c', '0x0004b12c', '0x0006412c'] }, behaviour: { slewMvPerMs: 34 } },
  sink: { policy: { kind: 'max-power' } },
  durationMs: 8000,
  seed: 3,
};

describe.skipIf(!hasChromium)('the Fault sweep page', () => {
  const suite = useBrowserSuite();

  it('counts, sweeps, draws the matrix, opens a cell on the Bench and saves a broken run', async () => {
    const { page, watch } = await suite.newPage({ width: 1400, height: 1000 });
    const workers: string[] = [];
    page.on('worker', (worker) => workers.push(worker.url()));
    await signIn(page, suite.url, 'engineer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fault sweep' }).click();
    await page.getByRole('heading', { level: 1, name: 'Fault sweep' }).waitFor();

    // The demo 9 V scenario: the count is there before starting.
    await expect.poll(() => page.getByTestId('run-count').textContent(), { timeout: 30_000 }).toMatch(/^\d+ runs over 8 messages of the fault-free run$/);
    await page.getByRole('button', { name: 'Start sweep' }).click();
    await page.getByTestId('sweep-matrix').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('sweep-legend').textContent()).toContain('Contract at the same power');
    expect(await page.getByRole('heading', { name: 'Every invariant held' }).count()).toBe(1);
    // The card says what held: every invariant with its explanation, and the runs per outcome class.
    const invariants = page.getByTestId('sweep-invariants').locator('li');
    expect(await invariants.count()).toBe(5);
    const first = await invariants.first().innerText();
    expect(first).toMatch(/^Both ports agree on the contract\s+contract\.agreement/);
    expect(first).toMatch(/held in all \d+ runs\s+Whenever either policy engine claims an explicit contract/);
    expect(await page.getByText(/^\d+ runs judged by 5 invariants\. Contract at the same power: \d+/).count()).toBe(1);
    expect(workers.some((url) => /sweep\.worker/.test(url))).toBe(true);
    await screenshot(page, 'fault-sweep-9v-matrix');

    // A cell opens its run on the Bench (a share link in a new tab), which runs it at once: the
    // Request lost (drop@2) is answered by the source's retry of Source_Capabilities, then the contract.
    const [bench] = await Promise.all([page.context().waitForEvent('page'), page.getByTestId('sweep-matrix').locator('button[data-run="drop@2"]').click()]);
    await bench.getByRole('heading', { level: 1, name: 'Bench' }).waitFor({ timeout: 30_000 });
    await expect.poll(() => bench.getByText('Opened the shared scenario from the link.').count(), { timeout: 30_000 }).toBe(1);
    expect(new URL(bench.url()).hash).toMatch(/&run=1$/);
    await bench.getByTestId('bench-timeline').waitFor({ timeout: 60_000 });
    await expect.poll(() => bench.getByTestId('contract-summary').innerText(), { timeout: 60_000 }).toContain('9 V');
    await screenshot(bench, 'fault-sweep-cell-on-bench');
    await bench.close();

    // The same campaign on the server: the run page shows its progress, outcome classes and invariants; the Runs page lists it.
    await page.getByRole('button', { name: 'Run on the server' }).click();
    await page.waitForURL(/\/runs\/\d+$/, { timeout: 30_000 });
    await page.getByText('Fault sweep on the server').waitFor();
    await page.getByTestId('sweep-run-outcomes').waitFor({ timeout: 120_000 });
    expect(await page.getByTestId('sweep-run-outcomes').innerText()).toMatch(/Contract at the same power: \d+ runs, e\.g\. fault-free/);
    await page.getByText('No run broke an invariant').waitFor();
    await screenshot(page, 'fault-sweep-server-run');
    await page.getByRole('link', { name: /^Runs of / }).click();
    await page.getByRole('table').getByText('Fault sweep', { exact: true }).first().waitFor();
    await screenshot(page, 'fault-sweep-server-in-runs');
    await page.goBack();
    await page.goBack();
    await page.getByRole('heading', { level: 1, name: 'Fault sweep' }).waitFor();

    // A slow source: the tPSTransition=min run breaks; it is shrunk and saved to the Library.
    await page.getByLabel('Scenario (JSON)').fill(JSON.stringify(SLOW, null, 2));
    await page.getByLabel('Late (delay)').uncheck();
    await page.getByLabel('Bad CRC (corrupt)').uncheck();
    await expect.poll(() => page.getByTestId('run-count').textContent(), { timeout: 30_000 }).toMatch(/runs over \d+ messages/);
    await page.getByRole('button', { name: 'Start sweep' }).click();
    const broken = page.getByTestId('sweep-broken').locator('li').filter({ hasText: 'tPSTransition=min' });
    await broken.waitFor({ timeout: 60_000 });
    await screenshot(page, 'fault-sweep-broken');
    await broken.getByRole('button', { name: 'Save to Library' }).click();
    await expect.poll(() => broken.getByRole('status').textContent(), { timeout: 60_000 }).toMatch(/^Saved to the Library as sweep\//);
    await screenshot(page, 'fault-sweep-saved');
    watch.assertClean();
  }, 180_000);
});
