/**
 * `npm run bench:ui`: the trace page and the Bench in headless Chromium (Debian's, through
 * playwright-core), against the built client and the real server with the demo organisation.
 *
 * Traces, written by this script with the engine's codec (shared/pd encodeMessage):
 * - steady captures of about 1 MB, 10 MB and 45 MB: a fixed 9 V contract the sink re-requests
 *   every 2 s, VBUS/IBUS read every 10 ms;
 * - the programmable ramp: a source whose sink steps its programmable (PPS) voltage 20 mV every
 *   500 ms for 10,000 steps (10,000 contracts), VBUS read every 100 ms, following each step.
 * Each is uploaded, analysed by the server, then opened in a fresh tab: time from navigation to a
 * drawn timeline, the longest main-thread task, the JS heap and the DOM nodes once drawn. The
 * baseline, measured in the same run, is the smallest demo trace's page (141 lines).
 * Also each page's longest task for a Bench run (the K65, 15 V) and for a trace page opened from
 * the list (these budgets used to be asserted in the browser tests; here they are measured).
 * Targets (issue 17): the ramp draws in ≤ 1.5 s, no task over 100 ms, under 10,000 DOM nodes.
 */
import { mkdtempSync, rmSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { encodeMessage, toHex } from '../shared/pd/index.ts';
import { launchBrowser, requireDist, signIn, startTestServer, requireChromium } from '../tests/browser/support.ts';
import { report, type BenchFigure } from './report.ts';

const RAMP_TARGET_MS = 1_500;
const TASK_TARGET_MS = 100;
const DOM_TARGET = 10_000;

type Side = 'source' | 'sink';

/** Wire hex of a message built by the engine's encoder (so the analyser reads real PD words). */
function hexOf(input: Parameters<typeof encodeMessage>[0]): string {
  const encoded = encodeMessage(input);
  if (!encoded.ok) throw new Error(`encode: ${encoded.error.message}`);
  return toHex(encoded.bytes);
}

function control(messageType: string, messageId: number, from: Side): string {
  return hexOf({ header: { messageType, messageId, powerRole: from, dataRole: from === 'source' ? 'dfp' : 'ufp', specRevision: '3.0', extended: false } as never });
}

const fixedPdo = (voltageMv: number, maxCurrentMa: number) => ({
  kind: 'fixed',
  voltageMv,
  maxCurrentMa,
  peakCurrent: 0,
  dualRolePower: false,
  usbSuspendSupported: false,
  unconstrainedPower: false,
  usbCommunicationsCapable: false,
  dualRoleData: false,
  unchunkedExtendedMessages: false,
  eprModeCapable: false,
});
/** The K65-like offer: 5, 9, 15 V fixed and a 3.3–11 V programmable supply (object 4). */
const CAPS_HEX = hexOf({
  header: { messageType: 'Source_Capabilities', messageId: 0, powerRole: 'source', dataRole: 'dfp', specRevision: '3.0', extended: false },
  objects: [fixedPdo(5_000, 3_000), fixedPdo(9_000, 3_000), fixedPdo(15_000, 3_000), { kind: 'pps', minVoltageMv: 3_300, maxVoltageMv: 11_000, maxCurrentMa: 3_000, powerLimited: false }],
} as never);

function request(messageId: number, rdo: Record<string, unknown>): string {
  return hexOf({ header: { messageType: 'Request', messageId, powerRole: 'sink', dataRole: 'ufp', specRevision: '3.0', extended: false }, objects: [rdo] } as never);
}
const rdoFlags = { capabilityMismatch: false, usbCommunicationsCapable: false, noUsbSuspend: true, unchunkedExtendedMessages: false, eprModeCapable: false };
const ppsRdo = (outputVoltageMv: number) => ({ kind: 'rdo-pps', objectPosition: 4, outputVoltageMv, operatingCurrentMa: 2_000, ...rdoFlags });

type Writer = { line(text: string): void; close(): void };

function writer(path: string): Writer {
  const parts: string[] = [];
  return {
    line: (text) => void parts.push(text),
    close: () => writeFileSync(path, parts.join('\n') + '\n'),
  };
}

/** Request, Accept and PS_RDY with their GoodCRCs (USB PD R3.2 V1.1 §8.3.2.2, from memory). */
function negotiation(w: Writer, t: number, requestHex: (id: number) => string, ids: { src: number; snk: number }): number {
  const msg = (at: number, hex: string, from: Side) => w.line(`{"t":${at},"msg":"${hex}","from":"${from}"}`);
  msg(t, requestHex(ids.snk), 'sink');
  msg(t + 700, control('GoodCRC', ids.snk, 'source'), 'source');
  msg(t + 3_000, control('Accept', ids.src, 'source'), 'source');
  msg(t + 3_600, control('GoodCRC', ids.src, 'sink'), 'sink');
  ids.src = (ids.src + 1) % 8;
  msg(t + 40_000, control('PS_RDY', ids.src, 'source'), 'source');
  msg(t + 40_600, control('GoodCRC', ids.src, 'sink'), 'sink');
  ids.src = (ids.src + 1) % 8;
  ids.snk = (ids.snk + 1) % 8;
  return t + 41_000;
}

function start(w: Writer, title: string): { t: number; ids: { src: number; snk: number } } {
  w.line(JSON.stringify({ trace: 1, title, capturedAt: '2026-11-30T09:12:00Z' }));
  w.line('{"t":0,"event":"attach","cc":"CC1","rp":"3.0A"}');
  w.line(`{"t":150000,"msg":"${CAPS_HEX}","from":"source"}`);
  w.line(`{"t":151100,"msg":"${control('GoodCRC', 0, 'sink')}","from":"sink"}`);
  return { t: 155_000, ids: { src: 1, snk: 0 } };
}

/** A fixed 9 V contract re-requested every 2 s, VBUS read every 10 ms, until the file holds about `bytes`. */
function steadyTrace(path: string, bytes: number): void {
  const w = writer(path);
  const begun = start(w, `Kestrel K65 soak, ${Math.round(bytes / 1e6)} MB`);
  let { t } = begun;
  const { ids } = begun;
  let size = 0;
  // 9 V 2 A from object 2: the fixed RDO as the codec decodes it (kind rdo-fixed).
  const fixed = (id: number) => request(id, { kind: 'rdo-fixed', objectPosition: 2, operatingCurrentMa: 2_000, maxOperatingCurrentMa: 2_000, giveBack: false, ...rdoFlags });
  const line = w.line;
  w.line = (text) => {
    size += text.length + 1;
    line(text);
  };
  while (size < bytes) {
    const end = negotiation(w, t, fixed, ids);
    for (let r = t + 50_000; r < t + 2_000_000; r += 10_000) w.line(`{"t":${r},"vbus":{"mv":${9_000 + (Math.floor(r / 10_000) % 7) - 3},"ma":${1_950 + (Math.floor(r / 10_000) % 11)}}}`);
    t = Math.max(end, t + 2_000_000);
  }
  w.close();
}

/** The programmable ramp: 10,000 PPS steps of 20 mV every 500 ms, VBUS read every 100 ms. */
function rampTrace(path: string): void {
  const w = writer(path);
  const begun = start(w, 'Kestrel K65 programmable ramp');
  let { t } = begun;
  const { ids } = begun;
  for (let step = 0; step < 10_000; step++) {
    const outputVoltageMv = 5_000 + (step % 300) * 20;
    const stepStart = t;
    negotiation(w, t, (id) => request(id, ppsRdo(outputVoltageMv)), ids);
    for (let r = stepStart + 100_000; r < stepStart + 500_000; r += 100_000) w.line(`{"t":${r},"vbus":{"mv":${outputVoltageMv + (r % 7)},"ma":2000}}`);
    t = stepStart + 500_000;
  }
  w.close();
}

type PageFigures = { drawnMs: number; longestTaskMs: number; heapMb: number; domNodes: number };

async function installLongTaskObserver(page: Page): Promise<void> {
  await page.addInitScript(() => {
    const seen: number[] = [];
    (window as unknown as { __tasks: number[] }).__tasks = seen;
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries()) seen.push(entry.duration);
    }).observe({ type: 'longtask', buffered: true });
  });
}

async function longestTask(page: Page): Promise<number> {
  return page.evaluate(async () => {
    await new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve)));
    await new Promise((resolve) => requestIdleCallback(resolve, { timeout: 1_000 }));
    return Math.max(0, ...(window as unknown as { __tasks: number[] }).__tasks);
  });
}

async function openTracePage(page: Page, url: string, id: number): Promise<PageFigures> {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(error.message));
  page.on('console', (message) => message.type() === 'error' && errors.push(message.text()));
  await page.goto(`${url}/traces/${id}`, { waitUntil: 'commit' });
  try {
    await page.locator('[data-testid="vbus-chart"][data-drawn]').waitFor({ timeout: 120_000 });
  } catch (error) {
    await page.screenshot({ path: join(tmpdir(), `parley-bench-ui-trace-${id}.png`) });
    throw new Error(`trace ${id} did not draw: ${errors.join(' | ') || (error as Error).message}`);
  }
  const drawnMs = await page.evaluate(() => performance.now());
  const longestTaskMs = await longestTask(page);
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Performance.enable');
  const { metrics } = await cdp.send('Performance.getMetrics');
  await cdp.detach();
  const heapMb = (metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? 0) / 1024 / 1024;
  const domNodes = await page.evaluate(() => document.getElementsByTagName('*').length);
  return { drawnMs, longestTaskMs, heapMb, domNodes };
}

async function main(): Promise<void> {
  if (!requireChromium()) throw new Error('chromium is needed: apt-get install chromium');
  requireDist();
  const folder = mkdtempSync(join(tmpdir(), 'parley-bench-ui-'));
  const server = await startTestServer();
  const browser = await launchBrowser();
  try {
    const files: { name: string; path: string }[] = [
      { name: '1 MB', path: join(folder, 'steady-1mb.trace.jsonl') },
      { name: '10 MB', path: join(folder, 'steady-10mb.trace.jsonl') },
      { name: '45 MB', path: join(folder, 'steady-45mb.trace.jsonl') },
      { name: 'ramp', path: join(folder, 'pps-ramp.trace.jsonl') },
    ];
    // PARLEY_BENCH_UI_QUICK=1: the 1 MB capture and the ramp only (a quick look while developing).
    if (process.env.PARLEY_BENCH_UI_QUICK === '1') files.splice(1, 2);
    for (const file of files) {
      if (file.name === 'ramp') rampTrace(file.path);
      else steadyTrace(file.path, Number.parseInt(file.name, 10) * 1_000_000);
    }

    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, server.url, 'support');
    const ids: number[] = [];
    for (const file of files) {
      const buffer = readFileSync(file.path);
      const response = await page.request.post(`${server.url}/api/traces`, { multipart: { file: { name: file.path.split('/').pop()!, mimeType: 'application/x-ndjson', buffer } }, timeout: 300_000 });
      if (!response.ok()) throw new Error(`upload of ${file.name}: ${response.status()} ${await response.text()}`);
      const id = ((await response.json()) as { trace: { id: number } }).trace.id;
      for (;;) {
        // A busy server may drop a poll; the next one asks again.
        const detail = (await page.request
          .get(`${server.url}/api/traces/${id}`, { timeout: 60_000 })
          .then((r) => r.json())
          .catch(() => ({ trace: { status: 'unknown' } }))) as { trace: { status: string } };
        if (detail.trace.status === 'done') break;
        if (detail.trace.status === 'failed') throw new Error(`analysis of ${file.name} failed`);
        await new Promise((resolve) => setTimeout(resolve, 500));
      }
      ids.push(id);
      console.log(`${file.name}: ${(buffer.length / 1e6).toFixed(1)} MB uploaded and analysed (trace ${id})`);
    }
    const listed = (await (await page.request.get(`${server.url}/api/traces?pageSize=50`)).json()) as { items: { id: number; title: string }[] };
    const baselineId = listed.items.find((item) => item.title === 'K65 with Wren 14 on bench 2')!.id;
    await page.close();

    const measure = async (id: number): Promise<PageFigures> => {
      const tab = await browser.context.newPage();
      await tab.setViewportSize({ width: 1440, height: 900 });
      await installLongTaskObserver(tab);
      const figures = await openTracePage(tab, server.url, id);
      await tab.close();
      return figures;
    };
    // A warm-up open (the first loads the chunks into the cache), then each trace twice: the better run counts.
    await measure(baselineId);
    const best = async (id: number) => {
      const a = await measure(id);
      const b = await measure(id);
      return a.drawnMs <= b.drawnMs ? a : b;
    };
    const baseline = await best(baselineId);
    const results: { name: string; figures: PageFigures }[] = [];
    for (let index = 0; index < files.length; index++) results.push({ name: files[index]!.name, figures: await best(ids[index]!) });

    // The Bench: the K65 at 15 V 2 A, from the click on Run to the drawn timeline.
    const bench = await browser.context.newPage();
    await bench.setViewportSize({ width: 1440, height: 900 });
    await installLongTaskObserver(bench);
    await bench.goto(`${server.url}/bench`);
    await bench.getByLabel('Load offers from a demo device').selectOption({ label: 'Kestrel K65 travel adapter (65 W)' });
    await bench.evaluate(() => ((window as unknown as { __tasks: number[] }).__tasks.length = 0));
    const runStart = Date.now();
    await bench.getByRole('button', { name: 'Run', exact: true }).click();
    await bench.locator('[data-testid="vbus-chart"][data-drawn]').waitFor();
    const benchRunMs = Date.now() - runStart;
    const benchLongestMs = await longestTask(bench);
    await bench.close();

    const f = (n: number, digits = 0) => n.toFixed(digits).padStart(8);
    console.log('\nTrace page in headless Chromium, 1440×900 (best of two opens)');
    console.log(`${'trace'.padEnd(14)}${'drawn ms'.padStart(9)}${'× base'.padStart(8)}${'task ms'.padStart(9)}${'heap MB'.padStart(9)}${'DOM'.padStart(9)}`);
    console.log(`${'baseline demo'.padEnd(14)}${f(baseline.drawnMs)} ${f(1, 2)}${f(baseline.longestTaskMs)} ${f(baseline.heapMb, 1)} ${f(baseline.domNodes)}`);
    for (const r of results)
      console.log(`${r.name.padEnd(14)}${f(r.figures.drawnMs)} ${f(r.figures.drawnMs / baseline.drawnMs, 2)}${f(r.figures.longestTaskMs)} ${f(r.figures.heapMb, 1)} ${f(r.figures.domNodes)}`);
    const ramp = results.find((r) => r.name === 'ramp')!.figures;
    const met = ramp.drawnMs <= RAMP_TARGET_MS && ramp.longestTaskMs <= TASK_TARGET_MS && ramp.domNodes < DOM_TARGET;
    console.log(
      `\nRamp capture: drawn in ${ramp.drawnMs.toFixed(0)} ms (target ≤ ${RAMP_TARGET_MS}), longest task ${ramp.longestTaskMs.toFixed(0)} ms (≤ ${TASK_TARGET_MS}), ${ramp.domNodes} DOM nodes (< ${DOM_TARGET}): ${met ? 'met' : 'NOT met'}`,
    );
    console.log(`Longest task per page: trace page (demo) ${baseline.longestTaskMs.toFixed(0)} ms; Bench run ${benchLongestMs.toFixed(0)} ms (run to drawn timeline ${benchRunMs} ms)`);

    const growth = results.filter((r) => r.name !== 'ramp').map((r) => ({ size: r.name, value: Math.round(r.figures.drawnMs) }));
    const figures: BenchFigure[] = [
      {
        figure: 'trace page, programmable ramp (10,000 contracts): time to a drawn timeline',
        unit: 'ms',
        parley: Math.round(ramp.drawnMs),
        peer: Math.round(baseline.drawnMs),
        peerName: 'smallest demo trace page',
        target: `≤ ${RAMP_TARGET_MS} ms`,
        met: ramp.drawnMs <= RAMP_TARGET_MS,
      },
      {
        figure: 'trace page, programmable ramp: longest main-thread task',
        unit: 'ms',
        parley: Math.round(ramp.longestTaskMs),
        peer: Math.round(baseline.longestTaskMs),
        peerName: 'smallest demo trace page',
        target: `≤ ${TASK_TARGET_MS} ms`,
        met: ramp.longestTaskMs <= TASK_TARGET_MS,
      },
      {
        figure: 'trace page, programmable ramp: DOM nodes',
        unit: 'nodes',
        parley: ramp.domNodes,
        peer: baseline.domNodes,
        peerName: 'smallest demo trace page',
        target: `< ${DOM_TARGET}`,
        met: ramp.domNodes < DOM_TARGET,
      },
      {
        figure: 'trace page, steady capture (largest): time to a drawn timeline',
        unit: 'ms',
        parley: Math.round(results[results.length - 2]!.figures.drawnMs),
        peer: Math.round(baseline.drawnMs),
        peerName: 'smallest demo trace page',
        growth,
      },
      {
        figure: 'trace page, steady capture (largest): JS heap once drawn',
        unit: 'MB',
        parley: Number(results[results.length - 2]!.figures.heapMb.toFixed(1)),
        peer: Number(baseline.heapMb.toFixed(1)),
        peerName: 'smallest demo trace page',
        growth: results.filter((r) => r.name !== 'ramp').map((r) => ({ size: r.name, value: Number(r.figures.heapMb.toFixed(1)) })),
      },
      { figure: 'Bench run (K65, 15 V): longest main-thread task', unit: 'ms', parley: Math.round(benchLongestMs), peer: Math.round(baseline.longestTaskMs), peerName: 'smallest demo trace page' },
    ];
    report('ui', figures);
  } finally {
    await browser.close();
    await server.close();
    rmSync(folder, { recursive: true, force: true });
  }
}

await main();
