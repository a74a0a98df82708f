/**
 * Browser-test harness: Debian's chromium driven by playwright-core against the real server
 * (startServer on a temp data dir, demo data) serving the built client from dist/.
 * Nothing may leave the machine: the host-resolver rules make every other name unresolvable,
 * and watchPage() fails a test on any request to a non-local host.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll } from 'vitest';
import type { Role } from '../../src/lib/roles.ts';

export const chromiumPath = '/usr/bin/chromium';
export const installHint = 'install with: apt-get install chromium';
const repoRoot = resolve(fileURLToPath(new URL('../..', import.meta.url)));
export const distDir = join(repoRoot, 'dist');
export const screenshotDir = join(repoRoot, 'tmp', 'screenshots');

/**
 * True when chromium is installed. Missing: under CI=true this throws (the run must not pass
 * without its browser tests); elsewhere it prints the install command and the suite skips.
 */
export function requireChromium(): boolean {
  if (existsSync(chromiumPath)) return true;
  const message = `chromium not found at ${chromiumPath}: ${installHint}`;
  if (process.env.CI === 'true') throw new Error(message);
  console.warn(`[browser tests skipped] ${message}`);
  return false;
}

/** The tests run against the production build; `npm test` builds it first. */
export function requireDist(): void {
  if (!existsSync(join(distDir, 'index.html'))) {
    throw new Error(`no built client in ${distDir}: run \`npx vite build\` first (npm test does)`);
  }
}

// Flags that keep headless Chromium offline and quiet; the resolver rule proves nothing leaves the machine.
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost',
];

export type TestBrowser = { context: BrowserContext; close(): Promise<void> };

/** Chromium with a fresh profile in a temp folder (removed again by close()). */
export async function launchBrowser(options: { colorScheme?: 'light' | 'dark' } = {}): Promise<TestBrowser> {
  const profileDir = await mkdtemp(join(tmpdir(), 'parley-chromium-'));
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: chromiumPath,
    headless: true,
    args: chromiumArgs,
    colorScheme: options.colorScheme ?? 'light',
    viewport: { width: 1360, height: 900 },
    locale: 'en-GB',
    timezoneId: 'UTC',
  });
  // CSP violations surface as console errors that watchPage() picks up.
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      console.error(`CSP violation: ${event.violatedDirective} blocked ${event.blockedURI || 'inline'}`);
    });
  });
  return {
    context,
    async close() {
      await context.close();
      await rm(profileDir, { recursive: true, force: true });
    },
  };
}

export type TestServer = { url: string; close(): Promise<void> };

/** The real server on a random port with a temp data dir and the demo organisation. */
export async function startTestServer(): Promise<TestServer> {
  const { startServer } = await import('../../server/start.ts');
  const dataDir = await mkdtemp(join(tmpdir(), 'parley-data-'));
  const server = await startServer({ port: 0, dataDir, demo: true, log: false, distDir });
  return {
    url: server.url,
    async close() {
      await server.close();
      await rm(dataDir, { recursive: true, force: true });
    },
  };
}

export type BrowserSuite = {
  /** The server's base URL, e.g. http://127.0.0.1:41234. */
  readonly url: string;
  readonly server: TestServer;
  readonly browser: TestBrowser;
  /** The browser's one context (a fresh profile): open extra pages here, clear cookies, … */
  readonly context: BrowserContext;
  /** A new page with watchPage() attached, at `width`×`height` when given; closed after the test. */
  newPage(viewport?: { width: number; height: number }): Promise<{ page: Page; watch: PageWatch }>;
};

export type BrowserSuiteOptions = {
  colorScheme?: 'light' | 'dark';
  /** For the server and browser to start; default 60 s (a cold tsx start on a busy machine). */
  startTimeoutMs?: number;
};

/**
 * The set-up every browser suite shares, for use inside `describe`: before all tests the real
 * server (demo data) and chromium start; after each test the pages from `newPage()` close and the
 * cookies are cleared (each test signs in as its own role); after all, browser and server stop.
 */
export function useBrowserSuite(options: BrowserSuiteOptions = {}): BrowserSuite {
  let server: TestServer | undefined;
  let browser: TestBrowser | undefined;
  const pages: Page[] = [];
  const started = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('the browser suite has not started: call useBrowserSuite() inside describe() and use it inside tests');
    return value;
  };
  const closePages = async () => {
    for (const page of pages.splice(0)) await page.close().catch(() => undefined);
  };

  beforeAll(async () => {
    requireDist();
    server = await startTestServer();
    browser = await launchBrowser({ colorScheme: options.colorScheme });
  }, options.startTimeoutMs ?? 60_000);

  afterEach(async () => {
    await closePages();
    await browser?.context.clearCookies();
  });

  afterAll(async () => {
    await closePages();
    await browser?.close();
    await server?.close();
  });

  return {
    get url() {
      return started(server).url;
    },
    get server() {
      return started(server);
    },
    get browser() {
      return started(browser);
    },
    get context() {
      return started(browser).context;
    },
    async newPage(viewport) {
      const page = await started(browser).context.newPage();
      pages.push(page);
      if (viewport) await page.setViewportSize(viewport);
      return { page, watch: watchPage(page) };
    },
  };
}

export const demoPassword = 'parley-demo';
export const demoAccounts: Record<Role, string> = {
  admin: 'admin@kestrel.example',
  engineer: 'engineer@kestrel.example',
  qa: 'qa@kestrel.example',
  support: 'support@kestrel.example',
  viewer: 'viewer@kestrel.example',
};

/** Signs in through the form and waits for Home. */
export async function signIn(page: Page, baseUrl: string, role: Role): Promise<void> {
  await signInAs(page, baseUrl, demoAccounts[role], demoPassword);
}

export async function signInAs(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1, name: /^Welcome,/ }).waitFor();
}

function isLocalUrl(raw: string): boolean {
  if (/^(data|blob|about):/.test(raw)) return true;
  try {
    const { hostname } = new URL(raw);
    return hostname === 'localhost' || hostname === '127.0.0.1' || hostname === '[::1]';
  } catch {
    return false;
  }
}

export type PageWatch = {
  consoleErrors: string[];
  failedRequests: string[];
  nonLocalRequests: string[];
  cspViolations: string[];
  /** Throws listing every problem seen; `allow` patterns excuse expected console errors. */
  assertClean(options?: { allow?: RegExp[] }): void;
};

// Chromium logs every 4xx/5xx response as a console error; those are judged by status instead.
const statusNoise = /^Failed to load resource: the server responded with a status of 4\d\d/;

/** Records console errors, page errors, failed and non-local requests and CSP violations. */
export function watchPage(page: Page): PageWatch {
  const watch: PageWatch = {
    consoleErrors: [],
    failedRequests: [],
    nonLocalRequests: [],
    cspViolations: [],
    assertClean({ allow = [] } = {}) {
      const consoleErrors = watch.consoleErrors.filter((text) => !allow.some((pattern) => pattern.test(text)));
      const problems = [
        ...watch.cspViolations.map((text) => `CSP: ${text}`),
        ...watch.nonLocalRequests.map((text) => `non-local request: ${text}`),
        ...watch.failedRequests.map((text) => `failed request: ${text}`),
        ...consoleErrors.map((text) => `console: ${text}`),
      ];
      if (problems.length > 0) throw new Error(`The page was not clean:\n${problems.join('\n')}`);
    },
  };
  page.on('console', (message) => {
    if (message.type() !== 'error') return;
    const text = message.text();
    if (/Content Security Policy|CSP violation/i.test(text)) watch.cspViolations.push(text);
    else if (!statusNoise.test(text)) watch.consoleErrors.push(text);
  });
  page.on('pageerror', (error) => watch.consoleErrors.push(`uncaught: ${error.message}`));
  page.on('request', (request) => {
    if (!isLocalUrl(request.url())) watch.nonLocalRequests.push(request.url());
  });
  page.on('requestfailed', (request) => {
    const reason = request.failure()?.errorText ?? 'failed';
    // Fetches cancelled on navigation (and query cancellation) are not failures.
    if (reason === 'net::ERR_ABORTED') return;
    watch.failedRequests.push(`${request.method()} ${request.url()} (${reason})`);
  });
  page.on('response', (response) => {
    if (response.status() >= 500) watch.failedRequests.push(`${response.request().method()} ${response.url()} → ${response.status()}`);
  });
  return watch;
}

export type LongTaskWatch = {
  /** Forgets the tasks seen so far (and observes again if the page loaded a new document). */
  reset(): Promise<void>;
  /** Every long task's duration (ms) since the watch began or was reset, once delivered. */
  tasks(): Promise<number[]>;
  /** The longest of them (0 when there was none). */
  longest(): Promise<number>;
  /** Those longer than `ms`. */
  over(ms: number): Promise<number[]>;
};

/**
 * Main-thread long tasks (over 50 ms, the browser's own threshold) in the page's document from
 * now on, through a PerformanceObserver of `longtask` entries.
 */
export async function watchLongTasks(page: Page): Promise<LongTaskWatch> {
  const reset = () =>
    page.evaluate(() => {
      const holder = window as unknown as { __parleyLongTasks?: number[] };
      if (holder.__parleyLongTasks) {
        holder.__parleyLongTasks.length = 0;
        return;
      }
      const seen: number[] = [];
      holder.__parleyLongTasks = seen;
      new PerformanceObserver((list) => {
        for (const entry of list.getEntries()) seen.push(Math.round(entry.duration));
      }).observe({ type: 'longtask' });
    });
  // Entries are queued after the task ends and handed over when the page is idle: wait two frames
  // and an idle callback before reading them.
  const tasks = () =>
    page.evaluate(async () => {
      await new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve)));
      await new Promise((resolve) => requestIdleCallback(resolve, { timeout: 1_000 }));
      const seen = (window as unknown as { __parleyLongTasks?: number[] }).__parleyLongTasks;
      if (!seen) throw new Error('watchLongTasks: the page loaded a new document since the watch began; call reset() after navigating');
      return seen.slice();
    });
  await reset();
  return {
    reset,
    tasks,
    longest: async () => Math.max(0, ...(await tasks())),
    over: async (ms) => (await tasks()).filter((duration) => duration > ms),
  };
}

/** Saves a full-page screenshot to tmp/screenshots/<name>.png (git-ignored) for a human look. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshotDir, { recursive: true });
  const path = join(screenshotDir, `${name}.png`);
  // animations: 'disabled' finishes colour transitions, so a scheme switch is not caught halfway.
  await page.screenshot({ path, fullPage: true, animations: 'disabled' });
  return path;
}
