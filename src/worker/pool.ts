/**
 * A pool of fit workers for a batch: a shared queue, a time limit per file
 * (a worker that runs past it is terminated and replaced, and the file is
 * marked 'timeout'), cancellation through AbortSignal, and a fresh worker
 * after any crash. The scheduling is the shared core in
 * src/core/pool/taskPool.ts; this file maps files, AbortSignal and outcomes
 * onto it. Workers come from an injected factory, so the pool is tested with
 * fakes and no real Worker.
 */
import type { FitResult } from '../core/types';
import { failedResult } from '../core/failedResult';
import type { FileWork } from '../core/pipeline';
import { TaskPool, type PoolEndpoint, type TaskOutcome } from '../core/pool/taskPool';

/** The part of a fit worker the pool uses. */
export interface PoolWorker {
  /** Fit the spectrum `file` names: a file's name, or `file#n` for one spectrum of a multi-object file. */
  fitFile(bytes: Uint8Array, file: string): Promise<FitResult>;
  /** First look at a file: its fit, or the ids of the spectra a multi-object file holds. Without it every file is one spectrum. */
  fitOrSplit?(bytes: Uint8Array, file: string): Promise<FileWork>;
  terminate(): void;
}

export type PoolWorkerFactory = () => PoolWorker;

export interface FitJob {
  /** Stable file key (see fileKey). */
  key: string;
  /** File name as the user gave it; for one spectrum of a multi-object file its id `file#n`. */
  file: string;
  /** A file not yet looked at: a multi-object file answers 'split' with its spectra's ids instead of a fit. */
  firstLook?: boolean;
  /** Bytes are fetched only when a worker is free, so a queued batch holds no file in memory. */
  loadBytes: () => Promise<Uint8Array>;
}

export type PoolOutcome = { kind: 'result'; result: FitResult } | { kind: 'split'; ids: string[] } | { kind: 'cancelled' };

export interface PoolOptions {
  /** Number of workers, >= 1. */
  size: number;
  createWorker: PoolWorkerFactory;
  /** Per-file time limit, milliseconds. */
  timeLimitMs: number;
}

/** Per-file time limit used by the app, ms: far above a normal fit (well under a second). */
export const DEFAULT_TIME_LIMIT_MS = 30_000;

/**
 * Workers for fitting: one per core, less one for the page on machines with
 * more than two cores, at most 8. On one or two cores every core fits: the page
 * thread needs little CPU while fits run (they never block it), and idling a
 * core would halve the throughput. (The review loop has its own worker.)
 */
export function defaultPoolSize(hardwareConcurrency: number | undefined): number {
  const cores = hardwareConcurrency && hardwareConcurrency > 0 ? Math.floor(hardwareConcurrency) : 2;
  return Math.min(8, cores <= 2 ? cores : cores - 1);
}

/** A TaskPool endpoint over one fit worker. */
function fitEndpoint(worker: PoolWorker): PoolEndpoint<FitInput, FileWork> {
  return {
    run: ({ bytes, file, firstLook }) =>
      firstLook && worker.fitOrSplit ? worker.fitOrSplit(bytes, file) : worker.fitFile(bytes, file).then((result): FileWork => ({ kind: 'fitted', result })),
    terminate: () => worker.terminate(),
  };
}

interface FitInput {
  bytes: Uint8Array;
  file: string;
  firstLook: boolean;
}

/** What a task's outcome means for one file. */
function outcomeOf(o: TaskOutcome<FileWork>, file: string): PoolOutcome {
  switch (o.kind) {
    case 'done':
      return o.output.kind === 'split' ? { kind: 'split', ids: o.output.ids } : { kind: 'result', result: o.output.result };
    case 'timeout':
      return { kind: 'result', result: failedResult(file, `${file}: fit stopped after the time limit of ${(o.limitMs / 1000).toFixed(1)} s`, 'timeout') };
    case 'crash':
      return { kind: 'result', result: failedResult(file, `${file}: worker failed: ${o.message}`) };
    case 'input-failed':
      return { kind: 'result', result: failedResult(file, `${file}: stored bytes could not be read: ${o.message}`) };
    case 'cancelled':
      return { kind: 'cancelled' };
  }
}

/** The browser's adapter over the shared TaskPool core (src/core/pool): Web Workers, AbortSignal, FitResult. */
export class FitPool {
  private readonly core: TaskPool<FitInput, FileWork>;

  constructor(options: PoolOptions) {
    this.core = new TaskPool<FitInput, FileWork>({
      size: options.size,
      timeLimitMs: options.timeLimitMs,
      createEndpoint: () => fitEndpoint(options.createWorker()),
      startTimer: (ms, onExpire) => {
        const timer = setTimeout(onExpire, ms);
        return () => clearTimeout(timer);
      },
    });
  }

  /** Workers created so far (the first ones plus replacements); for tests and diagnostics. */
  get workersCreated(): number {
    return this.core.endpointsCreated;
  }

  /** Files waiting for a worker. */
  get waiting(): number {
    return this.core.waiting;
  }

  /** Files being fitted now. */
  get running(): number {
    return this.core.running;
  }

  /** Queue one file or spectrum; resolves with its FitResult (never rejects), its spectra's ids (a first look at a multi-object file) or 'cancelled'. */
  fit(job: FitJob, signal?: AbortSignal): Promise<PoolOutcome> {
    if (signal?.aborted) return Promise.resolve({ kind: 'cancelled' });
    const task = this.core.submit(() => job.loadBytes().then((bytes) => ({ bytes, file: job.file, firstLook: job.firstLook === true })));
    if (signal) {
      const onAbort = () => task.cancel();
      signal.addEventListener('abort', onAbort, { once: true });
      void task.outcome.then(() => signal.removeEventListener('abort', onAbort));
    }
    return task.outcome.then((o) => outcomeOf(o, job.file));
  }

  /** Terminate every worker; queued and running files resolve as cancelled. */
  dispose(): void {
    void this.core.dispose();
  }
}
