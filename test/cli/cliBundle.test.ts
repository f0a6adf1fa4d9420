/**
 * The bundled command-line tools (scripts/cli-bundle.mjs): the source hash
 * sees every change of content, a new and a removed file; a build answers
 * --help and fits from JavaScript alone, the thread included, with the rows
 * the TypeScript sources give (the path the other fitter tests take); a
 * bundle built from the sources there are now is not built again.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
// @ts-expect-error plain JavaScript module without type declarations
import { buildCli, ensureCli, sourceHash } from '../../scripts/cli-bundle.mjs';
import { parseCatalogueCsv } from '../../src/core/table';

const ROOT = resolve(__dirname, '../..');

describe('sourceHash(root)', () => {
  it('changes with the content of any source, with a new file and with a removed one, and only then', () => {
    const root = mkdtempSync(join(tmpdir(), 'shiftmark-hash-'));
    mkdirSync(join(root, 'src', 'core'), { recursive: true });
    writeFileSync(join(root, 'src', 'core', 'a.ts'), 'export const a = 1;');
    writeFileSync(join(root, 'package-lock.json'), '{}');
    const h0 = sourceHash(root);
    expect(sourceHash(root)).toBe(h0);
    writeFileSync(join(root, 'src', 'core', 'a.ts'), 'export const a = 2;'); // same size, other content
    const h1 = sourceHash(root);
    expect(h1).not.toBe(h0);
    writeFileSync(join(root, 'src', 'b.ts'), '');
    const h2 = sourceHash(root);
    expect(h2).not.toBe(h1);
    rmSync(join(root, 'src', 'b.ts'));
    expect(sourceHash(root)).toBe(h1);
    writeFileSync(join(root, 'package-lock.json'), '{"lockfileVersion":3}');
    expect(sourceHash(root)).not.toBe(h1);
    rmSync(root, { recursive: true, force: true });
  });
});

describe('the bundle', () => {
  it('is built once, answers --help and fits (worker thread included) with the rows of the TypeScript sources', async () => {
    const outDir = mkdtempSync(join(tmpdir(), 'shiftmark-bundle-'));
    const quiet = () => undefined;
    await buildCli({ outDir });
    expect(await ensureCli({ outDir, log: quiet })).toBe(false); // built from these very sources
    const help = execFileSync(process.execPath, [join(outDir, 'fit.mjs'), '--help'], { encoding: 'utf8' });
    expect(help).toMatch(/^usage: npm run fit -- <files or folders\.\.\.>/);
    const files = ['sample-spectra/mrx-0877.csv', 'sample-spectra/broken/empty.csv'];
    execFileSync(process.execPath, [join(outDir, 'fit.mjs'), ...files, '--out', join(outDir, 'b.csv'), '--jobs', '1', '--quiet'], { cwd: ROOT });
    execFileSync(join(ROOT, 'node_modules', '.bin', 'tsx'), ['src/cli/fit.ts', ...files, '--out', join(outDir, 't.csv'), '--jobs', '1', '--quiet'], { cwd: ROOT });
    const bundled = parseCatalogueCsv(readFileSync(join(outDir, 'b.csv'), 'utf8'));
    const fromSources = parseCatalogueCsv(readFileSync(join(outDir, 't.csv'), 'utf8'));
    expect(bundled.rows).toEqual(fromSources.rows);
    expect(bundled.rows.map((r) => [r.file, r.error === ''])).toEqual([
      ['empty.csv', false],
      ['mrx-0877.csv', true],
    ]);
    rmSync(outDir, { recursive: true, force: true });
  }, 120_000);
});
