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
import { mkdtempSync, rmSync, readFileSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { rampTrace, steadyTrace } from './ui-traces.ts';
import { launchBrowser, requireDist, signIn, startTestServer, requireChromium } from '../tests/browser/support.ts';
import { report, type BenchFigure } from './report.ts';

const RAMP_TARGET_MS = 1_500;
const TASK_TARGET_MS = 100;
const DOM_TARGET = 10_000;

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

/** The 1, 5 and 15 minute load averages: the figures mean little on a machine that is busy with other work. */
const loadAverage = () =>
  loadavg()
    .map((value) => value.toFixed(2))
    .join(', ');

async function main(): Promise<void> {
  const loadBefore = loadAverage();
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
    console.log(`\nload average (1, 5, 15 min) at the start ${loadBefore}, at the end ${loadAverage()}; ${availableParallelism()} cores`);
    console.log('Trace page in headless Chromium, 1440×900 (best of two opens)');
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
