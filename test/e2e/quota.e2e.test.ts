/**
 * A refused IndexedDB write (full disk or quota, issue 5 item 3) in real
 * Chromium: the user is told at once and can export the session, decisions
 * made after the refusal included. The refusal is simulated: an init script
 * wraps IDBObjectStore put/add so that, once the test raises a flag, they
 * throw a DOMException named QuotaExceededError, as the IndexedDB spec
 * (W3C Indexed Database API 3.0, "storage operation" failures) names it.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, onTestFailed } from 'vitest';
import type { Page } from 'playwright-core';
import { parseSession } from '../../src/ui/persist/sessionFile';
import { demoRowIds } from '../helpers/demoRows';
import { ROOT, artifactPath, browserAvailable, buildApp, releaseApp, launchBrowser, serveDist, waitForFitting, watchRequests } from './harness';

/** Rows of the demo set: a file each, the plate a row per fibre (test/helpers/demoRows.ts). */
const DEMO_COUNT = demoRowIds(join(ROOT, 'sample-spectra')).length;

/** Runs in the page before the app: put/add refuse while window.__refuseWrites is true. */
const REFUSE_WRITES = `(() => {
  const proto = IDBObjectStore.prototype;
  for (const name of ['put', 'add']) {
    const original = proto[name];
    proto[name] = function (...args) {
      if (globalThis.__refuseWrites) {
        globalThis.__refusedWrites = (globalThis.__refusedWrites || 0) + 1;
        throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
      }
      return original.apply(this, args);
    };
  }
})();`;

async function waitForNewTitle(page: Page, before: string | null): Promise<string> {
  await page.waitForFunction((b) => {
    const t = document.querySelector('[data-testid="review-title"]')?.textContent;
    return !!t && t !== b && !!document.querySelector('[data-testid="candidate-row"]');
  }, before);
  return (await page.getByTestId('review-title').textContent())!;
}

describe.skipIf(!browserAvailable)('refused IndexedDB writes in Chromium', () => {
  let url = '';
  let serverClose: () => Promise<void>;

  beforeAll(async () => {
    const served = await serveDist(await buildApp());
    url = served.url;
    serverClose = served.close;
  }, 180_000);

  afterAll(async () => {
    await serverClose?.();
    await releaseApp();
  });

  it('tells the user when a decision cannot be stored and exports the session at once', { timeout: 120_000 }, async () => {
    const { browser, context } = await launchBrowser();
    try {
      const outside = watchRequests(context);
      await context.addInitScript({ content: REFUSE_WRITES });
      const page = await context.newPage();
      page.setDefaultTimeout(60_000);
      onTestFailed(async () => {
        await page.screenshot({ path: artifactPath('quota-failure.png') }).catch(() => undefined);
      });
      await page.goto(`${url}?demo`);
      await waitForFitting(page, DEMO_COUNT);

      // One decision stored normally.
      const stored = await waitForNewTitle(page, null);
      await page.keyboard.press('a');
      await page.getByTestId('reviewer-dialog').waitFor();
      await page.keyboard.type('Quota Tester');
      await page.keyboard.press('Enter');
      const refusedId = await waitForNewTitle(page, stored);
      expect(await page.getByTestId('persist-banner').count()).toBe(0);

      // From now on the browser refuses every write: the next decision cannot be stored.
      await page.evaluate(() => {
        (globalThis as unknown as { __refuseWrites: boolean }).__refuseWrites = true;
      });
      await page.keyboard.press('x');
      const banner = page.getByTestId('persist-banner');
      await banner.waitFor();
      expect(await banner.textContent()).toMatch(/quota/i);
      expect(await page.evaluate(() => (globalThis as unknown as { __refusedWrites?: number }).__refusedWrites ?? 0)).toBeGreaterThan(0);
      // The decision is still shown (kept in memory), so an export carries it.
      await expect.poll(() => page.getByTestId('review-counts').textContent()).toMatch(/^2 of /);
      await page.screenshot({ path: artifactPath('quota-banner.png') });

      const [download] = await Promise.all([page.waitForEvent('download'), banner.getByRole('button', { name: 'Export session now' }).click()]);
      expect(download.suggestedFilename()).toMatch(/^shiftmark-session-.*\.json$/);
      const parsed = parseSession(readFileSync((await download.path())!, 'utf8'));
      if (!parsed.ok) throw new Error(`exported session does not read back: ${parsed.problems.join('; ')}`);
      expect(parsed.session.entries).toHaveLength(DEMO_COUNT);
      expect(parsed.session.reviewer).toBe('Quota Tester');
      const decided = parsed.session.entries.filter((e) => e.decision);
      expect(decided.map((e) => [e.result?.input.meta.objectId, e.decision!.state]).sort()).toEqual(
        [
          [stored, 'accepted'],
          [refusedId, 'rejected'],
        ].sort(),
      );

      // Proof that the write was really refused: after a reload only the first decision is in the database.
      await page.reload();
      await expect.poll(() => page.getByTestId('review-counts').textContent(), { timeout: 60_000 }).toMatch(/^1 of /);
      expect(outside).toEqual([]);
    } finally {
      await context.close();
      await browser?.close();
    }
  });
});
