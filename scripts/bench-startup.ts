/**
 * Start-up of one fitter task, as a scheduler's array task pays it: the wall
 * time of `npm run fit -- --help`, and the time from starting
 * `npm run fit -- <one demo file>` to its first result row on standard output
 * (the whole start-up: npm, Node, loading the code, a worker thread, one fit).
 * Median of a few runs; printed, never asserted.
 *
 *   npx tsx scripts/bench-startup.ts [--runs 5]
 */
import { spawn } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const NPM = process.platform === 'win32' ? 'npm.cmd' : 'npm';

export interface StartupFigures {
  helpS: number;
  firstRowS: number;
}

/** Seconds from spawning the command to `done(stdoutSoFar)` being true (or its exit). */
function timeUntil(args: string[], done: (out: string) => boolean): Promise<number> {
  return new Promise((resolveTime, reject) => {
    const t0 = performance.now();
    const child = spawn(NPM, args, { cwd: ROOT, stdio: ['ignore', 'pipe', 'ignore'] });
    let out = '';
    let reported = false;
    const report = () => {
      if (reported) return;
      reported = true;
      resolveTime((performance.now() - t0) / 1000);
    };
    child.stdout.setEncoding('utf8');
    child.stdout.on('data', (chunk: string) => {
      out += chunk;
      if (done(out)) report();
    });
    child.on('error', reject);
    child.on('close', report);
  });
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** A data row: a line after the header row (CSV, no '#' block lines). */
const hasFirstRow = (out: string) => out.split('\n').filter((l) => l && !l.startsWith('#')).length >= 2;

export async function benchStartup(options: { runs?: number; log?: (s: string) => void } = {}): Promise<StartupFigures> {
  const log = options.log ?? console.log;
  const runs = options.runs ?? 5;
  const help: number[] = [];
  const first: number[] = [];
  // One run first, unmeasured: a build on first use and a cold disk cache are not start-up.
  await timeUntil(['run', '--silent', 'fit', '--', '--help'], () => false);
  for (let i = 0; i < runs; i++) {
    help.push(await timeUntil(['run', '--silent', 'fit', '--', '--help'], () => false));
    first.push(await timeUntil(['run', '--silent', 'fit', '--', 'sample-spectra/mrx-0877.csv', '--jobs', '1', '--quiet'], hasFirstRow));
  }
  const figures = { helpS: median(help), firstRowS: median(first) };
  log(`start-up of one task (median of ${runs}): npm run fit -- --help ${figures.helpS.toFixed(2)} s; first result row of one file ${figures.firstRowS.toFixed(2)} s`);
  return figures;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const k = process.argv.indexOf('--runs');
  await benchStartup({ runs: k > 0 ? Number(process.argv[k + 1]) : 5 });
}
