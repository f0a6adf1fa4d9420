/**
 * Reader throughput: every file of the demo set (sample-spectra/, when present)
 * and of the real survey spectra (test/data/real-spectra/csv and fits), read
 * with readSpectra from memory (a multi-object file gives each of its
 * spectra), repeated until each set has run for a while. Prints spectra per
 * second and MB per second per set.
 *
 *   npx tsx scripts/bench-read.ts [--seconds 1]
 *
 * Figures depend on the machine and its load; they are for comparing versions,
 * not promises.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'fflate';
import { readSpectra } from '../src/core/io/readSpectra';
import { SpectrumReadError } from '../src/core/types';
import { listDemoFiles } from './demoSetPlugin';

export interface ReadBenchRow {
  set: string;
  files: number;
  /** Spectra (and failed rows) one pass gives: a multi-object file counts each of its rows. */
  spectra: number;
  /** Total size of one pass over the set, bytes. */
  bytes: number;
  /** Files or rows that failed to read (each with its reason in `errors`, first 3 kept). */
  failures: number;
  errors: string[];
  passes: number;
  seconds: number;
  spectraPerS: number;
  /** Input megabytes (1e6 bytes) per second, as stored (compressed size for .gz). */
  mbPerS: number;
}

export interface ReadBenchOptions {
  /** Repository root; default: the folder above scripts/. */
  root?: string;
  /** Minimum run time per set, seconds (default 1). */
  minSeconds?: number;
  log?: (line: string) => void;
}

interface FileSet {
  set: string;
  files: { name: string; bytes: Uint8Array }[];
}

function filesIn(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir)
    .filter((n) => !n.startsWith('.') && statSync(join(dir, n)).isFile())
    .sort()
    .map((n) => join(dir, n));
}

function loadSets(root: string): FileSet[] {
  const sets: FileSet[] = [];
  const samples = join(root, 'sample-spectra');
  if (existsSync(samples)) {
    const names = listDemoFiles(samples);
    sets.push({ set: 'sample-spectra', files: names.map((n) => ({ name: n, bytes: readFileSync(join(samples, n)) })) });
  }
  const real = join(root, 'test', 'data', 'real-spectra');
  const csv = filesIn(join(real, 'csv')).map((p) => ({ name: p, bytes: new Uint8Array(readFileSync(p)) }));
  if (csv.length) {
    sets.push({ set: 'real csv', files: csv });
    sets.push({ set: 'real csv.gz (gzipped in memory)', files: csv.map((f) => ({ name: `${f.name}.gz`, bytes: gzipSync(f.bytes) })) });
  }
  const fits = filesIn(join(real, 'fits')).map((p) => ({ name: p, bytes: new Uint8Array(readFileSync(p)) }));
  if (fits.length) sets.push({ set: 'real fits', files: fits });
  return sets.filter((s) => s.files.length > 0);
}

function runSet(s: FileSet, minSeconds: number): ReadBenchRow {
  const bytes = s.files.reduce((a, f) => a + f.bytes.length, 0);
  let failures = 0;
  const errors: string[] = [];
  let spectra = 0;
  // One untimed pass: warms the JIT and counts spectra and failures once.
  for (const f of s.files) {
    for (const item of readSpectra(f.bytes, f.name)) {
      spectra++;
      if (item instanceof SpectrumReadError) {
        failures++;
        if (errors.length < 3) errors.push(item.message);
      }
    }
  }
  let passes = 0;
  const t0 = performance.now();
  let elapsedS = 0;
  do {
    for (const f of s.files) readSpectra(f.bytes, f.name);
    passes++;
    elapsedS = (performance.now() - t0) / 1000;
  } while (elapsedS < minSeconds);
  const n = passes * spectra;
  return {
    set: s.set,
    files: s.files.length,
    spectra,
    bytes,
    failures,
    errors,
    passes,
    seconds: elapsedS,
    spectraPerS: n / elapsedS,
    mbPerS: (passes * bytes) / 1e6 / elapsedS,
  };
}

/** Run the reader benchmark over every set found; returns one row per set and logs a table. */
export function benchRead(options: ReadBenchOptions = {}): ReadBenchRow[] {
  const root = options.root ?? resolve(dirname(fileURLToPath(import.meta.url)), '..');
  const log = options.log ?? ((line: string) => console.log(line));
  const minSeconds = options.minSeconds ?? 1;
  const sets = loadSets(root);
  if (sets.length === 0) {
    log('bench-read: no spectra found (sample-spectra/ or test/data/real-spectra/)');
    return [];
  }
  log('set                              files spectra      MB  failed  passes  spectra/s    MB/s');
  const rows: ReadBenchRow[] = [];
  for (const s of sets) {
    const r = runSet(s, minSeconds);
    rows.push(r);
    log(
      `${r.set.padEnd(32)} ${String(r.files).padStart(5)} ${String(r.spectra).padStart(7)} ${(r.bytes / 1e6).toFixed(2).padStart(7)} ${String(r.failures).padStart(7)} ${String(r.passes).padStart(7)} ${r.spectraPerS.toFixed(0).padStart(10)} ${r.mbPerS.toFixed(1).padStart(7)}`,
    );
    for (const e of r.errors) log(`  failed: ${e}`);
  }
  return rows;
}

const invokedDirectly = process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (invokedDirectly) {
  const i = process.argv.indexOf('--seconds');
  const minSeconds = i > 0 ? Number(process.argv[i + 1]) : 1;
  if (!(minSeconds > 0)) {
    console.error('bench-read: --seconds needs a positive number');
    process.exit(2);
  }
  benchRead({ minSeconds });
}
