/**
 * A pool of fit workers for a batch: a shared queue, a time limit per file
 * (a worker that runs past it is terminated and replaced, and the file is
 * marked 'timeout'), cancellation through AbortSignal, and a fresh worker
 * after any crash. Workers come from an injected factory, so the scheduling
 * is tested with fakes and no real Worker.
 */
import type { FitResult } from '../core/types';
import { failedResult } from '../core/failedResult';

/** The part of a fit worker the pool uses. */
export interface PoolWorker {
  fitFile(bytes: Uint8Array, file: string): Promise<FitResult>;
  terminate(): void;
}

export type PoolWorkerFactory = () => PoolWorker;

export interface FitJob {
  /** Stable file key (see fileKey). */
  key: string;
  /** File name as the user gave it. */
  file: string;
  /** Bytes are fetched only when a worker is free, so a queued batch holds no file in memory. */
  loadBytes: () => Promise<Uint8Array>;
}

export type PoolOutcome = { kind: 'result'; result: FitResult } | { kind: 'cancelled' };

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

interface Queued {
  job: FitJob;
  signal?: AbortSignal;
  resolve: (o: PoolOutcome) => void;
  onAbort?: () => void;
}

interface Slot {
  worker: PoolWorker | null;
  busy: boolean;
}

export class FitPool {
  private readonly slots: Slot[];
  private readonly queue: Queued[] = [];
  private disposed = false;
  /** Workers created so far (the first ones plus replacements); for tests and diagnostics. */
  workersCreated = 0;

  constructor(private readonly options: PoolOptions) {
    if (!(options.size >= 1)) throw new Error(`invalid pool size: ${options.size}`);
    if (!(options.timeLimitMs > 0)) throw new Error(`invalid time limit: ${options.timeLimitMs}`);
    this.slots = Array.from({ length: options.size }, () => ({ worker: null, busy: false }));
  }

  /** Files waiting for a worker. */
  get waiting(): number {
    return this.queue.length;
  }

  /** Files being fitted now. */
  get running(): number {
    return this.slots.filter((s) => s.busy).length;
  }

  /** Queue one file; resolves with its FitResult (never rejects) or 'cancelled'. */
  fit(job: FitJob, signal?: AbortSignal): Promise<PoolOutcome> {
    if (this.disposed) return Promise.resolve({ kind: 'cancelled' });
    if (signal?.aborted) return Promise.resolve({ kind: 'cancelled' });
    return new Promise<PoolOutcome>((resolve) => {
      const entry: Queued = { job, signal, resolve };
      if (signal) {
        entry.onAbort = () => {
          const i = this.queue.indexOf(entry);
          if (i >= 0) {
            this.queue.splice(i, 1);
            resolve({ kind: 'cancelled' });
          }
        };
        signal.addEventListener('abort', entry.onAbort, { once: true });
      }
      this.queue.push(entry);
      this.pump();
    });
  }

  /** Terminate every worker; queued files resolve as cancelled. */
  dispose(): void {
    this.disposed = true;
    for (const q of this.queue.splice(0)) {
      if (q.onAbort) q.signal?.removeEventListener('abort', q.onAbort);
      q.resolve({ kind: 'cancelled' });
    }
    for (const slot of this.slots) {
      slot.worker?.terminate();
      slot.worker = null;
    }
  }

  private pump(): void {
    for (const slot of this.slots) {
      if (slot.busy || this.disposed) continue;
      const next = this.queue.shift();
      if (!next) return;
      if (next.onAbort) next.signal?.removeEventListener('abort', next.onAbort);
      slot.busy = true;
      void this.runOn(slot, next).finally(() => {
        slot.busy = false;
        this.pump();
      });
    }
  }

  private workerFor(slot: Slot): PoolWorker {
    if (!slot.worker) {
      slot.worker = this.options.createWorker();
      this.workersCreated++;
    }
    return slot.worker;
  }

  /** Drop a worker that timed out, crashed or was cancelled mid-file; a fresh one is made when next needed. */
  private retire(slot: Slot, worker: PoolWorker): void {
    try {
      worker.terminate();
    } catch {
      /* already gone */
    }
    if (slot.worker === worker) slot.worker = null;
  }

  private async runOn(slot: Slot, { job, signal, resolve }: Queued): Promise<void> {
    let bytes: Uint8Array;
    try {
      bytes = await job.loadBytes();
    } catch (e) {
      resolve({ kind: 'result', result: failedResult(job.file, `${job.file}: stored bytes could not be read: ${(e as Error)?.message ?? e}`) });
      return;
    }
    if (signal?.aborted || this.disposed) {
      resolve({ kind: 'cancelled' });
      return;
    }
    const worker = this.workerFor(slot);
    const limitMs = this.options.timeLimitMs;
    type Race = { kind: 'ok'; result: FitResult } | { kind: 'error'; message: string } | { kind: 'timeout' } | { kind: 'abort' };
    let timer: ReturnType<typeof setTimeout> | undefined;
    let onAbort: (() => void) | undefined;
    const race = await new Promise<Race>((settle) => {
      timer = setTimeout(() => settle({ kind: 'timeout' }), limitMs);
      if (signal) {
        onAbort = () => settle({ kind: 'abort' });
        signal.addEventListener('abort', onAbort, { once: true });
      }
      worker.fitFile(bytes, job.file).then(
        (result) => settle({ kind: 'ok', result }),
        (e) => settle({ kind: 'error', message: (e as Error)?.message ?? String(e) }),
      );
    });
    clearTimeout(timer);
    if (onAbort) signal?.removeEventListener('abort', onAbort);

    switch (race.kind) {
      case 'ok':
        resolve({ kind: 'result', result: race.result });
        return;
      case 'timeout':
        this.retire(slot, worker);
        resolve({
          kind: 'result',
          result: failedResult(job.file, `${job.file}: fit stopped after the time limit of ${(limitMs / 1000).toFixed(1)} s`, 'timeout'),
        });
        return;
      case 'error':
        this.retire(slot, worker);
        resolve({ kind: 'result', result: failedResult(job.file, `${job.file}: worker failed: ${race.message}`) });
        return;
      case 'abort':
        this.retire(slot, worker);
        resolve({ kind: 'cancelled' });
        return;
    }
  }
}
