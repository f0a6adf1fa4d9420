/**
 * Headless fitter: `npm run fit -- <files or folders...> --out table.csv`.
 * One row per input file, in input order; an unreadable file gets a row with
 * its reason in `error` and never stops the batch. Rows stream to the output
 * as they finish (in order), so memory stays flat for any batch size.
 */
import { availableParallelism } from 'node:os';
import { createWriteStream, type WriteStream } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { UsageError } from './args';
import { FIT_USAGE, parseFitOptions } from './options';
import { expandInputs } from './walk';
import { listFingerprint, selectShard } from './shard';
import { JobFailure, ThreadPool } from './threadPool';
import { failedResult } from '../core/failedResult';
import { automaticRow, catalogueTableWriter } from '../core/table';
import { SOFTWARE_NAME, SOFTWARE_VERSION } from '../core/version';
import type { FitJob, FitJobResult } from './fitThread';

async function main(argv: string[]): Promise<number> {
  const options = parseFitOptions(argv, availableParallelism());
  if (options === 'help') {
    process.stdout.write(FIT_USAGE + '\n');
    return 0;
  }
  const { out: outPath, format, jobs, timeLimitS, cosmology, shard, headerBlock, quiet } = options;
  // The engine (for its version and template set id) loads only for a real run: --help and option errors answer at once.
  const { ENGINE_VERSION, TEMPLATE_SET_ID } = await import('../core/engine');
  const all = expandInputs(options.inputs);
  const files = selectShard(all, shard);

  const out: WriteStream | NodeJS.WriteStream = outPath ? createWriteStream(outPath) : process.stdout;
  // A closed pipe (e.g. `| head`) ends the run quietly rather than with a stack trace.
  out.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(0);
    process.stderr.write(`error: cannot write ${outPath ?? 'standard output'}: ${e.message}\n`);
    process.exit(1);
  });
  const writer = catalogueTableWriter(format, {
    software: SOFTWARE_NAME,
    version: SOFTWARE_VERSION,
    templateSet: TEMPLATE_SET_ID,
    cosmology,
    createdAt: new Date().toISOString(),
    headerBlock,
    extra: { engine: ENGINE_VERSION, shard: `${shard.index}/${shard.count}`, inputs_total: String(all.length), input_list: listFingerprint(all) },
  });
  const write = (s: string) => new Promise<void>((res) => (out.write(s) ? res() : out.once('drain', () => res())));
  await write(writer.begin());

  const bootUrl = new URL('./tsWorker.mjs', import.meta.url);
  const entry = new URL('./fitThread.ts', import.meta.url).href;
  const pool = new ThreadPool<FitJob, FitJobResult>({
    size: Math.min(jobs, Math.max(1, files.length)),
    timeLimitMs: timeLimitS * 1000,
    spawn: () => new Worker(bootUrl, { workerData: { entry } }),
  });

  const started = Date.now();
  let done = 0;
  let failed = 0;
  const tty = process.stderr.isTTY;
  let lastReport = 0;
  const progress = (final = false) => {
    if (quiet) return;
    // On a terminal one line rewritten in place; in a log file a line every few seconds.
    if (!tty && !final && Date.now() - lastReport < 5000) return;
    lastReport = Date.now();
    const rate = done / Math.max(1e-3, (Date.now() - started) / 1000);
    const peakMb = process.resourceUsage().maxRSS / 1024; // kilobytes -> MB; covers every worker thread
    const text = `fitted ${done}/${files.length}, ${failed} failed, ${rate.toFixed(1)} spectra/s, peak memory ${peakMb.toFixed(0)} MB`;
    process.stderr.write(tty ? `\r${text}${final ? '\n' : ''}` : `${text}\n`);
  };

  // Bounded window: at most `window` files in flight or waiting to be written in order.
  const window = Math.max(4 * jobs, 16);
  const inFlight = new Map<number, Promise<Record<string, unknown>>>();
  let next = 0;
  const launch = (k: number) => {
    const path = files[k];
    inFlight.set(
      k,
      pool.run({ path, cosmology }).then(
        (r) => r.row,
        (e: Error) => {
          const status = e instanceof JobFailure && e.kind === 'timeout' ? 'timeout' : 'failed';
          return automaticRow(failedResult(path, `${path}: ${e.message}`, status), cosmology) as unknown as Record<string, unknown>;
        },
      ),
    );
  };
  while (next < files.length && next < window) launch(next++);
  for (let k = 0; k < files.length; k++) {
    const row = await inFlight.get(k)!;
    inFlight.delete(k);
    if (next < files.length) launch(next++);
    done++;
    if (row.error) failed++;
    await write(writer.row(row));
    progress();
  }
  await write(writer.end());
  progress(true);
  await pool.close();
  if (outPath) await new Promise<void>((res) => (out as WriteStream).end(res));
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (e: Error) => {
    process.stderr.write(`${e instanceof UsageError ? `error: ${e.message}\n${FIT_USAGE}` : `error: ${e.stack ?? e.message}`}\n`);
    process.exit(2);
  },
);
