/**
 * The headless fitter end to end: `npm run fit` on the demo set, checked
 * against its truth.csv; the rows equal the in-process core call the browser
 * worker makes; shards merge back into the unsharded table.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseCatalogueCsv, automaticRow } from '../../src/core/table';
import { fitBytes } from '../../src/core/pipeline';
import { DEFAULT_COSMOLOGY } from '../../src/core/cosmology';
import { parseTruthCsv } from '../../src/core/sim';
import { mergeShardTables } from '../../src/cli/mergeTables';

const ROOT = resolve(__dirname, '../..');
const TSX = join(ROOT, 'node_modules', '.bin', 'tsx');
const tmp = mkdtempSync(join(tmpdir(), 'shiftmark-cli-'));

function fit(args: string[]): string {
  execFileSync(TSX, ['src/cli/fit.ts', ...args], { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
  return readFileSync(args[args.indexOf('--out') + 1], 'utf8');
}

const truth = parseTruthCsv(readFileSync(join(ROOT, 'sample-spectra', 'truth.csv'), 'utf8'));
let table: ReturnType<typeof parseCatalogueCsv>;
let fullText: string;

beforeAll(() => {
  fullText = fit(['sample-spectra', '--out', join(tmp, 'all.csv'), '--jobs', '2']);
  table = parseCatalogueCsv(fullText);
}, 180_000);

describe('npm run fit on sample-spectra/', () => {
  it('writes one row per input file and names the software, template set and cosmology', () => {
    const files = table.rows.map((r) => r.file.replace(/^sample-spectra\//, ''));
    expect(new Set(files)).toEqual(new Set(truth.map((t) => t.file)));
    expect(table.meta.software).toMatch(/^Shiftmark /);
    expect(table.meta.template_set).toBeTruthy();
    expect(table.meta.cosmology).toMatch(/H0 = 70/);
    for (const c of ['file', 'z', 'z_err', 'class', 'confidence', 'score', 'error']) expect(table.columns).toContain(c);
  });

  it('gives every deliberately broken file a row whose error carries the expected reason (truth.csv)', () => {
    for (const t of truth.filter((x) => x.layout === 'broken')) {
      const row = table.rows.find((r) => r.file === `sample-spectra/${t.file}`)!;
      expect(row.error).toContain(t.expectedError);
      expect(row.z).toBe('');
    }
  });

  it('recovers the true redshift of most demo spectra (truth.csv; |dz|/(1+z) < 0.01)', () => {
    const good = truth.filter((x) => x.layout !== 'broken');
    let right = 0;
    for (const t of good) {
      const row = table.rows.find((r) => r.file === `sample-spectra/${t.file}`)!;
      expect(row.error).toBe('');
      if (Math.abs(Number(row.z) - t.z) / (1 + t.z) < 0.01) right++;
    }
    // Regression floor for this demo set (internal): at the time of writing 42 of 44 were right.
    expect(right / good.length).toBeGreaterThanOrEqual(0.9);
  });

  it('writes the same row the in-process core call gives (the browser worker takes that path)', () => {
    for (const t of truth.slice(0, 6)) {
      const path = `sample-spectra/${t.file}`;
      const bytes = new Uint8Array(readFileSync(join(ROOT, path)));
      const expected = automaticRow(fitBytes(bytes, path), DEFAULT_COSMOLOGY);
      const row = table.rows.find((r) => r.file === path)!;
      expect(row).toEqual(expected);
    }
  });

  it('shards 1/2 and 2/2 merge into exactly the unsharded rows', () => {
    const a = fit(['sample-spectra', '--out', join(tmp, 's1.csv'), '--shard', '1/2', '--jobs', '1']);
    const b = fit(['sample-spectra', '--out', join(tmp, 's2.csv'), '--shard', '2/2', '--jobs', '1']);
    const merged = parseCatalogueCsv(mergeShardTables([{ name: 's2.csv', text: b }, { name: 's1.csv', text: a }]));
    expect(merged.rows).toEqual(table.rows);
    expect(() => mergeShardTables([{ name: 's1.csv', text: a }])).toThrow(/missing shard 2\/2/);
    expect(() => mergeShardTables([{ name: 's1.csv', text: a }, { name: 'again.csv', text: a }])).toThrow(/given twice/);
  }, 180_000);

  it('keeps going past a missing file and says why', () => {
    const text = fit(['sample-spectra/mrx-0877.csv', join(tmp, 'no-such-file.fits'), '--out', join(tmp, 'missing.csv')]);
    const rows = parseCatalogueCsv(text).rows;
    expect(rows).toHaveLength(2);
    expect(rows.find((r) => r.file.endsWith('no-such-file.fits'))!.error).toMatch(/no such file/);
    expect(rows.find((r) => r.file.endsWith('mrx-0877.csv'))!.error).toBe('');
  }, 60_000);

  it('marks a file that runs past its time limit as failed, replaces the worker and finishes the batch', () => {
    // 0.05 s is far less than a worker needs to start, so every file runs out of time.
    const files = ['sample-spectra/mrx-0877.csv', 'sample-spectra/mrx-0886.fits', 'sample-spectra/mrx-0136.fits'];
    const text = fit([...files, '--out', join(tmp, 'timeout.csv'), '--jobs', '1', '--time-limit', '0.05']);
    const rows = parseCatalogueCsv(text).rows;
    expect(rows.map((r) => r.file)).toEqual([...files].sort());
    for (const r of rows) {
      expect(r.error).toMatch(/no result within 0\.05 s/);
      expect(r.z).toBe('');
    }
  }, 60_000);
});
