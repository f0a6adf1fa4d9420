/**
 * Browser benchmark (printed, never asserted), in Debian's Chromium driven by
 * playwright-core against the built app on 127.0.0.1:
 *   a. read and fit 1,000 simulated spectra (FITS, ~4,600 pixels, 3600-10400 A
 *      at 1e-4 in log10) picked through the file input        target <= 10 s
 *   b. switch spectrum (j) in that batch, median of 50          target <= 100 ms
 *   c. frame time while panning a 20,000-pixel spectrum          target <= 16 ms
 *   d. 5,000 spectra held: intake time, JS heap and renderer memory, list scroll
 * Timings are taken inside the page (performance.now, requestAnimationFrame
 * time stamps); memory from the DevTools protocol and /proc.
 *
 *   npx tsx scripts/bench-browser.ts [--fit 1000] [--held 5000] [--skip-held]
 */
import { defaultPoolSize } from '../src/worker/pool';
import { readFileSync, readdirSync, writeFileSync, mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { CDPSession, Page } from 'playwright-core';
import { batchParams, createRng, mixSeed, simulateSpectrum, DEFAULT_GRID, type GridSpec } from '../src/core/sim';
import { writeFitsFile, writeImageHdu } from '../src/core/io/fits/write';
import { artifactPath, browserAvailable, buildApp, releaseApp, removeDir, serveDist, spawnChromium, tempDir, waitForFitting, type OwnChromium } from '../test/e2e/harness';

/** Grid of the fitting benchmark: 3600-10400 A, 1e-4 in log10 per pixel (4,607 pixels). */
const FIT_GRID: GridSpec = { kind: 'log10', startA: 3600, endA: 10400, dLog10: 1e-4 };
/** Pixels of the long spectrum panned in (c). */
const LONG_PIXELS = 20_000;
const SEED = 4242;

type Log = (s: string) => void;

// ---- inputs ---------------------------------------------------------------------

/** One simulated spectrum as a FITS image (flux, then IVAR), with a log-linear WCS (Greisen et al. 2006, -LOG). */
function fitsBytes(i: number, grid: GridSpec, idPrefix: string): { name: string; bytes: Uint8Array } {
  // Same objects as simulateBatch(n, SEED) without simulating 0..i-1 each time.
  const p = batchParams(i, SEED, { grid, idPrefix });
  const s = simulateSpectrum(p, createRng(mixSeed(SEED, 0x51d + i))).spectrum;
  const w = s.wavelengthA;
  const dLog10 = Math.log10(w[w.length - 1] / w[0]) / (w.length - 1);
  const bytes = writeFitsFile([
    writeImageHdu({
      data: Float32Array.from(s.flux),
      primary: true,
      cards: [
        ['CTYPE1', 'WAVE-LOG'],
        ['CUNIT1', 'Angstrom'],
        ['CRPIX1', 1],
        ['CRVAL1', w[0]],
        ['CDELT1', w[0] * Math.LN10 * dLog10],
        ['OBJECT', p.objectId!],
        ['BUNIT', '1e-17 erg/s/cm2/A'],
        ['COMMENT', 'Synthetic spectrum from the Shiftmark simulator: not a real observation.'],
      ],
    }),
    writeImageHdu({ data: Float32Array.from(s.ivar ?? new Float64Array(s.flux.length)), extname: 'IVAR', primary: false }),
  ]);
  return { name: `${p.objectId}.fits`, bytes };
}

function writeBatch(dir: string, n: number, grid: GridSpec, idPrefix: string): { paths: string[]; mb: number } {
  mkdirSync(dir, { recursive: true });
  const paths: string[] = [];
  let bytes = 0;
  for (let i = 0; i < n; i++) {
    const f = fitsBytes(i, grid, idPrefix);
    const path = join(dir, f.name);
    writeFileSync(path, f.bytes);
    paths.push(path);
    bytes += f.bytes.length;
  }
  return { paths, mb: bytes / 1e6 };
}

// ---- measuring ------------------------------------------------------------------

function quantile(xs: readonly number[], q: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const pos = (s.length - 1) * q;
  const lo = Math.floor(pos);
  const hi = Math.ceil(pos);
  return s[lo] + (s[hi] - s[lo]) * (pos - lo);
}

/** JS heap of the page (main thread) in MB, from CDP Performance.getMetrics. */
async function jsHeapMb(cdp: CDPSession): Promise<number> {
  const { metrics } = await cdp.send('Performance.getMetrics');
  const used = metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? NaN;
  return used / 1e6;
}

/**
 * Memory of the renderer processes (page and its workers) of a browser we
 * started, MB: proportional set size (Linux smaps_rollup), so pages shared
 * between processes are counted once.
 */
function rendererRssMb(browserPid: number): number {
  let kb = 0;
  for (const d of readdirSync('/proc')) {
    if (!/^\d+$/.test(d)) continue;
    try {
      const stat = readFileSync(`/proc/${d}/stat`, 'utf8');
      const pgid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[2]);
      if (pgid !== browserPid) continue;
      if (!readFileSync(`/proc/${d}/cmdline`, 'utf8').includes('--type=renderer')) continue;
      const m = /^Pss:\s+(\d+)/m.exec(readFileSync(`/proc/${d}/smaps_rollup`, 'utf8'));
      if (m) kb += Number(m[1]);
    } catch {
      /* the process ended while we looked */
    }
  }
  return kb / 1024;
}

/** Sample heap and renderer memory every `everyMs` until stopped; returns the peaks. */
function sampleMemory(cdp: CDPSession, browserPid: number, everyMs = 1000) {
  let peakHeap = 0;
  let peakRss = 0;
  let busy = false;
  const tick = async () => {
    if (busy) return;
    busy = true;
    try {
      peakHeap = Math.max(peakHeap, await jsHeapMb(cdp));
    } catch {
      /* page busy or navigating */
    }
    peakRss = Math.max(peakRss, rendererRssMb(browserPid));
    busy = false;
  };
  const timer = setInterval(() => void tick(), everyMs);
  return {
    stop: async () => {
      clearInterval(timer);
      await tick();
      return { peakHeapMb: peakHeap, peakRendererMb: peakRss };
    },
  };
}

interface IntakeTiming {
  /** From the file input's change event to the list holding every file, s. */
  listedS: number;
  /** From the change event to nothing waiting, s. */
  fittedS: number;
}

/** Pick files through the file input and time, in the page, until every one is fitted or failed. */
async function timeIntake(page: Page, paths: string[], timeoutMs: number): Promise<IntakeTiming> {
  await page.evaluate((n) => {
    const w = window as unknown as { __intake: { t0: number; listed: number; done: number } };
    w.__intake = { t0: NaN, listed: NaN, done: NaN };
    document.addEventListener('change', () => (w.__intake.t0 = performance.now()), { capture: true, once: true });
    const count = (id: string) => Number.parseInt(document.querySelector(`[data-testid="${id}"]`)?.textContent ?? 'NaN', 10);
    const obs = new MutationObserver(() => {
      const waiting = count('count-waiting');
      const finished = count('count-done') + count('count-failed');
      if (Number.isNaN(w.__intake.listed) && waiting + finished >= n) w.__intake.listed = performance.now();
      if (waiting === 0 && finished >= n) {
        w.__intake.done = performance.now();
        obs.disconnect();
      }
    });
    obs.observe(document.body, { subtree: true, childList: true, characterData: true });
  }, paths.length);
  await page.getByTestId('file-input').setInputFiles(paths, { timeout: timeoutMs });
  await waitForFitting(page, paths.length, timeoutMs);
  await page.waitForFunction(() => !Number.isNaN((window as unknown as { __intake: { done: number } }).__intake.done));
  const t = await page.evaluate(() => (window as unknown as { __intake: { t0: number; listed: number; done: number } }).__intake);
  return { listedS: (t.listed - t.t0) / 1000, fittedS: (t.done - t.t0) / 1000 };
}

/**
 * Press j and time, in the page, from the key event to (1) the new title and
 * (2) the new spectrum drawn (the plot controller marks its SVG with the view
 * after each redraw) with its candidates listed.
 */
async function timeSwitches(page: Page, count: number): Promise<{ titleMs: number[]; drawnMs: number[] }> {
  const titleMs: number[] = [];
  const drawnMs: number[] = [];
  for (let i = 0; i < count; i++) {
    await page.evaluate(() => {
      const w = window as unknown as { __sw: { t0: number; title: number; drawn: number } };
      const before = document.querySelector('[data-testid="review-title"]')?.textContent;
      w.__sw = { t0: NaN, title: NaN, drawn: NaN };
      window.addEventListener('keydown', (e) => (w.__sw.t0 = e.timeStamp), { capture: true, once: true });
      const obs = new MutationObserver(() => {
        const t = document.querySelector('[data-testid="review-title"]')?.textContent;
        if (t === before) return;
        if (Number.isNaN(w.__sw.title)) w.__sw.title = performance.now();
        if (document.querySelector('.plot-box svg[data-view-a]') && document.querySelector('[data-testid="candidate-row"]')) {
          w.__sw.drawn = performance.now();
          obs.disconnect();
        }
      });
      obs.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true, attributeFilter: ['data-view-a'] });
    });
    await page.keyboard.press('j');
    await page.waitForFunction(() => !Number.isNaN((window as unknown as { __sw: { drawn: number } }).__sw.drawn), undefined, { timeout: 30_000 });
    const t = await page.evaluate(() => (window as unknown as { __sw: { t0: number; title: number; drawn: number } }).__sw);
    titleMs.push(t.title - t.t0);
    drawnMs.push(t.drawn - t.t0);
  }
  return { titleMs, drawnMs };
}

interface FrameStats {
  /** requestAnimationFrame intervals, ms (16.7 at 60 Hz when every frame is on time). */
  intervalMs: number[];
  /** Main-thread work per step, ms: the input handler plus the redraw it scheduled. */
  workMs: number[];
}

/**
 * Run `frames` animation frames; in each, one input step (a drag move, a key,
 * a scroll). The step's handler time plus the time the page's own frame
 * callbacks took before ours in the next frame is the work of that step.
 */
async function measureFrames(page: Page, kind: 'drag' | 'keys' | 'scroll', frames: number): Promise<FrameStats> {
  return page.evaluate(
    ({ kind, frames }) =>
      new Promise<FrameStats>((done) => {
        const svg = document.querySelector<SVGSVGElement>('.plot-box svg[tabindex]');
        const list = document.querySelector<HTMLElement>('[data-testid="spectrum-list-body"]');
        const box = svg?.getBoundingClientRect();
        const y = box ? box.top + box.height / 2 : 0;
        let x = box ? box.left + box.width / 2 : 0;
        const intervalMs: number[] = [];
        const workMs: number[] = [];
        let handlerMs = 0;
        let last = NaN;
        let i = 0;
        const mouse = (type: string, target: EventTarget) =>
          target.dispatchEvent(new MouseEvent(type, { bubbles: true, cancelable: true, view: window, clientX: x, clientY: y, button: 0, buttons: type === 'mouseup' ? 0 : 1 }));
        if (kind === 'drag' && svg) mouse('mousedown', svg);
        const step = (ts: number) => {
          if (!Number.isNaN(last)) {
            intervalMs.push(ts - last);
            workMs.push(handlerMs + (performance.now() - ts));
          }
          last = ts;
          if (i >= frames) {
            if (kind === 'drag' && svg) mouse('mouseup', window);
            done({ intervalMs, workMs });
            return;
          }
          // Back and forth, so the view never sticks at an end.
          const dir = Math.floor(i / 40) % 2 === 0 ? -1 : 1;
          const t0 = performance.now();
          if (kind === 'drag') {
            x += 6 * dir;
            mouse('mousemove', window);
          } else if (kind === 'keys' && svg) {
            svg.dispatchEvent(new KeyboardEvent('keydown', { key: dir < 0 ? 'ArrowRight' : 'ArrowLeft', bubbles: true, cancelable: true }));
          } else if (kind === 'scroll' && list) {
            list.scrollTop += 5 * 26 * -dir;
          }
          handlerMs = performance.now() - t0;
          i++;
          requestAnimationFrame(step);
        };
        requestAnimationFrame(step);
      }),
    { kind, frames },
  );
}

const fmt = (x: number, d = 1) => (Number.isFinite(x) ? x.toFixed(d) : '—');

// ---- the benchmark --------------------------------------------------------------

export interface BrowserBenchOptions {
  /** Spectra read and fitted in (a) and switched through in (b). */
  nFit?: number;
  /** Spectra held in (d); 0 skips it. */
  nHeld?: number;
  log?: Log;
}

export async function benchBrowser(options: BrowserBenchOptions = {}): Promise<void> {
  const log = options.log ?? console.log;
  if (!browserAvailable) throw new Error('no Chromium (set SHIFTMARK_CHROMIUM or install chromium)');
  const nFit = options.nFit ?? 1000;
  const nHeld = options.nHeld ?? 5000;
  const rows: [string, string, string][] = [];
  const tmp = tempDir('bench-browser');
  const dist = await buildApp();
  const server = await serveDist(dist);
  let chrome: OwnChromium | null = null;

  /** A fresh browser profile and page (each part starts from an empty session). */
  const open = async (name: string) => {
    if (chrome) await chrome.close();
    chrome = await spawnChromium(join(tmp, `profile-${name}`));
    const page = chrome.context.pages()[0] ?? (await chrome.context.newPage());
    page.setDefaultTimeout(120_000);
    await page.goto(server.url);
    await page.getByTestId('file-input').waitFor({ state: 'attached' });
    const cdp = await chrome.context.newCDPSession(page);
    await cdp.send('Performance.enable');
    return { page, cdp, pid: chrome.pid };
  };

  try {
    // (a) read and fit nFit spectra, (b) switch spectrum in that batch.
    log(`(a) writing ${nFit} simulated spectra (FITS, 3600-10400 Å, 1e-4 in log10)...`);
    const a = writeBatch(join(tmp, 'fit'), nFit, FIT_GRID, 'BENCH');
    {
      const { page, cdp, pid } = await open('fit');
      const cores = await page.evaluate(() => navigator.hardwareConcurrency);
      log(`    Chromium with ${defaultPoolSize(cores)} fit worker(s) in the page's pool (${cores} cores; see defaultPoolSize)`);
      const mem = sampleMemory(cdp, pid);
      const t = await timeIntake(page, a.paths, 900_000);
      const peaks = await mem.stop();
      log(`    ${nFit} files (${fmt(a.mb)} MB): listed after ${fmt(t.listedS, 2)} s, all fitted after ${fmt(t.fittedS, 2)} s`);
      rows.push([`(a) read + fit ${nFit} spectra`, `${fmt(t.fittedS, 1)} s (${fmt(nFit / t.fittedS, 0)} spectra/s; listed in ${fmt(t.listedS, 1)} s)`, '<= 10 s']);
      rows.push([`    peak JS heap / renderer memory`, `${fmt(peaks.peakHeapMb, 0)} MB / ${fmt(peaks.peakRendererMb, 0)} MB`, '']);

      log(`(b) switching spectrum with j, ${Math.min(50, nFit - 4)} times...`);
      await page.getByTestId('candidate-row').first().waitFor();
      await timeSwitches(page, 3); // warm-up: first worker messages, first canvas
      const sw = await timeSwitches(page, Math.min(50, nFit - 4)); // j stops at the end of the list
      rows.push(['(b) switch spectrum: title shown', `median ${fmt(quantile(sw.titleMs, 0.5))} ms, p95 ${fmt(quantile(sw.titleMs, 0.95))} ms`, '']);
      rows.push(['    spectrum and candidates drawn', `median ${fmt(quantile(sw.drawnMs, 0.5))} ms, p95 ${fmt(quantile(sw.drawnMs, 0.95))} ms`, '<= 100 ms']);
    }

    // (c) pan a 20,000-pixel spectrum.
    {
      const span = Math.log10(10400 / 3600);
      const grid: GridSpec = { kind: 'log10', startA: 3600, endA: 10400 * (1 + 1e-9), dLog10: span / (LONG_PIXELS - 1) };
      const f = fitsBytes(1, grid, 'LONG'); // object 1 is a star-forming galaxy
      const path = join(tmp, f.name);
      writeFileSync(path, f.bytes);
      const { page } = await open('long');
      await page.getByTestId('file-input').setInputFiles(path);
      await waitForFitting(page, 1);
      await page.locator('.plot-box svg[data-view-a]').waitFor();
      const px = Number((await page.getByTestId('review-panel').textContent())?.match(/([\d,]+) pixels/)?.[1].replace(/,/g, ''));
      await page.locator('.plot-box svg[tabindex]').focus();
      for (let k = 0; k < 4; k++) await page.keyboard.press('+'); // 1.5^4 = 5x: a fifth of the spectrum in view
      await measureFrames(page, 'drag', 20); // warm-up
      const drag = await measureFrames(page, 'drag', 240);
      const keys = await measureFrames(page, 'keys', 120);
      log(`(c) ${px} pixels in the file read; zoomed 5x, dragged 240 frames and panned by key 120 frames`);
      rows.push([`(c) pan ${px}-px spectrum, drag: frame interval`, `median ${fmt(quantile(drag.intervalMs, 0.5))} ms, p95 ${fmt(quantile(drag.intervalMs, 0.95))} ms`, '<= 16 ms (16.7 at 60 Hz)']);
      rows.push(['    drag: main-thread work per frame', `median ${fmt(quantile(drag.workMs, 0.5))} ms, p95 ${fmt(quantile(drag.workMs, 0.95))} ms`, '<= 16 ms']);
      rows.push(['    arrow keys: frame interval', `median ${fmt(quantile(keys.intervalMs, 0.5))} ms, p95 ${fmt(quantile(keys.intervalMs, 0.95))} ms`, '']);
      rows.push(['    arrow keys: work per key', `median ${fmt(quantile(keys.workMs, 0.5))} ms, p95 ${fmt(quantile(keys.workMs, 0.95))} ms`, '<= 16 ms']);
    }

    // (d) nHeld spectra held in the page.
    if (nHeld > 0) {
      log(`(d) writing ${nHeld} distinct simulated spectra (FITS, 3600-9200 Å)...`);
      const d = writeBatch(join(tmp, 'held'), nHeld, DEFAULT_GRID, 'HELD');
      const { page, cdp, pid } = await open('held');
      const mem = sampleMemory(cdp, pid);
      const t = await timeIntake(page, d.paths, 1_800_000);
      const peaks = await mem.stop();
      await cdp.send('HeapProfiler.collectGarbage');
      const heapAfter = await jsHeapMb(cdp);
      const rssAfter = rendererRssMb(pid);
      const shown = await page.getByTestId('review-counts').textContent();
      const domRows = await page.getByTestId('spectrum-row').count();
      const storage = await page.evaluate(async () => (await navigator.storage.estimate()).usage ?? NaN);
      await measureFrames(page, 'scroll', 20); // warm-up
      const scroll = await measureFrames(page, 'scroll', 240);
      log(`    ${nHeld} files (${fmt(d.mb)} MB) fitted after ${fmt(t.fittedS, 1)} s; list says "${shown}"; ${domRows} row elements in the DOM`);
      rows.push([`(d) ${nHeld} spectra: read + fit`, `${fmt(t.fittedS, 1)} s (${fmt(nHeld / t.fittedS, 0)} spectra/s)`, '']);
      rows.push(['    JS heap: peak during intake / after (GC)', `${fmt(peaks.peakHeapMb, 0)} MB / ${fmt(heapAfter, 0)} MB`, '']);
      rows.push(['    renderer memory: peak / after', `${fmt(peaks.peakRendererMb, 0)} MB / ${fmt(rssAfter, 0)} MB`, '']);
      rows.push(['    IndexedDB usage', `${fmt(storage / 1e6, 0)} MB; ${domRows} list rows in the DOM`, '']);
      rows.push(['    list scroll (5 rows a frame): frame interval', `median ${fmt(quantile(scroll.intervalMs, 0.5))} ms, p95 ${fmt(quantile(scroll.intervalMs, 0.95))} ms, max ${fmt(Math.max(...scroll.intervalMs))} ms`, '~16.7 ms']);
      rows.push(['    list scroll: work per frame', `median ${fmt(quantile(scroll.workMs, 0.5))} ms, p95 ${fmt(quantile(scroll.workMs, 0.95))} ms`, '']);
    }
  } catch (e) {
    // Keep what the page showed when a part failed.
    const pages = chrome ? (chrome as OwnChromium).context.pages() : [];
    if (pages[0]) await pages[0].screenshot({ path: artifactPath('bench-browser-failure.png') }).catch(() => undefined);
    throw e;
  } finally {
    if (chrome) await (chrome as OwnChromium).close();
    await server.close();
    removeDir(tmp);
    await releaseApp();
    printTable(rows, log);
  }
}

function printTable(rows: readonly [string, string, string][], log: Log): void {
  if (!rows.length) return;
  const w0 = Math.max(...rows.map((r) => r[0].length));
  const w1 = Math.max(...rows.map((r) => r[1].length));
  log('');
  log(`${'figure'.padEnd(w0)} | ${'measured'.padEnd(w1)} | target`);
  log(`${'-'.repeat(w0)}-|-${'-'.repeat(w1)}-|-------`);
  for (const [a, b, c] of rows) log(`${a.padEnd(w0)} | ${b.padEnd(w1)} | ${c}`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const arg = (name: string, dflt: number) => {
    const k = process.argv.indexOf(name);
    return k > 0 ? Number(process.argv[k + 1]) : dflt;
  };
  benchBrowser({ nFit: arg('--fit', 1000), nHeld: process.argv.includes('--skip-held') ? 0 : arg('--held', 5000) })
    .then(() => process.exit(0))
    .catch((e: unknown) => {
      console.error(e);
      process.exit(1);
    });
}
