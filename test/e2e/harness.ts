/**
 * End-to-end harness: build the app once per test process into a private
 * folder, serve it on 127.0.0.1, drive Debian's Chromium with playwright-core.
 * Without Chromium the browser tests are skipped with a plain message, unless
 * SHIFTMARK_REQUIRE_BROWSER=1 (CI), where a missing browser is a failure.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = process.env.SHIFTMARK_CHROMIUM ?? '/usr/bin/chromium';
export const browserAvailable = existsSync(CHROMIUM_PATH);
export const browserRequired = process.env.SHIFTMARK_REQUIRE_BROWSER === '1';

if (!browserAvailable) {
  const msg = `browser tests: no Chromium at ${CHROMIUM_PATH}`;
  if (browserRequired) throw new Error(`${msg}, and SHIFTMARK_REQUIRE_BROWSER=1 makes that a failure`);
  console.warn(`${msg}; end-to-end tests SKIPPED. Install it (Debian: apt-get install chromium) or set SHIFTMARK_CHROMIUM to a Chromium binary to run them.`);
}

export const ROOT = resolve(fileURLToPath(new URL('../..', import.meta.url)));
export const ARTIFACTS = join(ROOT, 'test-artifacts');

/** Viewport of every page, CSS px (the review screen's layout is drawn for a laptop screen). */
export const VIEWPORT = { width: 1400, height: 900 };

/** A fresh temporary folder (user-data dirs, generated spectra); removed by `removeDir`. */
export function tempDir(prefix: string): string {
  return mkdtempSync(join(tmpdir(), `shiftmark-${prefix}-`));
}

export function removeDir(dir: string): void {
  rmSync(dir, { recursive: true, force: true, maxRetries: 3 });
}

let built: Promise<string> | null = null;
/**
 * Build the app once per test process into a private folder (so parallel
 * test files and other people's `npm run build` never overwrite each other),
 * and return that folder.
 */
export function buildApp(): Promise<string> {
  built ??= (async () => {
    const outDir = tempDir('dist');
    process.once('exit', () => removeDir(outDir));
    const { build } = await import('vite');
    await build({ root: ROOT, logLevel: 'warn', configFile: join(ROOT, 'vite.config.ts'), build: { outDir, emptyOutDir: true, sourcemap: false } });
    return outDir;
  })();
  return built;
}

/** Remove this process's build (call from afterAll; the exit hook is a fallback that test workers may skip). */
export async function releaseApp(): Promise<void> {
  if (!built) return;
  const dir = await built.catch(() => null);
  built = null;
  if (dir) removeDir(dir);
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript',
  '.mjs': 'text/javascript',
  '.css': 'text/css',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.map': 'application/json',
};

/** Serve a built app folder on 127.0.0.1 at a free port. */
export async function serveDist(dist: string): Promise<{ url: string; server: Server; close: () => Promise<void> }> {
  const root = resolve(dist);
  const server = createServer((req, res) => {
    const path = decodeURIComponent((req.url ?? '/').split('?')[0]);
    const file = normalize(join(root, path === '/' ? 'index.html' : path));
    if (!(file === root || file.startsWith(root + sep)) || !existsSync(file) || !statSync(file).isFile()) {
      res.statusCode = 404;
      res.end('not found');
      return;
    }
    res.setHeader('Content-Type', TYPES[extname(file)] ?? 'application/octet-stream');
    res.setHeader('Cache-Control', 'no-store');
    res.end(readFileSync(file));
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  const close = () =>
    new Promise<void>((r) => {
      server.closeAllConnections();
      server.close(() => r());
    });
  return { url: `http://127.0.0.1:${port}/`, server, close };
}

/** Chromium switches for every launch: headless, no GPU, nothing that calls home. */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--no-default-browser-check',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
];

/**
 * Page functions passed to page.evaluate are serialised. When this code runs
 * under tsx (the benchmark), esbuild's keepNames wraps named inner functions
 * in a `__name` helper that the page lacks (and the page's CSP forbids string
 * eval as a way round it). This identity stand-in, injected before the app,
 * lets such functions run; the app never uses the name.
 */
const PAGE_FUNCTION_SHIM = 'globalThis.__name ??= (target) => target;';

export async function launchBrowser(userDataDir?: string): Promise<{ browser?: Browser; context: BrowserContext }> {
  let browser: Browser | undefined;
  let context: BrowserContext;
  if (userDataDir) {
    context = await chromium.launchPersistentContext(userDataDir, { executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS, headless: true, acceptDownloads: true, viewport: VIEWPORT });
  } else {
    browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS, headless: true });
    context = await browser.newContext({ acceptDownloads: true, viewport: VIEWPORT });
  }
  await context.addInitScript({ content: PAGE_FUNCTION_SHIM });
  return { browser, context };
}

/** A Chromium process we started ourselves, so that we know its pid and can kill it hard. */
export interface OwnChromium {
  pid: number;
  process: ChildProcess;
  browser: Browser;
  context: BrowserContext;
  /** SIGKILL the browser process (no shutdown, no flush), then its helpers; resolves when it is gone. */
  killHard: () => Promise<void>;
  /** Orderly close. */
  close: () => Promise<void>;
}

/**
 * Start /usr/bin/chromium on a user-data dir with a DevTools port chosen by
 * the browser, read the port from DevToolsActivePort and connect over CDP.
 * Debian's launcher script execs the real binary, so the child's pid is the
 * browser process. It runs in its own process group, so its helper processes
 * (renderers, GPU, network service) can be cleaned up after a hard kill.
 */
export async function spawnChromium(userDataDir: string, timeoutMs = 30_000): Promise<OwnChromium> {
  const portFile = join(userDataDir, 'DevToolsActivePort');
  rmSync(portFile, { force: true });
  const child = spawn(CHROMIUM_PATH, [...CHROMIUM_ARGS, '--remote-debugging-port=0', `--user-data-dir=${userDataDir}`, `--window-size=${VIEWPORT.width},${VIEWPORT.height}`, 'about:blank'], {
    detached: true,
    stdio: 'ignore',
  });
  const exited = new Promise<void>((r) => child.once('exit', () => r()));
  const pid = child.pid;
  if (!pid) throw new Error('chromium did not start');
  const t0 = Date.now();
  let port = 0;
  while (!port) {
    if (child.exitCode !== null) throw new Error(`chromium exited with code ${child.exitCode} before it opened DevTools`);
    if (Date.now() - t0 > timeoutMs) {
      killGroup(pid);
      throw new Error('chromium did not write DevToolsActivePort in time');
    }
    if (existsSync(portFile)) {
      const first = readFileSync(portFile, 'utf8').split('\n')[0];
      port = Number(first) || 0;
    }
    if (!port) await sleep(50);
  }
  // isLocal: same machine, so setInputFiles passes paths instead of copying the files (and their 50 MB limit).
  const browser = await chromium.connectOverCDP(`http://127.0.0.1:${port}`, { isLocal: true });
  const context = browser.contexts()[0];
  await context.addInitScript({ content: PAGE_FUNCTION_SHIM });
  const killHard = async () => {
    process.kill(pid, 'SIGKILL');
    await exited;
    killGroup(pid);
  };
  const close = async () => {
    await browser.close().catch(() => undefined);
    const done = await Promise.race([exited.then(() => true), sleep(5000).then(() => false)]);
    if (!done) process.kill(pid, 'SIGKILL');
    killGroup(pid);
  };
  return { pid, process: child, browser, context, killHard, close };
}

/** SIGKILL what is left of a process group we started (helpers of a killed browser). */
function killGroup(pid: number): void {
  try {
    process.kill(-pid, 'SIGKILL');
  } catch {
    /* already gone */
  }
}

export function sleep(ms: number): Promise<void> {
  return new Promise((r) => setTimeout(r, ms));
}

/** True for a URL that stays on this machine (the test server, blobs, data URLs). */
export function isLocalUrl(url: string): boolean {
  const u = new URL(url);
  return u.protocol === 'blob:' || u.protocol === 'data:' || u.protocol === 'about:' || u.hostname === '127.0.0.1' || u.hostname === 'localhost';
}

/**
 * Record every request that leaves localhost; the app must make none. On a
 * context the watch also covers pages opened later and their workers.
 */
export function watchRequests(target: Page | BrowserContext): string[] {
  const outside: string[] = [];
  target.on('request', (req) => {
    if (!isLocalUrl(req.url())) outside.push(req.url());
  });
  return outside;
}

export function artifactPath(name: string): string {
  mkdirSync(ARTIFACTS, { recursive: true });
  return join(ARTIFACTS, name);
}

/**
 * Wait until a fitting run has finished: nothing waiting and at least
 * `expected` files done or failed. (The counts belong to the current run; a
 * reload that finds everything fitted shows no progress bar at all.)
 */
export async function waitForFitting(page: Page, expected: number, timeoutMs = 120_000): Promise<void> {
  await page.waitForFunction(
    (n) => {
      const text = ['count-waiting', 'count-done', 'count-failed'].map((id) => document.querySelector(`[data-testid="${id}"]`)?.textContent ?? 'NaN');
      const [waiting, done, failed] = text.map((t) => Number.parseInt(t, 10));
      return waiting === 0 && done + failed >= n;
    },
    expected,
    { timeout: timeoutMs, polling: 100 },
  );
}

/** The counts shown in the progress bar: done, failed, waiting. */
export async function progressCounts(page: Page): Promise<{ done: number; failed: number; waiting: number }> {
  const n = async (id: string) => Number.parseInt((await page.getByTestId(id).textContent()) ?? 'NaN', 10);
  return { done: await n('count-done'), failed: await n('count-failed'), waiting: await n('count-waiting') };
}

/** The page's Content-Security-Policy meta tag, or null. */
export function cspOf(page: Page): Promise<string | null> {
  return page.evaluate(() => document.querySelector('meta[http-equiv="Content-Security-Policy"]')?.getAttribute('content') ?? null);
}

/** The review panel's title (the spectrum shown). */
export const reviewTitle = (page: Page) => page.getByTestId('review-title').textContent();

/** Wait until the review panel shows another spectrum than `before`, with its solution. */
export async function waitForNewTitle(page: Page, before: string | null): Promise<string> {
  await page.waitForFunction((b) => {
    const t = document.querySelector('[data-testid="review-title"]')?.textContent;
    // The stored fit has arrived once the candidates are listed (keys 1-9 act on them).
    return !!t && t !== b && !!document.querySelector('[data-testid="solution-z"]') && !!document.querySelector('[data-testid="candidate-row"]');
  }, before);
  return (await reviewTitle(page))!;
}
