/**
 * End-to-end harness: build the app once, serve dist/ on 127.0.0.1, drive
 * Debian's Chromium with playwright-core. Without Chromium the browser tests
 * are skipped with a plain message, unless SHIFTMARK_REQUIRE_BROWSER=1 (CI),
 * where a missing browser is a failure.
 */
import { existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { extname, join, normalize, resolve } from 'node:path';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = process.env.SHIFTMARK_CHROMIUM ?? '/usr/bin/chromium';
export const browserAvailable = existsSync(CHROMIUM_PATH);
export const browserRequired = process.env.SHIFTMARK_REQUIRE_BROWSER === '1';

if (!browserAvailable) {
  const msg = `browser tests: no Chromium at ${CHROMIUM_PATH}`;
  if (browserRequired) throw new Error(`${msg}, and SHIFTMARK_REQUIRE_BROWSER=1 makes that a failure`);
  console.warn(`${msg}; end-to-end tests SKIPPED. Install it (Debian: apt-get install chromium) or set SHIFTMARK_CHROMIUM to a Chromium binary to run them.`);
}

export const ROOT = resolve(__dirname, '../..');
export const ARTIFACTS = join(ROOT, 'test-artifacts');
const DIST = join(ROOT, 'dist');

let built: Promise<void> | null = null;
/** Build the app once per test process. */
export function buildApp(): Promise<void> {
  built ??= (async () => {
    const { build } = await import('vite');
    await build({ root: ROOT, logLevel: 'warn', configFile: join(ROOT, 'vite.config.ts') });
  })();
  return built;
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

/** Serve dist/ on 127.0.0.1 at a free port. */
export async function serveDist(): Promise<{ url: string; server: Server }> {
  const server = createServer((req, res) => {
    const path = decodeURIComponent((req.url ?? '/').split('?')[0]);
    const file = normalize(join(DIST, path === '/' ? 'index.html' : path));
    if (!file.startsWith(DIST) || !existsSync(file) || !statSync(file).isFile()) {
      res.statusCode = 404;
      res.end('not found');
      return;
    }
    res.setHeader('Content-Type', TYPES[extname(file)] ?? 'application/octet-stream');
    res.end(readFileSync(file));
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}/`, server };
}

export async function launchBrowser(userDataDir?: string): Promise<{ browser?: Browser; context: BrowserContext }> {
  const args = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];
  if (userDataDir) {
    const context = await chromium.launchPersistentContext(userDataDir, { executablePath: CHROMIUM_PATH, args, headless: true, acceptDownloads: true, viewport: { width: 1400, height: 900 } });
    return { context };
  }
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args, headless: true });
  const context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1400, height: 900 } });
  return { browser, context };
}

/** Record every request that leaves localhost; the app must make none. */
export function watchRequests(page: Page): string[] {
  const outside: string[] = [];
  page.on('request', (req) => {
    const u = new URL(req.url());
    const local = u.protocol === 'blob:' || u.protocol === 'data:' || u.hostname === '127.0.0.1' || u.hostname === 'localhost';
    if (!local) outside.push(req.url());
  });
  return outside;
}

export function artifactPath(name: string): string {
  mkdirSync(ARTIFACTS, { recursive: true });
  return join(ARTIFACTS, name);
}
