/**
 * Team review in Chromium with three browser profiles (separate user-data
 * dirs): the lead loads the demo set and makes packets for two reviewers;
 * each reviewer opens their packet on the start page, disagrees on purpose
 * on a few spectra and accepts the rest, and saves the session; the lead
 * merges both (a file of another batch is refused by name, as is a spectrum
 * file with other contents dropped into a packet session), settles every
 * disagreement (by key, and one with a decision of their own), reloads, and
 * exports. The counts and Cohen's kappa are worked out here from the saved
 * session files alone.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, onTestFailed } from 'vitest';
import type { BrowserContext, Download, Page } from 'playwright-core';
import { parseCatalogueCsv } from '../../src/core/table/csv';
import { demoRowIds } from '../helpers/demoRows';
import { ROOT, artifactPath, browserAvailable, buildApp, launchBrowser, releaseApp, removeDir, serveDist, tempDir, waitForFitting, watchRequests, waitForNewTitle } from './harness';

const DEMO_COUNT = demoRowIds(join(ROOT, 'sample-spectra')).length;
const ARBITER = 'Lead Arbiter';

interface SavedDecision {
  file: string;
  state: string;
  z: number | null;
  class: string;
  reviewer: string;
  note: string;
}
interface SavedSession {
  reviewer: string;
  team: { batchId: string; reviewer: string; spectra: { id: string }[] };
  entries: { key: string; file: string; decision: SavedDecision | null }[];
}

async function downloads(page: Page, n: number, action: () => Promise<void>): Promise<Download[]> {
  const got: Download[] = [];
  const done = new Promise<void>((resolve) => {
    const on = (d: Download) => {
      got.push(d);
      if (got.length === n) {
        page.off('download', on);
        resolve();
      }
    };
    page.on('download', on);
  });
  await action();
  await done;
  return got;
}

/** Same class and |z1 - z2| / (1 + mean z) < 0.003, two rejections agree: the rule as the README states it. */
function agree(a: SavedDecision, b: SavedDecision): boolean {
  if (a.class !== b.class) return false;
  if (a.z === null || b.z === null) return a.z === null && b.z === null;
  return Math.abs(a.z - b.z) / (1 + (a.z + b.z) / 2) < 0.003;
}

describe.skipIf(!browserAvailable)('team review in Chromium: packets, two reviewers, merge, settle, export', () => {
  let serverClose: () => Promise<void>;
  let url = '';
  const dirs: string[] = [];
  const contexts: BrowserContext[] = [];
  const outside: string[] = [];
  const work = tempDir('team-files');

  async function profile(name: string): Promise<Page> {
    const dir = tempDir(`team-${name}`);
    dirs.push(dir);
    const { context } = await launchBrowser(dir);
    contexts.push(context);
    outside.push(...watchRequests(context));
    const page = context.pages()[0] ?? (await context.newPage());
    page.setDefaultTimeout(60_000);
    onTestFailed(async () => {
      await page.screenshot({ path: artifactPath(`team-failure-${name}.png`) }).catch(() => undefined);
    });
    return page;
  }

  beforeAll(async () => {
    const served = await serveDist(await buildApp());
    serverClose = served.close;
    url = served.url;
  }, 180_000);

  afterAll(async () => {
    for (const c of contexts) await c.close().catch(() => undefined);
    await serverClose?.();
    for (const d of [...dirs, work]) removeDir(d);
    await releaseApp();
  });

  /** Open a packet on the start page, disagree on purpose, accept the rest in one step, save the session. */
  async function review(page: Page, packet: string, reviewer: string, plan: ('reject' | 'second')[], wrongFile?: string): Promise<{ path: string; saved: SavedSession }> {
    await page.goto(url);
    await page.getByTestId('load-session').waitFor();
    await page.getByLabel('Session file').setInputFiles(packet);
    let current = await waitForNewTitle(page, null);
    for (const step of plan) {
      if (step === 'reject') await page.keyboard.press('x');
      else {
        const automaticZ = await page.getByTestId('solution-z').textContent();
        await page.keyboard.press('2');
        await expect.poll(() => page.getByTestId('solution-z').textContent()).not.toBe(automaticZ);
        await page.keyboard.press('a');
      }
      current = await waitForNewTitle(page, current); // no name is asked: the packet said who reviews
    }
    await page.getByTestId('bulk-accept').click();
    await page.getByTestId('bulk-confirm-accept').click();
    await page.getByTestId('bulk-done').waitFor();
    await expect.poll(() => page.getByTestId('review-counts').textContent()).toMatch(/^(\d+) of \1 reviewed/);
    await page.keyboard.press('b');
    if (wrongFile) {
      // A file named like one of the packet's spectra but with other contents is refused by name.
      await page.getByLabel('Spectrum files').setInputFiles(wrongFile);
      await expect.poll(() => page.getByTestId('intake-notices').textContent()).toContain(`${basename(wrongFile)}: not the packet's`);
      await expect.poll(() => page.getByTestId('review-counts').textContent()).toMatch(/^(\d+) of \1 reviewed/);
    }
    const [d] = await downloads(page, 1, () => page.getByRole('button', { name: 'Save session (results and decisions)' }).click());
    const path = join(work, `${reviewer}.json`);
    await d.saveAs(path);
    return { path, saved: JSON.parse(readFileSync(path, 'utf8')) as SavedSession };
  }

  it('deals, reviews in two profiles, merges, settles every disagreement and exports every verdict', { timeout: 600_000 }, async () => {
    // 1. The lead: demo set, packets for Ana and Bo (two per spectrum, so each gets every fitted spectrum).
    const lead = await profile('lead');
    await lead.goto(`${url}?demo`);
    await waitForFitting(lead, DEMO_COUNT, 240_000);
    await lead.getByTestId('team-toggle').click();
    await lead.getByLabel('Reviewer names').fill('Ana\nBo');
    const packets = await downloads(lead, 2, () => lead.getByTestId('make-packets').click());
    const packetPaths: Record<string, string> = {};
    for (const p of packets) {
      const who = /-(Ana|Bo)\.json$/.exec(p.suggestedFilename())![1];
      packetPaths[who] = join(work, p.suggestedFilename());
      await p.saveAs(packetPaths[who]);
    }
    const dealt = Number(/Ana (\d+)/.exec((await lead.getByTestId('packet-status').textContent())!)![1]);
    expect(dealt).toBeGreaterThan(10);

    // 2. Two reviewers in their own profiles, with deliberate disagreements on the first spectra.
    const ana = await review(await profile('ana'), packetPaths.Ana, 'Ana', ['reject', 'second']);
    const firstFile = JSON.parse(readFileSync(packetPaths.Bo, 'utf8')).team.spectra.find((x: { file: string }) => !x.file.includes('#')).file as string;
    const wrong = join(tempDir('team-wrong'), basename(firstFile));
    dirs.push(dirname(wrong));
    writeFileSync(wrong, 'wavelength,flux\n4000,1\n4001,2\n4002,3\n');
    const bo = await review(await profile('bo'), packetPaths.Bo, 'Bo', ['second', 'reject', 'reject'], wrong);
    expect(ana.saved.team.reviewer).toBe('Ana');
    expect(bo.saved.team.batchId).toBe(ana.saved.team.batchId);

    // What the test expects, from the saved files alone.
    const decided = (s: SavedSession) => new Map(s.entries.filter((e) => e.decision).map((e) => [e.key, e.decision!]));
    const da = decided(ana.saved);
    const db = decided(bo.saved);
    expect(da.size).toBe(dealt);
    expect(db.size).toBe(dealt);
    for (const d of da.values()) expect(d.reviewer).toBe('Ana');
    const ids = [...da.keys()];
    const disagreeIds = ids.filter((id) => !agree(da.get(id)!, db.get(id)!));
    expect(disagreeIds.length).toBeGreaterThanOrEqual(3);
    // Cohen (1960): kappa = (p_o - p_e) / (1 - p_e) over the two reviewers' classes.
    const cats = ['qso', 'galaxy', 'star', 'unknown'];
    const po = ids.filter((id) => da.get(id)!.class === db.get(id)!.class).length / ids.length;
    const share = (m: Map<string, SavedDecision>, c: string) => [...m.values()].filter((d) => d.class === c).length / ids.length;
    const pe = cats.reduce((s, c) => s + share(da, c) * share(db, c), 0);
    const kappa = (po - pe) / (1 - pe);

    // 3. Merge in the lead's browser; a copy of Bo's file from another batch is refused by name.
    const foreign = join(work, 'stranger.json');
    writeFileSync(foreign, JSON.stringify({ ...bo.saved, team: { ...bo.saved.team, batchId: 'ffffffffffffffff', reviewer: 'Cy' } }));
    await lead.getByLabel('Reviewer session files').setInputFiles([ana.path, bo.path]);
    await expect.poll(() => lead.getByTestId('merge-sources').textContent()).toContain('Bo.json (Bo');
    await lead.getByLabel('Reviewer session files').setInputFiles([foreign]);
    await expect.poll(() => lead.getByTestId('merge-note').textContent()).toContain('stranger.json belongs to batch ffffffffffffffff');
    const counts = `${dealt} spectra: ${dealt - disagreeIds.length} agreeing, ${disagreeIds.length} disagreeing, 0 single-reviewed, 0 not reviewed. Settled 0, open ${disagreeIds.length}.`;
    await expect.poll(() => lead.getByTestId('team-counts').textContent()).toBe(counts);
    expect(await lead.getByTestId('pair-kappa').textContent()).toBe(kappa.toFixed(3));
    expect(await lead.getByTestId('team-shown').textContent()).toBe(`${disagreeIds.length} shown`);
    await lead.getByTestId('settle-pane').waitFor();
    await lead.screenshot({ path: artifactPath('team-settle.png'), fullPage: true });

    // 4. Settle: the arbiter names themself, records one decision of their own, then takes Ana's (key 1) for the rest.
    await lead.getByLabel('Arbiter name').fill(ARBITER);
    await lead.getByLabel('Arbiter redshift').fill('0.5');
    await lead.getByLabel('Arbiter note').fill('own call');
    await lead.getByTestId('settle-new').click();
    for (let left = disagreeIds.length - 1; left > 0; left--) {
      await expect.poll(() => lead.getByTestId('team-counts').textContent()).toContain(`open ${left}.`);
      await lead.locator('h2').click(); // keys go to the page, not a text field
      await lead.keyboard.press('1');
    }
    await expect.poll(() => lead.getByTestId('team-counts').textContent()).toContain(`Settled ${disagreeIds.length}, open 0.`);
    await lead.getByTestId('team-none').waitFor();

    // Nothing is lost on reload.
    await lead.reload();
    await lead.getByTestId('team-toggle').click();
    await expect.poll(() => lead.getByTestId('team-counts').textContent()).toContain(`Settled ${disagreeIds.length}, open 0.`);
    await lead.screenshot({ path: artifactPath('team-merged.png'), fullPage: true });

    // 5. Export: final catalogue, every verdict and the report.
    const files = await downloads(lead, 3, () => lead.getByTestId('team-export').click());
    const text = async (suffix: string) => readFileSync((await files.find((f) => f.suggestedFilename().endsWith(suffix))!.path())!, 'utf8');
    const final = parseCatalogueCsv(await text('-final.csv'));
    const verdicts = parseCatalogueCsv(await text('-verdicts.csv'));
    const report = await text('-report.txt');
    expect(final.rows).toHaveLength(dealt);
    expect(final.meta['batch_id']).toBe(ana.saved.team.batchId);
    expect(final.rows.every((r) => r.n_reviewers === '2')).toBe(true);
    expect(final.rows.filter((r) => r.agreement === 'disagree').length).toBe(disagreeIds.length);
    expect(final.rows.filter((r) => r.settled_by === ARBITER).length).toBe(disagreeIds.length);
    expect(final.rows.filter((r) => r.note === 'own call' && r.final_z === '0.500000' && r.reviewer === ARBITER)).toHaveLength(1);
    expect(final.rows.every((r) => r.review_state !== 'unreviewed')).toBe(true);
    // Every reviewer's verdict is there as they made it, plus one row per settlement.
    expect(verdicts.rows).toHaveLength(2 * dealt + disagreeIds.length);
    for (const [who, m] of [['Ana', da], ['Bo', db]] as const)
      for (const [id, d] of m) {
        const row = verdicts.rows.find((r) => r.spectrum_id === id && r.reviewer === who && r.role === 'reviewer');
        expect(row, `${who} on ${id}`).toBeDefined();
        expect([row!.review_state, row!.class, row!.z, row!.note]).toEqual([d.state, d.class, d.z === null ? '' : d.z.toFixed(6), d.note]);
      }
    expect(verdicts.rows.filter((r) => r.role === 'arbiter' && r.reviewer === ARBITER)).toHaveLength(disagreeIds.length);
    expect(report).toContain(`Ana / Bo: kappa ${kappa.toFixed(3)} on ${dealt} spectra`);
    expect(outside).toEqual([]);
  });
});
