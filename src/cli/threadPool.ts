import type { Worker } from 'node:worker_threads';
import { TaskPool, type PoolEndpoint } from '../core/pool/taskPool';

/**
 * A pool of Node worker_threads with a time limit per job. A job that runs past
 * its limit, or a worker that crashes, fails only that job: the worker is
 * terminated and replaced, and the rest of the batch carries on. The
 * scheduling is the shared core in src/core/pool/taskPool.ts; this file adapts
 * worker_threads to it. Workers are started up front (starting one under tsx
 * takes a while), and a replacement is started as soon as one is retired.
 */
export interface PoolOptions {
  size: number;
  /** Per-job time limit, ms. */
  timeLimitMs: number;
  /** Creates one worker; injected so tests can use any entry point. */
  spawn: () => Worker;
}

export class JobFailure extends Error {
  constructor(readonly kind: 'timeout' | 'crash', message: string) {
    super(message);
    this.name = 'JobFailure';
  }
}

/**
 * A TaskPool endpoint over one worker thread: one message in, one message out.
 * An 'error' or 'exit' fails the job in hand; a worker that died between jobs
 * says so through alive(), and the pool gives the next job a fresh one.
 */
function threadEndpoint<I, O>(worker: Worker): PoolEndpoint<I, O> {
  let pending: { resolve: (o: O) => void; reject: (e: Error) => void } | null = null;
  let dead: string | null = null;
  const fail = (reason: string) => {
    dead ??= reason;
    const p = pending;
    pending = null;
    p?.reject(new Error(dead));
  };
  worker.on('message', (o: O) => {
    const p = pending;
    pending = null;
    p?.resolve(o);
  });
  worker.on('error', (e: Error) => fail(`worker crashed: ${e.message}`));
  worker.on('exit', (code: number) => fail(`worker exited with code ${code}`));
  return {
    run(input) {
      if (dead) return Promise.reject(new Error(dead));
      return new Promise<O>((resolve, reject) => {
        pending = { resolve, reject };
        worker.postMessage(input);
      });
    },
    terminate: () => worker.terminate(),
    alive: () => dead === null,
  };
}

export class ThreadPool<I, O> {
  private readonly core: TaskPool<I, O>;
  private closed = false;

  constructor(private readonly options: PoolOptions) {
    this.core = new TaskPool<I, O>({
      size: options.size,
      timeLimitMs: options.timeLimitMs,
      prestart: true,
      createEndpoint: () => threadEndpoint<I, O>(options.spawn()),
      startTimer: (ms, onExpire) => {
        const timer = setTimeout(onExpire, ms);
        return () => clearTimeout(timer);
      },
    });
  }

  /** Run one job; rejects with a JobFailure on a time-out or crash, with an Error once the pool is closed. */
  run(input: I): Promise<O> {
    if (this.closed) return Promise.reject(new Error('pool is closed'));
    return this.core.submit(() => input).outcome.then((o) => {
      switch (o.kind) {
        case 'done':
          return o.output;
        case 'timeout':
          throw new JobFailure('timeout', `no result within ${o.limitMs / 1000} s`);
        case 'crash':
        case 'input-failed':
          throw new JobFailure('crash', o.message);
        case 'cancelled':
          throw new Error('pool is closed');
      }
    });
  }

  /** Terminate every worker; jobs not finished reject. Resolves when every thread has stopped. */
  async close(): Promise<void> {
    this.closed = true;
    await this.core.dispose();
  }
}
