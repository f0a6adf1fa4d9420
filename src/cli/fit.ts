/**
 * Headless fitter: `npm run fit -- <files or folders...> --out table.csv`.
 * One row per spectrum, in input order: a file of one spectrum is one row, a
 * multi-object file one row per target spectrum (`file#n`, see
 * core/pipeline.ts), each fitted as its own job. An unreadable file or row
 * gets a row with its reason in `error` and never stops the batch; when every
 * row failed the run ends with exit status 1. CSV and JSON rows stream to
 * the output as they finish (in order), so memory stays flat for any batch
 * size; FITS and VOTable are sized from all rows, so they are written at the end.
 * A missing input path, or inputs that hold no file, stop the run before any
 * work with a message naming the input and exit status 2.
 */
import { availableParallelism } from 'node:os';
import { createWriteStream, type WriteStream } from 'node:fs';
import { Worker } from 'node:worker_threads';
import { UsageError } from './args';
import { FIT_USAGE, parseFitOptions } from './options';
import { expandInputFiles, InputError } from './walk';
import { listFingerprint, selectShard } from './shard';
import { JobFailure, ThreadPool } from './threadPool';
import { failedResult } from '../core/failedResult';
import {
  AUTOMATIC_COLUMNS,
  LINE_COLUMNS,
  automaticRow,
  catalogueFits,
  catalogueTableWriter,
  catalogueVotable,
  csvWriter,
  type ExportMeta,
  type TableRow,
  type TableWriter,
} from '../core/table';
import { SOFTWARE_NAME, SOFTWARE_VERSION } from '../core/version';
import { ENGINE_VERSION, TEMPLATE_SET_ID } from '../core/engine/version';
import type { FitJob, FitJobResult } from './fitThread';

/**
 * A fit thread. Run from the bundle (scripts/cli-bundle.mjs: npm run fit),
 * this module is fit.mjs and the thread's own bundle lies beside it; run from
 * the sources under tsx (the tests), Node 20 does not pass tsx's loader on to
 * worker_threads, so the thread boots through tsWorker.mjs, which registers it.
 */
function spawnFitThread(): Worker {
  if (import.meta.url.endsWith('.mjs')) return new Worker(new URL('./fitThread.mjs', import.meta.url));
  return new Worker(new URL('./tsWorker.mjs', import.meta.url), { workerData: { entry: new URL('./fitThread.ts', import.meta.url).href } });
}

async function main(argv: string[]): Promise<number> {
  const options = parseFitOptions(argv, availableParallelism());
  if (options === 'help') {
    process.stdout.write(FIT_USAGE + '\n');
    return 0;
  }
  const { out: outPath, format, jobs, timeLimitS, cosmology, shard, headerBlock, quiet, lines: linesPath } = options;
  // Inputs are checked before the engine loads: a mistyped path answers at once.
  const all = expandInputFiles(options.inputs);
  const files = selectShard(all, shard);

  const open = (path: string | undefined): WriteStream | NodeJS.WriteStream => {
    const stream = path ? createWriteStream(path) : process.stdout;
    // A closed pipe (e.g. `| head`) ends the run quietly rather than with a stack trace.
    stream.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EPIPE') process.exit(0);
      process.stderr.write(`error: cannot write ${path ?? 'standard output'}: ${e.message}\n`);
      process.exit(1);
    });
    return stream;
  };
  const out = open(outPath);
  const linesOut = linesPath !== undefined ? open(linesPath) : undefined;
  const meta: ExportMeta = {
    software: SOFTWARE_NAME,
    version: SOFTWARE_VERSION,
    templateSet: TEMPLATE_SET_ID,
    cosmology,
    createdAt: new Date().toISOString(),
    extra: {
      engine: ENGINE_VERSION,
      shard: `${shard.index}/${shard.count}`,
      inputs_total: String(all.length),
      input_list: listFingerprint(all.map((f) => f.name)),
    },
  };
  // csv and json stream; fits and votable collect the rows (and line rows, their second table) and are written at the end.
  const streaming = format === 'csv' || format === 'json';
  const writer: TableWriter | undefined = streaming ? catalogueTableWriter(format, { ...meta, headerBlock, lines: format === 'json' }) : undefined;
  const linesWriter = linesOut ? csvWriter(LINE_COLUMNS, meta, { headerBlock }) : undefined;
  const collected: TableRow[] = [];
  const collectedLines: TableRow[] = [];
  const writeTo = (stream: WriteStream | NodeJS.WriteStream, s: string | Uint8Array) =>
    new Promise<void>((res) => (stream.write(s) ? res() : stream.once('drain', () => res())));
  const write = (s: string | Uint8Array) => writeTo(out, s);
  if (writer) await write(writer.begin());
  if (linesOut && linesWriter) await writeTo(linesOut, linesWriter.begin());

  const pool = new ThreadPool<FitJob, FitJobResult>({
    size: Math.min(jobs, Math.max(1, files.length)),
    timeLimitMs: timeLimitS * 1000,
    spawn: spawnFitThread,
  });

  const started = Date.now();
  let done = 0;
  let failed = 0;
  let filesDone = 0;
  const tty = process.stderr.isTTY;
  let lastReport = 0;
  const progress = (final = false) => {
    if (quiet) return;
    // On a terminal one line rewritten in place; in a log file a line every few seconds.
    if (!tty && !final && Date.now() - lastReport < 5000) return;
    lastReport = Date.now();
    const rate = done / Math.max(1e-3, (Date.now() - started) / 1000);
    const peakMb = process.resourceUsage().maxRSS / 1024; // kilobytes -> MB; covers every worker thread
    const text = `fitted ${done} spectra from ${filesDone}/${files.length} files, ${failed} failed, ${rate.toFixed(1)} spectra/s, peak memory ${peakMb.toFixed(0)} MB`;
    process.stderr.write(tty ? `\r${text}${final ? '\n' : ''}` : `${text}\n`);
  };

  type Fitted = { row: Record<string, unknown>; lines: Record<string, unknown>[] };
  /** One unit of work (a file's first look, or one spectrum of a multi-object file); never rejects. */
  const runJob = (job: FitJob): Promise<FitJobResult> =>
    pool.run(job).then(
      (r) => r,
      (e: Error) => {
        const status = e instanceof JobFailure && e.kind === 'timeout' ? 'timeout' : 'failed';
        const row = automaticRow(failedResult(job.name, `${job.name}: ${e.message}`, status), cosmology) as unknown as Record<string, unknown>;
        return { row, lines: [] };
      },
    );
  /** A file's rows: its one fit, or one fit per spectrum of a multi-object file (each its own job), in file order. */
  const fitFile = async (path: string, name: string): Promise<Fitted[]> => {
    const first = await runJob({ path, name, cosmology, firstLook: true });
    if (!('split' in first)) return [first];
    return Promise.all(first.split.map((id) => runJob({ path, name: id, cosmology }) as Promise<Fitted>));
  };

  // Bounded window: at most `window` files in flight or waiting to be written in order.
  const window = Math.max(4 * jobs, 16);
  const inFlight = new Map<number, Promise<Fitted[]>>();
  let next = 0;
  const launch = (k: number) => inFlight.set(k, fitFile(files[k].path, files[k].name));
  while (next < files.length && next < window) launch(next++);
  for (let k = 0; k < files.length; k++) {
    const fitted = await inFlight.get(k)!;
    inFlight.delete(k);
    if (next < files.length) launch(next++);
    filesDone++;
    for (const { row, lines } of fitted) {
      done++;
      if (row.error) failed++;
      if (writer) await write(writer.row(row, lines));
      else {
        collected.push(row as TableRow);
        collectedLines.push(...(lines as TableRow[]));
      }
      if (linesOut && linesWriter) for (const l of lines) await writeTo(linesOut, linesWriter.row(l));
    }
    progress();
  }
  if (writer) await write(writer.end());
  else if (format === 'fits') await write(catalogueFits(collected, AUTOMATIC_COLUMNS, meta, collectedLines));
  else await write(catalogueVotable(collected, AUTOMATIC_COLUMNS, meta, collectedLines));
  progress(true);
  await pool.close();
  const close = (stream: WriteStream | NodeJS.WriteStream) => new Promise<void>((res) => (stream as WriteStream).end(res));
  if (outPath) await close(out);
  if (linesOut) await close(linesOut);
  if (done > 0 && failed === done) {
    // A table of errors only is no catalogue: say so, and let a script (or a scheduler's afterok) see it.
    process.stderr.write(`error: none of the ${done} spectra in ${files.length} file${files.length === 1 ? '' : 's'} could be read and fitted; the error column of ${outPath ?? 'the table'} says why for each\n`);
    return 1;
  }
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (e: Error) => {
    const text =
      e instanceof UsageError ? `error: ${e.message}\n${FIT_USAGE}` : e instanceof InputError ? `error: ${e.message}` : `error: ${e.stack ?? e.message}`;
    process.stderr.write(`${text}\n`);
    process.exit(2);
  },
);
