/**
 * worker_threads entry for the headless fitter: reads one file, fits it with
 * the same core call the browser worker makes, and sends back the table row.
 * A first look at a multi-object file sends back the ids of its spectra
 * instead; each id then comes back as a job of its own.
 */
import { parentPort } from 'node:worker_threads';
import { readFileSync } from 'node:fs';
import { fitBytes, fitOrSplit, failedResult } from '../core/pipeline';
import { automaticRow, lineRows } from '../core/table';
import type { CosmologyParams, FitResult } from '../core/types';
import { FitWorkspace } from '../core/engine/workspace';

/** This thread's engine workspace: FFT plans and template transforms reused from file to file. */
const workspace = new FitWorkspace();

export interface FitJob {
  /** Where to read the file. */
  path: string;
  /**
   * Its name in the table (walk.ts: relative to the given input, as the
   * browser writes it); for one spectrum of a multi-object file, its id `name#n`.
   */
  name: string;
  cosmology: CosmologyParams;
  /** True for the first look at a file: a multi-object file answers with its spectra's ids. */
  firstLook?: boolean;
}

export type FitJobResult =
  | {
      row: Record<string, unknown>;
      /** The line-table rows of the fit (empty when it failed). */
      lines: Record<string, unknown>[];
    }
  | { split: string[] };

/** The file read last: the spectra of one plate come one after another, so it is read from disk once per thread. */
let lastFile: { path: string; bytes: Uint8Array } | null = null;

function readBytes(path: string): Uint8Array {
  if (lastFile?.path === path) return lastFile.bytes;
  const b = readFileSync(path);
  const bytes = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  lastFile = { path, bytes };
  return bytes;
}

parentPort!.on('message', (job: FitJob) => {
  let result: FitResult;
  try {
    const bytes = readBytes(job.path);
    if (job.firstLook) {
      const work = fitOrSplit(bytes, job.name, { workspace });
      if (work.kind === 'split') {
        parentPort!.postMessage({ split: work.ids } satisfies FitJobResult);
        return;
      }
      result = work.result;
    } else {
      result = fitBytes(bytes, job.name, { workspace });
    }
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder' : `cannot read file (${code ?? (e as Error).message})`;
    result = failedResult(job.name, `${job.name}: ${reason}`);
  }
  if (job.firstLook) lastFile = null; // a one-spectrum file is not read again
  const reply: FitJobResult = {
    row: automaticRow(result, job.cosmology) as unknown as Record<string, unknown>,
    lines: lineRows(result) as unknown as Record<string, unknown>[],
  };
  parentPort!.postMessage(reply);
});
