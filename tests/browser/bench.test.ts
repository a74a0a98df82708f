import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { requireChromium, screenshot, signIn, useBrowserSuite, watchPage, type PageWatch } from './support.ts';

const hasChromium = requireChromium();

/** Waits until the timeline's last part and every part of the chart are on the page. */
async function timelineDrawn(page: Page): Promise<void> {
  await page.getByTestId('timer-lane-sink').waitFor();
  await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
}

describe.skipIf(!hasChromium)('the Bench page', () => {
  const suite = useBrowserSuite();
  let page: Page;
  let watch: PageWatch;

  async function openBench(): Promise<Page> {
    ({ page, watch } = await suite.newPage());
    await signIn(page, suite.url, 'engineer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bench' }).click();
    await page.getByRole('heading', { level: 1, name: 'Bench' }).waitFor();
    return page;
  }

  async function runAndWait(current: Page): Promise<void> {
    await current.getByRole('button', { name: 'Run', exact: true }).click();
    await current.getByTestId('contract-summary').waitFor();
    await current.getByRole('button', { name: 'Run', exact: true, disabled: false }).waitFor();
  }

  it('runs the 65 W demo device, shows the contract and the timeline, and opens a message', async () => {
    const current = await openBench();
    await current.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    const offers = current.getByRole('list', { name: 'Offers in object-position order' }).getByRole('listitem');
    await expect.poll(() => offers.count()).toBe(5);
    await current.getByLabel('Sink policy').selectOption('fixed');
    await current.getByLabel('Voltage (mV)', { exact: true }).last().fill('15000');
    await current.getByLabel('Current (mA)', { exact: true }).last().fill('2000');

    await runAndWait(current);
    // 15 V at 2 A from the K65's 15 V 3 A offer (object 3): a fixed contract of 30 W.
    const summary = await current.getByTestId('contract-summary').innerText();
    expect(summary).toContain('15 V · 2.00 A');
    expect(summary).toContain('30.0 W');
    expect(summary).toContain('fixed, object 3');

    await current.getByTestId('bench-timeline').waitFor();
    // The timeline mounts part by part (one part a task): wait for the last part.
    await timelineDrawn(current);
    expect(await current.getByTestId('vbus-chart').locator('svg.parley-chart-surface').count()).toBeGreaterThan(0);
    expect(await current.getByTestId('state-lane-source').locator('div').count()).toBeGreaterThan(2);
    expect(await current.getByTestId('timer-lane-sink').locator('div').count()).toBeGreaterThan(0);
    // The run's one finding is named in plain words on the chart; its rule id is in the pin's detail.
    const findingName = current.getByTestId('vbus-chart').locator('[data-finding-rule="caps.pdp-inferred"]');
    await expect.poll(() => findingName.textContent()).toBe('PDP inferred from the offers');
    expect(await current.getByRole('group', { name: 'Findings on the timeline' }).getByRole('button').first().getAttribute('aria-label')).toMatch(
      /^PDP inferred from the offers at [\d.]+ ms: .+ \(info, rule caps\.pdp-inferred\)$/,
    );

    await current.getByRole('button', { name: 'First contract' }).click();
    await current
      .getByRole('listbox', { name: 'Messages' })
      .getByRole('option', { name: /^Request #\d+ from the sink at/ })
      .first()
      .click();
    const panel = current.getByRole('complementary', { name: 'Message details' });
    await panel.getByRole('heading', { name: 'Request' }).waitFor();
    expect(await panel.getByText('Object position').count()).toBeGreaterThan(0);
    expect(await panel.getByTestId('message-json').innerText()).toContain('"messageType": "Request"');
    await screenshot(current, 'bench-k65-fixed-15v');
    await current.emulateMedia({ colorScheme: 'dark' });
    await expect.poll(() => current.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await screenshot(current, 'bench-k65-fixed-15v-dark');
    watch.assertClean();
  }, 90_000);

  it('runs a 140 W EPR scenario built in the form: EPR offers, an EPR cable, an action', async () => {
    const current = await openBench();
    // The D100's SPR offers (5, 9, 15 V 3 A, 20 V 5 A, PPS) plus EPR 28 V 5 A and EPR AVS 15–28 V 140 W:
    // a 140 W EPR source (USB PD R3.2 V1.1 §10.2.3, EPR Power Rules, from memory).
    await current.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel D100 desk charger (100 W)' });
    const eprOffers = current.getByRole('list', { name: 'EPR offers from object position 8' }).getByRole('listitem');
    // The Bench's EPR list is the shared offer editor: it adds only fixed and EPR AVS objects, from position 8.
    const eprSection = current.getByRole('region', { name: 'EPR offers' });
    expect(await eprSection.getByLabel('New offer').locator('option').allTextContents()).toEqual(['Fixed', 'EPR AVS']);
    await eprSection.getByRole('button', { name: 'Add offer' }).click();
    expect(await eprOffers.nth(0).getAttribute('aria-label')).toBe('Offer 8');
    await eprOffers.nth(0).getByLabel('Voltage (mV)').fill('28000');
    await eprOffers.nth(0).getByLabel('Max current (mA)').fill('5000');
    await eprSection.getByLabel('New offer').selectOption('epr-avs');
    await eprSection.getByRole('button', { name: 'Add offer' }).click();
    await eprOffers.nth(1).getByLabel('Min voltage (mV)').fill('15000');
    await eprOffers.nth(1).getByLabel('Max voltage (mV)').fill('28000');
    await eprOffers.nth(1).getByLabel('PDP (W)').fill('140');
    await expect.poll(() => eprOffers.count()).toBe(2);

    await current.getByLabel('EPR operational PDP (W)').fill('140');
    await current.getByLabel('Sink policy').selectOption('fixed');
    await current.getByLabel('Voltage (mV)', { exact: true }).last().fill('28000');
    await current.getByLabel('Current (mA)', { exact: true }).last().fill('5000');
    await current.getByLabel('Current rating').selectOption('5000');
    await current.getByLabel('E-marker (Discover Identity on SOP′)').selectOption('5a-50v-epr');
    // An action on the time line: the sink asks for Source_Capabilities_Extended at 2 s, in EPR mode.
    await current.getByRole('button', { name: '+ Add an action' }).click();
    const action = current.getByRole('listitem', { name: 'Action 1' });
    expect(await action.getByLabel('Starts').inputValue()).toBe('get_source_cap_extended');
    await current.getByLabel('Duration (ms)').fill('3000');

    await runAndWait(current);
    // SPR contract first, then EPR mode entry with the source's cable discovery on SOP′, chunked
    // EPR offers, and the EPR_Request for object 8 (§6.4.9, §6.4.10, §8.3.3.26).
    const summary = await current.getByTestId('contract-summary').innerText();
    expect(summary).toContain('28 V · 5.00 A');
    expect(summary).toContain('140.0 W');
    expect(summary).toContain('object 8');
    await timelineDrawn(current);
    // The list opens on the cable's Discover Identity on SOP′, decoded as a cable's answer.
    const messages = current.getByRole('listbox', { name: 'Messages' });
    await messages.getByRole('option', { name: /^Vendor_Defined #0 from the cable at/ }).waitFor();
    await screenshot(current, 'bench-epr-140w');
    watch.assertClean();
  }, 120_000);

  // Main-thread long tasks are measured by `npm run bench:ui`, not asserted here (a busy machine is no bug).
  it('exports the chart as an SVG that carries the title, the legend and everything drawn in the chart', async () => {
    const current = await openBench();
    await current.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    await runAndWait(current);
    await timelineDrawn(current);
    // Every label drawn inside the chart on the page (axes, events, findings) must travel with the file.
    const drawn = await current
      .locator('[data-testid="vbus-chart"] svg')
      .first()
      .evaluate((svg) => [...svg.querySelectorAll('text')].map((t) => t.textContent ?? '').filter((t) => t.trim() !== ''));
    expect(drawn.length).toBeGreaterThan(0);
    const [download] = await Promise.all([current.waitForEvent('download'), current.getByRole('button', { name: 'Chart (.svg)' }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.chart\.svg$/);
    const stream = await download.createReadStream();
    let markup = '';
    for await (const chunk of stream) markup += chunk.toString();
    expect(markup).toContain('data-export-header');
    expect(markup).toMatch(/— VBUS and IBUS<\/text>/);
    for (const label of ['VBUS at the source (V)', 'VBUS at the sink (V)', 'IBUS (A)', 'reset', 'attach', 'finding']) expect(markup).toContain(`>${label}<`);
    // This run injects no fault, so its picture does not promise one (as the legend on screen).
    expect(markup).not.toContain('>fault injected<');
    for (const label of drawn) expect(markup).toContain(`>${label.replace(/&/g, '&amp;').replace(/</g, '&lt;')}<`);
    watch.assertClean();
  });

  it('retries a Request whose GoodCRC is dropped', async () => {
    const current = await openBench();
    await current.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    await current.getByRole('button', { name: '+ Add a fault' }).click();
    const fault = current.getByRole('listitem', { name: 'Fault 1' });
    await fault.getByLabel('Fault', { exact: true }).selectOption('drop');
    await fault.getByLabel('From').selectOption('source');
    await fault.getByLabel('Message type').fill('GoodCRC');
    await fault.getByLabel('nth').fill('1');
    await current.getByLabel('Duration (ms)').fill('20000');

    await runAndWait(current);
    await timelineDrawn(current);

    // The source's first GoodCRC (for the Request) never arrives: tReceive runs out and the sink sends
    // the Request again (USB PD R3.2 V1.1 §6.6.1 CRCReceiveTimer, §6.7.1 retries; from memory).
    await current.getByRole('button', { name: 'First contract' }).click();
    // The list holds every message (the lanes may fold the retry into a burst at this zoom).
    const requests = current.getByRole('listbox', { name: 'Messages' }).getByRole('option', { name: /^Request #\d+ from the sink at/ });
    await expect.poll(() => requests.count()).toBeGreaterThanOrEqual(2);
    expect(await current.getByTestId('timer-lane-sink').locator('[data-expired]').count()).toBeGreaterThan(0);
    await timelineDrawn(current);
    await screenshot(current, 'bench-dropped-goodcrc');

    // Zoomed in far around 10 s of the 20 s run, every time tick still reads differently (the axis
    // printed one decimal past 10 s, so 10.05 s and 10.10 s both read "10.1 s").
    await current.getByRole('button', { name: 'Whole run' }).click();
    for (let zoom = 0; zoom < 6; zoom++) await current.getByRole('button', { name: 'Zoom in', exact: true }).click();
    await expect.poll(() => current.getByTestId('timeline-window').textContent()).toMatch(/^9\.\d+ s – 10\.\d+ s$/);
    await timelineDrawn(current);
    // The time axis' labels are the tick labels in seconds or milliseconds (the others read V or A).
    const timeLabels = async () => (await current.locator('[data-testid="vbus-chart"] text.parley-axis-tick').allTextContents()).filter((text) => / m?s$/.test(text));
    await expect.poll(async () => (await timeLabels()).length).toBeGreaterThan(2);
    const labels = await timeLabels();
    expect(new Set(labels).size, labels.join(', ')).toBe(labels.length);
    for (const label of labels) expect(label).toMatch(/^\d+\.\d+ s$/);
    await screenshot(current, 'bench-zoomed-axis');
    watch.assertClean();
  });

  it('shows the run beside the scenario at 1440×900 and saves it to the Library', async () => {
    ({ page, watch } = await suite.newPage({ width: 1440, height: 900 }));
    await signIn(page, suite.url, 'engineer');
    await page.goto(`${suite.url}/bench`);
    await page.getByRole('heading', { level: 1, name: 'Bench' }).waitFor();
    expect(await page.title()).toBe('Bench · Parley');
    await page.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    await runAndWait(page);
    // The contract is on screen without scrolling: inside the 900 px viewport, beside the form.
    const box = await page.getByTestId('contract-summary').boundingBox();
    expect(box).not.toBeNull();
    expect(box!.y + box!.height).toBeLessThanOrEqual(900);
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
    const form = await page.getByRole('form', { name: 'Scenario' }).boundingBox();
    expect(box!.x).toBeGreaterThan(form!.x + form!.width - 1);
    await timelineDrawn(page);
    await screenshot(page, 'bench-1440x900');

    // The form folds away and the run takes the width; Run still submits the folded form.
    await page.getByRole('button', { name: 'Hide the scenario' }).click();
    await runAndWait(page);
    await timelineDrawn(page);
    await screenshot(page, 'bench-form-collapsed');
    await page.getByRole('button', { name: 'Show the scenario' }).click();

    // Save to the team Library with a title and tags, then follow the link to the saved vector.
    const save = page.getByRole('form', { name: 'Save to Library' });
    await save.getByLabel('Title').fill('K65 default sink 5 V');
    await save.getByLabel('Tags').fill('k65, smoke');
    await save.getByRole('button', { name: 'Save to Library' }).click();
    const saved = save.getByRole('status');
    await saved.waitFor();
    expect(await saved.textContent()).toContain('negotiation/bench/k65-default-sink-5-v');
    await screenshot(page, 'bench-saved-to-library');
    await saved.getByRole('link').click();
    await page.waitForURL(/\/library\/negotiation%2Fbench%2Fk65-default-sink-5-v$/);
    await page.getByRole('heading', { level: 1, name: 'negotiation/bench/k65-default-sink-5-v' }).waitFor();
    expect(await page.title()).toBe('Vector negotiation/bench/k65-default-sink-5-v — K65 default sink 5 V · Parley');
    const stored = await page.evaluate(async () => (await (await fetch('/api/vectors/negotiation%2Fbench%2Fk65-default-sink-5-v')).json()) as { tags: string[]; kind: string });
    expect(stored.kind).toBe('negotiation');
    expect(stored.tags).toEqual(['bench', 'k65', 'smoke']);
    await screenshot(page, 'bench-saved-vector');
    watch.assertClean();
  }, 120_000);

  it('opens a stored trace as a scenario and runs it', async () => {
    const current = await openBench();
    const listed = await current.evaluate(async () => {
      const response = await fetch('/api/traces?pageSize=50', { credentials: 'same-origin' });
      return (await response.json()) as { items: { id: number | string; title: string; status?: string }[] };
    });
    const reference = listed.items.find((item) => item.title === 'K65 with Wren 14 on bench 2');
    expect(reference, `demo traces: ${listed.items.map((item) => item.title).join(', ')}`).toBeDefined();
    await current.goto(`${suite.url}/bench?fromTrace=${encodeURIComponent(String(reference!.id))}`);
    await current.getByText(/^Opened trace .* as a scenario/).waitFor({ timeout: 20_000 });
    // The capture's last Source_Capabilities are the K65's five offers; the laptop asked for 20 V.
    await expect.poll(() => current.getByRole('list', { name: 'Offers in object-position order' }).getByRole('listitem').count()).toBe(5);
    expect(await current.getByLabel('Sink policy').inputValue()).toBe('fixed');
    expect(await current.getByLabel('Voltage (mV)', { exact: true }).last().inputValue()).toBe('20000');
    await runAndWait(current);
    // 20 V at 3.25 A from object 4 needs a 5 A cable, which the derived scenario takes.
    expect(await current.getByTestId('contract-summary').innerText()).toContain('20 V · 3.25 A');
    await screenshot(current, 'bench-from-trace');
    watch.assertClean();
  });

  it('keeps form and JSON in sync, keeps bad JSON, and reopens a shared link', async () => {
    const current = await openBench();
    await current.getByLabel('Seed').fill('42');
    await current.getByRole('tab', { name: 'JSON' }).click();
    const editor = current.locator('.monaco-editor').first();
    await editor.waitFor();
    await expect.poll(async () => (await current.locator('.view-lines').innerText()).replace(/\s+/g, ' ')).toContain('"seed": 42');

    // An invalid edit shows its error and leaves the text and the form alone.
    await editor.click();
    await current.keyboard.press('ControlOrMeta+End');
    // A stray character after the closing brace (no completion pops up for it).
    await current.keyboard.type(']');
    await current.getByTestId('scenario-json-error').waitFor();
    expect(await current.getByTestId('scenario-json-error').innerText()).toMatch(/^JSON: /);
    await screenshot(current, 'bench-json-error');
    await current.keyboard.press('Escape');
    await current.keyboard.press('Backspace');
    await expect.poll(() => current.getByTestId('scenario-json-error').count()).toBe(0);

    await current.getByRole('tab', { name: 'Form' }).click();
    expect(await current.getByLabel('Seed').inputValue()).toBe('42');
    await current.getByLabel('Duration (ms)').fill('4321');
    await current.getByRole('button', { name: 'Share link' }).click();
    const link = await current.getByLabel('Share link').inputValue();
    expect(link).toMatch(/\/bench#scenario=[A-Za-z0-9_-]+$/);

    const other = await suite.context.newPage();
    const otherWatch = watchPage(other);
    await other.goto(link);
    await other.getByRole('heading', { level: 1, name: 'Bench' }).waitFor();
    await other.getByText('Opened the shared scenario from the link.').waitFor();
    expect(await other.getByLabel('Seed').inputValue()).toBe('42');
    expect(await other.getByLabel('Duration (ms)').inputValue()).toBe('4321');
    await other.close();
    otherWatch.assertClean();
    watch.assertClean();
  }, 90_000);
});
