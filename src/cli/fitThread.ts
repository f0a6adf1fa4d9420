/**
 * worker_threads entry for the headless fitter: reads one file, fits it with
 * the same core call the browser worker makes, and sends back the table row.
 */
import { parentPort } from 'node:worker_threads';
import { readFileSync } from 'node:fs';
import { fitBytes, failedResult } from '../core/pipeline';
import { automaticRow, lineRows } from '../core/table';
import type { CosmologyParams } from '../core/types';
import { FitWorkspace } from '../core/engine/workspace';

/** This thread's engine workspace: FFT plans and template transforms reused from file to file. */
const workspace = new FitWorkspace();

export interface FitJob {
  /** Where to read the file. */
  path: string;
  /** Its name in the table (walk.ts: relative to the given input, as the browser writes it). */
  name: string;
  cosmology: CosmologyParams;
}

export interface FitJobResult {
  row: Record<string, unknown>;
  /** The line-table rows of the fit (empty when it failed). */
  lines: Record<string, unknown>[];
}

parentPort!.on('message', (job: FitJob) => {
  let bytes: Uint8Array;
  let result;
  try {
    bytes = readFileSync(job.path);
    result = fitBytes(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), job.name, { workspace });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder' : `cannot read file (${code ?? (e as Error).message})`;
    result = failedResult(job.name, `${job.name}: ${reason}`);
  }
  const reply: FitJobResult = {
    row: automaticRow(result, job.cosmology) as unknown as Record<string, unknown>,
    lines: lineRows(result) as unknown as Record<string, unknown>[],
  };
  parentPort!.postMessage(reply);
});
