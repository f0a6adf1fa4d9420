/**
 * Nothing lost, nothing injected (issue 5, items 3 and 4), in real Chromium:
 * - kill the browser process hard (SIGKILL, no shutdown) right after three
 *   decisions, start it again on the same profile and find every decision;
 * - file names and header text with HTML in them are shown as text.
 */
import { afterAll, beforeAll, describe, expect, it, onTestFailed } from 'vitest';
import type { Page } from 'playwright-core';
import { simulateSpectrum, createRng } from '../../src/core/sim';
import { writeTextLayout } from '../../src/core/sim/sampleText';
import { demoRowIds } from '../helpers/demoRows';
import { join } from 'node:path';
import {
  ROOT,
  artifactPath,
  browserAvailable,
  buildApp,
  releaseApp,
  launchBrowser,
  removeDir,
  serveDist,
  spawnChromium,
  tempDir,
  waitForFitting,
  watchRequests,
  type OwnChromium,
} from './harness';

/** Rows of the demo set: a file each, the plate a row per fibre (test/helpers/demoRows.ts). */
const DEMO_COUNT = demoRowIds(join(ROOT, 'sample-spectra')).length;

async function waitForNewTitle(page: Page, before: string | null): Promise<string> {
  await page.waitForFunction((b) => {
    const t = document.querySelector('[data-testid="review-title"]')?.textContent;
    // The stored fit has arrived once the candidates are listed (keys 1-9 act on them).
    return !!t && t !== b && !!document.querySelector('[data-testid="solution"]') && !!document.querySelector('[data-testid="candidate-row"]');
  }, before);
  return (await page.getByTestId('review-title').textContent())!;
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

describe.skipIf(!browserAvailable)('Chromium killed mid-review, and hostile names', () => {
  let url = '';
  let serverClose: () => Promise<void>;
  const dirs: string[] = [];
  const running: OwnChromium[] = [];

  beforeAll(async () => {
    const served = await serveDist(await buildApp());
    url = served.url;
    serverClose = served.close;
  }, 180_000);

  afterAll(async () => {
    for (const c of running) await c.close().catch(() => undefined);
    await serverClose?.();
    for (const d of dirs) removeDir(d);
    await releaseApp();
  });

  it('keeps every decision when the browser process is killed with SIGKILL', { timeout: 180_000 }, async () => {
    const profile = tempDir('crash-profile');
    dirs.push(profile);
    const first = await spawnChromium(profile);
    running.push(first);
    const outside = watchRequests(first.context);
    const page = first.context.pages()[0] ?? (await first.context.newPage());
    page.setDefaultTimeout(60_000);
    onTestFailed(async () => {
      for (const p of running.flatMap((c) => c.context.pages())) await p.screenshot({ path: artifactPath('crash-failure.png') }).catch(() => undefined);
    });

    await page.goto(`${url}?demo`);
    await waitForFitting(page, DEMO_COUNT);

    // Three decisions, by keyboard: accept, reject as unusable, accept candidate 2.
    const made: { id: string; state: string; z: string | null }[] = [];
    let current = await waitForNewTitle(page, null);
    made.push({ id: current, state: 'accepted', z: await page.getByTestId('solution-z').textContent() });
    await page.keyboard.press('a');
    await page.getByTestId('reviewer-dialog').waitFor();
    await page.keyboard.type('Night Shift');
    await page.keyboard.press('Enter');
    current = await waitForNewTitle(page, current);
    made.push({ id: current, state: 'unusable', z: null });
    await page.keyboard.press('x');
    current = await waitForNewTitle(page, current);
    await page.keyboard.press('2');
    await expect.poll(() => page.getByTestId('solution').textContent()).toContain('set by: candidate 2');
    made.push({ id: current, state: 'changed', z: await page.getByTestId('solution-z').textContent() });
    await page.keyboard.press('a');
    // The list counts a decision once its write has landed (session.decide awaits IndexedDB).
    await expect.poll(() => page.getByTestId('review-counts').textContent()).toMatch(/^3 of \d+ reviewed/);

    // Kill hard: no unload, no orderly shutdown of the storage backend.
    expect(alive(first.pid)).toBe(true);
    await first.killHard();
    running.splice(running.indexOf(first), 1);
    expect(alive(first.pid)).toBe(false);

    // Start again on the same profile; open the page without ?demo, so the batch itself must come back.
    const second = await spawnChromium(profile);
    running.push(second);
    const outside2 = watchRequests(second.context);
    const page2 = second.context.pages()[0] ?? (await second.context.newPage());
    page2.setDefaultTimeout(60_000);
    await page2.goto(url);
    // Files that cannot be read are not counted as work to review, but every file is shown.
    await expect.poll(() => page2.getByTestId('review-counts').textContent(), { timeout: 60_000 }).toMatch(new RegExp(`^3 of \\d+ reviewed · ${DEMO_COUNT} shown`));
    for (const m of made) {
      const row = page2.getByTestId('spectrum-row').filter({ has: page2.locator('.c-id', { hasText: m.id }) });
      await expect.poll(() => row.locator('.c-review').textContent()).toContain(m.state);
      await row.click();
      await expect.poll(() => page2.getByTestId('decision-state').textContent()).toContain(`${m.state} by Night Shift`);
      if (m.z !== null) expect(await page2.getByTestId('solution-z').textContent()).toBe(m.z);
    }
    // The fits came back too: nothing is queued again.
    expect(await page2.getByTestId('count-waiting').count()).toBe(0);
    await page2.screenshot({ path: artifactPath('after-crash.png') });
    await second.close();
    running.splice(running.indexOf(second), 1);
    expect(outside).toEqual([]);
    expect(outside2).toEqual([]);
  });

  it('shows file names and header text that look like HTML as text', { timeout: 120_000 }, async () => {
    const { browser, context } = await launchBrowser();
    try {
      const outside = watchRequests(context);
      const page = await context.newPage();
      const dialogs: string[] = [];
      page.on('dialog', (d) => {
        dialogs.push(d.message());
        void d.dismiss();
      });
      await page.goto(url);
      await page.getByTestId('drop-zone').waitFor();

      // A readable spectrum whose name and object id are markup, and an unreadable one (markup in a cell) whose error repeats its name.
      const sim = simulateSpectrum({ class: 'galaxy-sf', z: 0.2, snr: 15, objectId: 'x', file: 'x' }, createRng(7));
      const objectId = '<img src=y onerror=alert(2)>';
      const goodName = '<img src=x onerror=alert(1)>.csv';
      const badName = '<iframe src=javascript:alert(3)>.csv'; // no '/': a file name cannot hold one
      const good = writeTextLayout('csv-ivar', sim.spectrum, { objectId, raDeg: 1, decDeg: 2, dateObs: '2031-01-01', exposureS: 900, fluxUnit: '1e-17 erg/s/cm2/A' });
      const bad = new TextEncoder().encode('wavelength,flux\n4000,<b>bright</b>\n');
      await page.getByTestId('file-input').setInputFiles([
        { name: goodName, mimeType: 'text/csv', buffer: Buffer.from(good) },
        { name: badName, mimeType: 'text/csv', buffer: Buffer.from(bad) },
      ]);
      await waitForFitting(page, 2);
      expect(await page.getByTestId('count-failed').textContent()).toBe('1 failed');
      // The readable file was opened while it was still being fitted; its fit shows once it lands.
      await expect.poll(() => page.getByTestId('review-title').textContent()).toBe(objectId);
      await page.getByTestId('candidate-row').first().waitFor();
      expect(await page.getByTestId('solution-z').textContent()).toMatch(/^\d\.\d{5}$/);

      const ids = await page.getByTestId('spectrum-row').locator('.c-id').allTextContents();
      expect(ids).toContain(objectId); // the object id from the header, as text
      expect(ids).toContain(badName); // the base name, as text
      const rows = page.getByTestId('spectrum-row');
      expect(await rows.filter({ hasText: badName }).locator('.row-error').textContent()).toContain(badName);
      // The file name of the readable one is shown in the review panel (and as the list's tooltip).
      await rows.filter({ has: page.locator('.c-id', { hasText: objectId }) }).click();
      await expect.poll(() => page.getByTestId('review-title').textContent()).toBe(objectId);
      expect(await page.getByTestId('review-panel').textContent()).toContain(goodName);

      expect(await page.locator('img').count()).toBe(0);
      expect(await page.locator('iframe').count()).toBe(0);
      expect(dialogs).toEqual([]);
      expect(outside).toEqual([]);
    } finally {
      await context.close();
      await browser?.close();
    }
  });
});
