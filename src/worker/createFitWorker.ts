/**
 * Real browser workers for the pool and for the review loop. Vite bundles
 * fitWorker.ts as a module worker from this `new URL(...)` form.
 */
import { transfer, wrap, type Remote } from 'comlink';
import type { FitResult } from '../core/types';
import type { FileWork } from '../core/pipeline';
import type { FitWorkerApi } from './fitWorkerApi';
import type { PoolWorker } from './pool';

export interface FitWorkerHandle {
  api: Remote<FitWorkerApi>;
  terminate(): void;
}

export function createFitWorker(): FitWorkerHandle {
  const worker = new Worker(new URL('./fitWorker.ts', import.meta.url), { type: 'module', name: 'shiftmark-fit' });
  const api = wrap<FitWorkerApi>(worker);
  return { api, terminate: () => worker.terminate() };
}

/** A pool worker over a real Worker. */
export function createPoolWorker(): PoolWorker {
  return poolWorkerOver(createFitWorker());
}

/**
 * A pool worker over any comlink link to the fit worker API (a real Worker in
 * the app, a MessageChannel in tests). The pool loads a fresh copy of the
 * bytes per file, so they move to the worker rather than being copied: the
 * caller's buffer is empty afterwards.
 */
export function poolWorkerOver({ api, terminate }: FitWorkerHandle): PoolWorker {
  return {
    fitFile: (bytes, file) => api.fitFile(transfer(bytes, [bytes.buffer as ArrayBuffer]), file) as Promise<FitResult>,
    fitOrSplit: (bytes, file) => api.fitOrSplit(transfer(bytes, [bytes.buffer as ArrayBuffer]), file) as Promise<FileWork>,
    terminate,
  };
}
