/**
 * worker_threads entry for the headless fitter: reads one file, fits it with
 * the same core call the browser worker makes, and sends back the table row.
 */
import { parentPort } from 'node:worker_threads';
import { readFileSync } from 'node:fs';
import { fitBytes, failedResult } from '../core/pipeline';
import { automaticRow } from '../core/table';
import type { CosmologyParams } from '../core/types';
import { FitWorkspace } from '../core/engine/workspace';

/** This thread's engine workspace: FFT plans and template transforms reused from file to file. */
const workspace = new FitWorkspace();

export interface FitJob {
  path: string;
  cosmology: CosmologyParams;
}

export interface FitJobResult {
  row: Record<string, unknown>;
}

parentPort!.on('message', (job: FitJob) => {
  let bytes: Uint8Array;
  let result;
  try {
    bytes = readFileSync(job.path);
    result = fitBytes(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), job.path, { workspace });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder' : `cannot read file (${code ?? (e as Error).message})`;
    result = failedResult(job.path, `${job.path}: ${reason}`);
  }
  const reply: FitJobResult = { row: automaticRow(result, job.cosmology) as unknown as Record<string, unknown> };
  parentPort!.postMessage(reply);
});
