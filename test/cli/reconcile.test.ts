/**
 * `npm run reconcile` end to end: two reviewers' session files saved from
 * packets of four demo spectra (fitted here by the same core call the
 * browser makes), one deliberate class disagreement and one redshift
 * disagreement; a third file from another batch is refused by name while the
 * rest are merged. Counts and kappa are worked out here from the decisions.
 */
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { fitBytes } from '../../src/core/pipeline';
import { DEFAULT_COSMOLOGY } from '../../src/core/cosmology';
import { planPackets, verdictSetFromSession, type TeamTag } from '../../src/core/team';
import { parseSession } from '../../src/ui/persist/sessionFile';
import { MERGE_WORK_FORMAT, MERGE_WORK_VERSION } from '../../src/ui/team/mergeWork';
import { encodeSession, SESSION_FORMAT, SESSION_VERSION, type SessionFile } from '../../src/ui/persist/sessionFile';
import { parseCatalogueCsv } from '../../src/core/table';
import type { FitResult, ReviewDecision, SpectrumClass } from '../../src/core/types';
import { walkHdus } from '../../src/core/io/fits/hdus';

const ROOT = resolve(__dirname, '../..');
const TSX = join(ROOT, 'node_modules', '.bin', 'tsx');
const tmp = mkdtempSync(join(tmpdir(), 'shiftmark-reconcile-'));
const FILES = ['mrx-0136.fits', 'mrx-0144.tsv', 'mrx-0173.fits', 'mrx-0193.fits'];

function run(args: string[]) {
  return spawnSync(TSX, ['src/cli/reconcile.ts', ...args], { cwd: ROOT, encoding: 'utf8' });
}

const results = new Map<string, FitResult>();
let tags: TeamTag[] = [];

function decision(file: string, reviewer: string, cls: SpectrumClass, z: number | null): ReviewDecision {
  return { file, state: z === null ? 'rejected' : 'changed', z, zErr: null, class: cls, reviewerGrade: 'high', howSet: 'typed', reviewer, decidedAt: '2026-02-01T10:00:00.000Z', note: `by ${reviewer}` };
}

function sessionText(tag: TeamTag, decide: (r: FitResult) => ReviewDecision): string {
  const s: SessionFile = {
    format: SESSION_FORMAT,
    version: SESSION_VERSION,
    exportedAt: '2026-02-01T11:00:00.000Z',
    software: 'Shiftmark test',
    reviewer: tag.reviewer,
    cosmology: DEFAULT_COSMOLOGY,
    entries: tag.spectra.map((sp, i) => ({ key: sp.id, file: sp.file, order: i, result: results.get(sp.id)!, decision: decide(results.get(sp.id)!) })),
  };
  return encodeSession({ ...s, team: tag });
}

beforeAll(async () => {
  const batch = FILES.map((f) => {
    const bytes = new Uint8Array(readFileSync(join(ROOT, 'sample-spectra', f)));
    const file = `sample-spectra/${f}`;
    results.set(file, fitBytes(bytes, file));
    return { id: file, file, sha256: createHash('sha256').update(bytes).digest('hex') };
  });
  // Two reviewers, two per spectrum: each packet holds all four.
  tags = (await planPackets(batch, ['Ana', 'Bo'], 2, 5, '2026-02-01T09:00:00.000Z')).packets;
  const [ana, bo] = tags;
  const ids = FILES.map((f) => `sample-spectra/${f}`);
  // Ana takes every automatic solution. Bo: spectrum 0 another class, spectrum 1 z off by 0.05, 2 and 3 as Ana.
  const anaSays = (r: FitResult) => decision(r.file, 'Ana', r.class, r.z);
  const boSays = (r: FitResult) => {
    if (r.file === ids[0]) return decision(r.file, 'Bo', r.class === 'star' ? 'galaxy' : 'star', r.z);
    if (r.file === ids[1]) return decision(r.file, 'Bo', r.class, r.z + 0.05);
    return decision(r.file, 'Bo', r.class, r.z);
  };
  writeFileSync(join(tmp, 'ana.json'), sessionText(ana, anaSays));
  writeFileSync(join(tmp, 'bo.json'), sessionText(bo, boSays));
  writeFileSync(join(tmp, 'stranger.json'), sessionText({ ...bo, batchId: 'ffffffffffffffff', reviewer: 'Cy' }, boSays));
}, 120_000);

describe('npm run reconcile', () => {
  it('runs as package.json declares it (the bundled tool) and prints the same report as the TypeScript source', () => {
    const args = [join(tmp, 'ana.json'), join(tmp, 'bo.json')];
    const bundled = spawnSync('node', ['scripts/cli-bundle.mjs', 'run', 'reconcile', ...args], { cwd: ROOT, encoding: 'utf8' });
    expect(bundled.status).toBe(0);
    const direct = run(args);
    // The report's first line holds the time it was made; the rest must match.
    const body = (t: string) => t.split('\n').slice(1).join('\n');
    expect(body(bundled.stdout)).toBe(body(direct.stdout));
    expect(bundled.stdout).toContain('Ana / Bo: kappa');
  }, 180_000);

  it('prints the statistics and writes the final catalogue, every verdict and the report', () => {
    const out = join(tmp, 'merged.csv');
    const r = run([join(tmp, 'ana.json'), join(tmp, 'bo.json'), '--out', out]);
    expect(r.stderr).not.toMatch(/refused/);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('agreeing 2, disagreeing 2, single-reviewed 0');
    // Kappa by hand from the class pairs: Ana's classes c0..c3 (automatic), Bo's the same but c0 changed.
    const classes = FILES.map((f) => results.get(`sample-spectra/${f}`)!.class);
    const cats = ['qso', 'galaxy', 'star', 'unknown'] as const;
    const bo = classes.map((c, i) => (i === 0 ? (c === 'star' ? 'galaxy' : 'star') : c));
    const po = classes.filter((c, i) => c === bo[i]).length / 4;
    const pe = cats.reduce((s, k) => s + (classes.filter((c) => c === k).length / 4) * (bo.filter((c) => c === k).length / 4), 0);
    const kappa = (po - pe) / (1 - pe); // Cohen (1960): (p_o - p_e) / (1 - p_e)
    expect(r.stdout).toContain(`Ana / Bo: kappa ${kappa.toFixed(3)} on 4 spectra`);

    const final = parseCatalogueCsv(readFileSync(out, 'utf8'));
    expect(final.rows).toHaveLength(4);
    expect(final.meta['batch_id']).toBe(tags[0].batchId);
    expect(final.rows.map((x) => x.agreement)).toEqual(['disagree', 'disagree', 'agree', 'agree']);
    expect(final.rows.map((x) => x.n_reviewers)).toEqual(['2', '2', '2', '2']);
    // Open disagreements have no final verdict; agreeing ones carry a reviewer's.
    expect(final.rows[0].review_state).toBe('unreviewed');
    expect(final.rows[2].reviewer).toBe('Ana');
    const verdicts = parseCatalogueCsv(readFileSync(join(tmp, 'merged-verdicts.csv'), 'utf8'));
    expect(verdicts.rows).toHaveLength(8);
    expect(verdicts.rows.filter((x) => x.reviewer === 'Bo').map((x) => x.note)).toEqual(['by Bo', 'by Bo', 'by Bo', 'by Bo']);
    expect(readFileSync(join(tmp, 'merged-report.txt'), 'utf8')).toBe(r.stdout);
  }, 60_000);

  it('refuses a file of another batch by name and merges the rest (exit status 2)', () => {
    const r = run([join(tmp, 'ana.json'), join(tmp, 'stranger.json'), join(tmp, 'nothing.json'), '--out', join(tmp, 'partial.json')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/refused: .*stranger\.json belongs to batch ffffffffffffffff/);
    expect(r.stderr).toMatch(/refused: .*nothing\.json: cannot be read \(ENOENT\)/);
    const json = JSON.parse(readFileSync(join(tmp, 'partial.json'), 'utf8'));
    expect(json.rows).toHaveLength(4);
    expect(json.rows.every((x: { agreement: string }) => x.agreement === 'single')).toBe(true);
  }, 60_000);

  it("reads the browser's saved merge with its settlements, taking only the fits from the reviewers' files named in it", () => {
    const setOf = (name: string) => {
      const parsed = parseSession(readFileSync(join(tmp, name), 'utf8'));
      if (!parsed.ok) throw new Error(parsed.problems.join('; '));
      return verdictSetFromSession(parsed.session, name);
    };
    const [ana, bo] = [setOf('ana.json'), setOf('bo.json')];
    const first = bo.verdicts[0];
    const work = {
      format: MERGE_WORK_FORMAT,
      version: MERGE_WORK_VERSION,
      savedAt: '2026-02-02T00:00:00.000Z',
      arbiter: 'Cy',
      tolerance: 0.003,
      sets: [ana, bo],
      settlements: [{ id: first.id, arbiter: 'Cy', settledAt: '2026-02-02T00:00:00.000Z', picked: 'Bo', decision: first.decision }],
    };
    writeFileSync(join(tmp, 'merge.json'), JSON.stringify(work));
    const out = join(tmp, 'from-work.csv');
    const r = run([join(tmp, 'merge.json'), join(tmp, 'ana.json'), join(tmp, 'bo.json'), '--out', out]);
    expect(r.stderr).not.toMatch(/refused/);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('Settled by an arbiter: 1; disagreements still open: 1');
    const final = parseCatalogueCsv(readFileSync(out, 'utf8'));
    expect(final.rows[0].settled_by).toBe('Cy');
    expect(final.rows[0].reviewer).toBe('Bo');
    // The fits came from the session files: automatic columns filled, no error.
    expect(final.rows.every((x) => x.error === '' && x.z !== '')).toBe(true);
    expect(parseCatalogueCsv(readFileSync(join(tmp, 'from-work-verdicts.csv'), 'utf8')).rows).toHaveLength(9);
  }, 60_000);

  it('writes FITS tables named CATALOGUE and VERDICTS, and checks its options', () => {
    const r = run([join(tmp, 'ana.json'), join(tmp, 'bo.json'), '--out', join(tmp, 'merged.fits'), '--tolerance', '0.1']);
    expect(r.status).toBe(0);
    // With tolerance 0.1 the 0.05 shift of spectrum 1 agrees: only the class disagreement stays.
    expect(r.stdout).toContain('agreeing 3, disagreeing 1');
    const names = (f: string) => [...walkHdus(new Uint8Array(readFileSync(join(tmp, f))), f)].map((h) => h.header.get('EXTNAME'));
    expect(names('merged.fits')).toContain('CATALOGUE');
    expect(names('merged-verdicts.fits')).toContain('VERDICTS');
    const bad = run([join(tmp, 'ana.json'), '--tolerance', '2']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--tolerance: .*below 1 \(got '2'\)/);
    expect(run(['--out', 'x.csv']).stderr).toMatch(/no session files given/);
  }, 60_000);
});
