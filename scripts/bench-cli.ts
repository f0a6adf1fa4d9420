/**
 * Headless-fitter benchmark: writes N simulated ~4,600-pixel spectra (all
 * classes, quasars to z 5.5; 3600-10400 A at 1e-4 in log10) as FITS images to
 * a temporary folder, runs `npm run fit` on them with every core, and prints
 * spectra per second and peak memory. With --big it also streams 10,000 inputs
 * (the same files linked ten times over) to show memory stays flat.
 *
 *   npx tsx scripts/bench-cli.ts [--n 1000] [--big]
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, symlinkSync, writeFileSync, mkdirSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { simulateBatchItem } from '../src/core/sim';
import { writeFitsFile, writeImageHdu } from '../src/core/io/fits/write';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');

export interface CliBenchRow {
  inputs: number;
  seconds: number;
  spectraPerS: number;
  peakMb: number;
}

function writeSpectra(dir: string, n: number): string[] {
  const grid = { kind: 'log10' as const, startA: 3600, endA: 10400, dLog10: 1e-4 };
  const names: string[] = [];
  for (let i = 0; i < n; i++) {
    const s = simulateBatchItem(i, 2029, { grid });
    const sp = s.spectrum;
    const name = `${s.truth.objectId}.fits`;
    const bytes = writeFitsFile([
      writeImageHdu({
        data: Float32Array.from(sp.flux),
        primary: true,
        cards: [
          ['CTYPE1', 'WAVE-LOG'],
          ['CUNIT1', 'Angstrom'],
          ['CRPIX1', 1],
          ['CRVAL1', sp.wavelengthA[0]],
          ['CDELT1', sp.wavelengthA[0] * Math.LN10 * 1e-4],
          ['OBJECT', s.truth.objectId],
        ],
      }),
      writeImageHdu({ data: Float32Array.from(sp.ivar ?? new Float64Array(sp.flux.length)), extname: 'IVAR', primary: false }),
    ]);
    writeFileSync(join(dir, name), bytes);
    names.push(name);
  }
  return names;
}

/** Run the fitter as a user would and read its closing progress line (which reports peak memory). */
function runFit(inputDir: string, out: string): { seconds: number; peakMb: number } {
  const t0 = performance.now();
  // As `npm run fit` runs it: the bundle (scripts/cli-bundle.mjs), built beforehand if stale.
  const r = spawnSync(process.execPath, ['scripts/cli-bundle.mjs', 'run', 'fit', inputDir, '--out', out], {
    cwd: ROOT,
    encoding: 'utf8',
    stdio: ['ignore', 'ignore', 'pipe'],
    maxBuffer: 64 * 1024 * 1024,
  });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`fit failed: ${r.stderr}`);
  const m = /peak memory (\d+) MB\s*$/.exec(r.stderr.trim());
  return { seconds, peakMb: m ? Number(m[1]) : NaN };
}

export function benchCli(options: { n?: number; big?: boolean; log?: (s: string) => void } = {}): CliBenchRow[] {
  const log = options.log ?? console.log;
  const n = options.n ?? 1000;
  const tmp = mkdtempSync(join(tmpdir(), 'shiftmark-bench-'));
  const rows: CliBenchRow[] = [];
  try {
    const base = join(tmp, 'spectra');
    mkdirSync(base);
    log(`writing ${n} simulated spectra (FITS, ~4,600 pixels each)...`);
    const names = writeSpectra(base, n);
    const sets: [string, number][] = [[base, n]];
    if (options.big) {
      const big = join(tmp, 'big');
      mkdirSync(big);
      for (let k = 0; k < 10_000; k++) symlinkSync(join(base, names[k % names.length]), join(big, `${String(k).padStart(5, '0')}-${names[k % names.length]}`));
      sets.push([big, 10_000]);
    }
    for (const [dir, count] of sets) {
      const { seconds, peakMb } = runFit(dir, join(tmp, `out-${count}.csv`));
      const row = { inputs: count, seconds, spectraPerS: count / seconds, peakMb };
      log(`headless fitter, ${count} inputs, ${availableParallelism()} threads: ${row.spectraPerS.toFixed(1)} spectra/s, ${seconds.toFixed(1)} s, peak memory ${peakMb} MB`);
      rows.push(row);
    }
  } finally {
    rmSync(tmp, { recursive: true, force: true });
  }
  return rows;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const k = process.argv.indexOf('--n');
  benchCli({ n: k > 0 ? Number(process.argv[k + 1]) : 1000, big: process.argv.includes('--big') });
}
